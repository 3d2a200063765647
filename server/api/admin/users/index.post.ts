import { SiteInviteSchema } from '#shared/schemas/people'
import type { ServerPendingInvitation } from '#shared/types/people'
import { inviteToSite } from '~~/server/services/invitations'

/** Site admins add a person by sending a site invitation: they choose their own name and password. */
export default defineEventHandler(async (event): Promise<{ invitation: ServerPendingInvitation }> => {
  const admin = requireSiteAdmin(event)
  const { email } = await validateBody(event, SiteInviteSchema)
  const invitation = await inviteToSite({ actor: admin, email })
  setResponseStatus(event, 201)
  return { invitation }
})
