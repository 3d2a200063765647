import { LinkTokenParamsSchema } from '#shared/schemas/people'
import type { ServerInvitationPreview } from '#shared/types/people'
import { previewInvitation } from '~~/server/services/invitations'

/** Public: what an invitation link is for, or why it no longer works (404 unknown, 410 used, withdrawn or expired). */
export default defineEventHandler(async (event): Promise<ServerInvitationPreview> => {
  await throttleDoor(event, 'link')
  const { token } = validateParams(event, LinkTokenParamsSchema)
  return previewInvitation(token)
})
