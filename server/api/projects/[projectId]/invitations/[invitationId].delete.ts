import { InvitationParamsSchema } from '#shared/schemas/people'
import { revokeInvitation } from '~~/server/services/invitations'

/** Withdraws a pending invitation: its link stops working at once. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { invitationId } = validateParams(event, InvitationParamsSchema)
  await revokeInvitation({ actorId: user.id, projectId: project.id, invitationId })
  return { ok: true }
})
