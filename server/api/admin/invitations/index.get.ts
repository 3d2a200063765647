import type { ServerInvitationList } from '#shared/types/people'
import { listPendingInvitations } from '~~/server/services/invitations'

/** Site admins: site invitations still waiting for an answer. */
export default defineEventHandler(async (event): Promise<ServerInvitationList> => {
  requireSiteAdmin(event)
  return listPendingInvitations(null)
})
