import { sql } from 'drizzle-orm'
import { storageHealth } from '../services/storage'

async function databaseHealth(): Promise<'ok' | 'down'> {
  let timer: ReturnType<typeof setTimeout> | undefined
  try {
    await Promise.race([
      useDb().execute(sql`select 1`),
      new Promise((_, reject) => { timer = setTimeout(() => reject(new Error('timeout')), 3000) }),
    ])
    return 'ok'
  }
  catch {
    return 'down'
  }
  finally {
    clearTimeout(timer)
  }
}

/**
 * Liveness plus a round trip to the database and to the object store; 503 while
 * either is unreachable. Storage "unconfigured" (no bucket set) is not down:
 * attachments are off and everything else works.
 */
export default defineEventHandler(async (event) => {
  const [db, storage] = await Promise.all([databaseHealth(), storageHealth()])
  const down = db === 'down' || storage === 'down'
  if (down) setResponseStatus(event, 503)
  return { status: down ? 'degraded' : 'ok', db, storage }
})
