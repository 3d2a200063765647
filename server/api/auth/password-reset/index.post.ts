import { PasswordResetRequestSchema } from '#shared/schemas/people'
import { requestPasswordReset } from '~~/server/services/password-resets'

/** Public "Forgot password?": always 202 with the same message, whether an account uses the address or not. */
export default defineEventHandler(async (event) => {
  const { email } = await validateBody(event, PasswordResetRequestSchema)
  await throttleDoor(event, 'password-reset', email)
  const reply = await requestPasswordReset(email)
  setResponseStatus(event, 202)
  return reply
})
