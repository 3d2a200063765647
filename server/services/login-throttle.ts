import { and, count, eq, gt, lt, min, or } from 'drizzle-orm'
import { useDb } from '../db/client'
import { loginAttempts } from '../db/schema'

export const WINDOW_MS = 15 * 60 * 1000
export const MAX_FAILURES = 10

/**
 * More than MAX_FAILURES failed sign-ins for one e-mail or one IP within the
 * window → refuse. Returns the seconds until the oldest counted failure leaves
 * the window (for Retry-After), or 0 when the caller may try.
 */
export async function retryAfterSeconds(email: string, ip: string): Promise<number> {
  const since = new Date(Date.now() - WINDOW_MS)
  const db = useDb()
  let wait = 0
  for (const where of [eq(loginAttempts.email, email), eq(loginAttempts.ip, ip)]) {
    const [row] = await db.select({ n: count(), oldest: min(loginAttempts.attemptedAt) })
      .from(loginAttempts)
      .where(and(where, gt(loginAttempts.attemptedAt, since)))
    if (row && row.n >= MAX_FAILURES && row.oldest) {
      const seconds = Math.ceil((new Date(row.oldest).getTime() + WINDOW_MS - Date.now()) / 1000)
      wait = Math.max(wait, seconds, 1)
    }
  }
  return wait
}

export async function recordFailure(email: string, ip: string): Promise<void> {
  await useDb().insert(loginAttempts).values({ email, ip })
}

/** A successful sign-in clears that e-mail's failures (not the IP's: others may share it). */
export async function clearFailures(email: string): Promise<void> {
  const since = new Date(Date.now() - WINDOW_MS)
  const db = useDb()
  await db.delete(loginAttempts).where(or(eq(loginAttempts.email, email), lt(loginAttempts.attemptedAt, since)))
}
