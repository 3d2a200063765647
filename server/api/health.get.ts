import { sql } from 'drizzle-orm'
import { useDb } from '../db/client'

/** Liveness plus a database round trip; 503 while the database is unreachable. */
export default defineEventHandler(async (event) => {
  try {
    await Promise.race([
      useDb().execute(sql`select 1`),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 3000)),
    ])
    return { status: 'ok', db: 'ok' }
  }
  catch {
    setResponseStatus(event, 503)
    return { status: 'degraded', db: 'down' }
  }
})
