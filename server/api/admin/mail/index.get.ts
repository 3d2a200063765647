import { OutboxQuerySchema } from '#shared/schemas/notifications'
import { listOutbox } from '~~/server/services/mail-delivery'

/** Site admins see the outbox (pending, failed, sent; never a body). */
export default defineEventHandler(async (event) => {
  requireSiteAdmin(event)
  const q = validateQuery(event, OutboxQuerySchema)
  return listOutbox(q)
})
