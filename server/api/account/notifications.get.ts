import { notificationPreferencesOf } from '~~/server/services/inbox'

/** The caller's e-mail choice per kind of notice (immediate or off). */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  return notificationPreferencesOf(user.id)
})
