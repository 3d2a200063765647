import { inboxCount } from '~~/server/services/inbox'

/** The number of unread entries in the caller's inbox (the bell). */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  return inboxCount(user.id)
})
