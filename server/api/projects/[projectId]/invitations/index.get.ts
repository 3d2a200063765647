import type { ServerInvitationList } from '#shared/types/people'
import { listPendingInvitations } from '~~/server/services/invitations'

/** The project's invitations still waiting for an answer (owners: they show addresses). */
export default defineEventHandler(async (event): Promise<ServerInvitationList> => {
  const { project } = await requireProjectRole(event, 'members.manage')
  return listPendingInvitations(project.id)
})
