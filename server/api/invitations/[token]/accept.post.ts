import { AcceptInvitationSchema, LinkTokenParamsSchema } from '#shared/schemas/people'
import type { AcceptInvitationReply } from '#shared/types/people'
import { acceptInvitation } from '~~/server/services/invitations'

/** Public: accepts an invitation with the invitee's name and password; the new account is signed in. */
export default defineEventHandler(async (event): Promise<AcceptInvitationReply> => {
  await throttleDoor(event, 'link')
  const { token } = validateParams(event, LinkTokenParamsSchema)
  const body = await validateBody(event, AcceptInvitationSchema)
  const reply = await acceptInvitation(token, body)
  await replaceSession(event, reply.user.id)
  setResponseStatus(event, 201)
  return reply
})
