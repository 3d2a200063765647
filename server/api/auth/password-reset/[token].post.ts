import { LinkTokenParamsSchema, PasswordResetSchema } from '#shared/schemas/people'
import type { PasswordResetDoneReply } from '#shared/types/people'
import { completePasswordReset } from '~~/server/services/password-resets'

/**
 * Public: sets a new password from a reset link. Every session of the account ends and its
 * API tokens are revoked; this browser is then signed in with a fresh session.
 */
export default defineEventHandler(async (event): Promise<PasswordResetDoneReply> => {
  await throttleDoor(event, 'link')
  const { token } = validateParams(event, LinkTokenParamsSchema)
  const { password } = await validateBody(event, PasswordResetSchema)
  const reply = await completePasswordReset(token, password)
  await replaceSession(event, reply.user.id)
  return reply
})
