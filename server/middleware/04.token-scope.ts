import { readOnlyTokenMayCall } from '../services/token-scope'

/** A read-only API token reads (GET/HEAD) and computes; anything that could write is 403. */
export default defineEventHandler((event) => {
  if (event.context.authVia !== 'token' || event.context.tokenScope !== 'read-only') return
  if (readOnlyTokenMayCall(event.method, event.path)) return
  throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This API token is read-only: it may read (GET) and use the compute routes, but not change anything. Create a read-write token for this.' })
})
