import { SiteInvitationParamsSchema } from '#shared/schemas/people'
import { revokeInvitation } from '~~/server/services/invitations'

/** Site admins withdraw a pending site invitation. */
export default defineEventHandler(async (event) => {
  const admin = requireSiteAdmin(event)
  const { invitationId } = validateParams(event, SiteInvitationParamsSchema)
  await revokeInvitation({ actorId: admin.id, projectId: null, invitationId })
  return { ok: true }
})
