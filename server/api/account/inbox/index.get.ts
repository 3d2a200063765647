import { InboxQuerySchema } from '#shared/schemas/notifications'
import { listInbox } from '~~/server/services/inbox'

/** The caller's own inbox, newest first (paged; `unread=1` for unread entries only). */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const q = validateQuery(event, InboxQuerySchema)
  return listInbox(user.id, q)
})
