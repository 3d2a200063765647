import { LinkTokenParamsSchema } from '#shared/schemas/people'
import type { ServerPasswordResetPreview } from '#shared/types/people'
import { previewPasswordReset } from '~~/server/services/password-resets'

/** Public: whether a password-reset link still works (404 unknown, 410 used or expired). */
export default defineEventHandler(async (event): Promise<ServerPasswordResetPreview> => {
  await throttleDoor(event, 'link')
  const { token } = validateParams(event, LinkTokenParamsSchema)
  return previewPasswordReset(token)
})
