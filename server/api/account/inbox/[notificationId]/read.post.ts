import { InboxEntryParamsSchema } from '#shared/schemas/notifications'
import { markInboxEntryRead } from '~~/server/services/inbox'

/** Marks one entry of the caller's inbox read (someone else's entry: 404). */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { notificationId } = validateParams(event, InboxEntryParamsSchema)
  return markInboxEntryRead(user.id, notificationId)
})
