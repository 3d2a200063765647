import { NotificationPreferencesSchema } from '#shared/schemas/notifications'
import { updateNotificationPreferences } from '~~/server/services/inbox'

/** Changes the caller's e-mail choice for the kinds named; the inbox lists every notice whatever the choice. */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const body = await validateBody(event, NotificationPreferencesSchema)
  return updateNotificationPreferences(user.id, body)
})
