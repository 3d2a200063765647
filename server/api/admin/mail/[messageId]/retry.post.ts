import { OutboxMessageParamsSchema } from '#shared/schemas/notifications'
import { retryFailedMail } from '~~/server/services/mail-delivery'

/** A site admin sends a failed message again (409 unless it failed). */
export default defineEventHandler(async (event) => {
  const user = requireSiteAdmin(event)
  const { messageId } = validateParams(event, OutboxMessageParamsSchema)
  return retryFailedMail(user.id, messageId)
})
