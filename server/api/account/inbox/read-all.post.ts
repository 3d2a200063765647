import { markInboxAllRead } from '~~/server/services/inbox'

/** Marks every unread entry of the caller's inbox read. */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  return markInboxAllRead(user.id)
})
