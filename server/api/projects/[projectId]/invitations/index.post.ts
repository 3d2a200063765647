import { InviteSchema } from '#shared/schemas/people'
import type { ServerInviteReply } from '#shared/types/people'
import { inviteToProject } from '~~/server/services/invitations'

/** An owner invites by e-mail with a role: an existing account joins at once, anyone else gets a one-time link. */
export default defineEventHandler(async (event): Promise<ServerInviteReply> => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { email, role } = await validateBody(event, InviteSchema)
  const reply = await inviteToProject({ actor: user, project, email, role })
  setResponseStatus(event, 201)
  return reply
})
