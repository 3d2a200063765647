import { sql } from 'drizzle-orm'
import { useDb } from '../db/client'

export const WINDOW_MS = 15 * 60 * 1000
/** Attempts allowed for one e-mail from one IP address within the window. */
export const MAX_PER_PAIR = 10
/**
 * Attempts allowed from one IP address within the window, across e-mails: looser, so an office
 * behind one address is not stopped by a colleague's typos, yet a guesser rotating e-mails is.
 */
export const MAX_PER_IP = 50

const pairKey = (email: string, ip: string) => `pair:${ip}:${email}`
const ipKey = (ip: string) => `ip:${ip}`

/**
 * Takes one sign-in attempt for (e-mail, IP) before the password is checked. Both counters
 * are raised in one statement (row locks held by INSERT … ON CONFLICT), so parallel attempts
 * cannot all read "under the limit": exactly the allowed number go on to be evaluated.
 * A counter whose window has passed starts again at 1. Returns the seconds to wait (for
 * Retry-After) when a limit is passed, or 0 when the attempt may be evaluated.
 *
 * The throttle is per (e-mail, IP) pair, not per e-mail, so wrong guesses from one place
 * cannot lock the real owner out from everywhere else.
 */
export async function takeAttempt(email: string, ip: string): Promise<number> {
  return takeKeyedAttempt(ipKey(ip), MAX_PER_IP, pairKey(email, ip), MAX_PER_PAIR)
}

/**
 * The same counters for another public door than the sign-in (a password-reset request, a
 * one-time link): its own keys under `scope`, per IP and per (subject, IP) when a subject is
 * given, so it never spends the sign-in's allowance. Returns the seconds to wait, or 0.
 */
export async function takeScopedAttempt(scope: string, ip: string, limits: { perIp: number, perPair?: number }, subject = ''): Promise<number> {
  const pair = subject && limits.perPair ? { key: `${scope}:${pairKey(subject, ip)}`, max: limits.perPair } : null
  return takeKeyedAttempt(`${scope}:${ipKey(ip)}`, limits.perIp, pair?.key, pair?.max)
}

async function takeKeyedAttempt(ipCounter: string, maxIp: number, pairCounter?: string, maxPair = 0): Promise<number> {
  const windowSeconds = WINDOW_MS / 1000
  const values = pairCounter
    ? sql`(${ipCounter}, 1, now()), (${pairCounter}, 1, now())`
    : sql`(${ipCounter}, 1, now())`
  const { rows } = await useDb().execute<{ key: string, attempts: number, wait: number }>(sql`
    insert into login_throttle as t (key, attempts, window_start)
    values ${values}
    on conflict (key) do update set
      attempts = case when t.window_start <= now() - make_interval(secs => ${windowSeconds}) then 1 else t.attempts + 1 end,
      window_start = case when t.window_start <= now() - make_interval(secs => ${windowSeconds}) then now() else t.window_start end
    returning t.key, t.attempts,
      ceil(extract(epoch from (t.window_start + make_interval(secs => ${windowSeconds}) - now())))::int as wait`)
  let wait = 0
  for (const row of rows) {
    const limit = row.key === ipCounter ? maxIp : maxPair
    if (row.attempts > limit) wait = Math.max(wait, row.wait, 1)
  }
  return wait
}

/**
 * A successful sign-in clears its pair's counter and gives its attempt back to the IP's
 * (others may share the address). Windows that have passed are swept at the same time.
 */
export async function recordSuccess(email: string, ip: string): Promise<void> {
  const windowSeconds = WINDOW_MS / 1000
  const db = useDb()
  await db.execute(sql`
    delete from login_throttle
    where key = ${pairKey(email, ip)} or window_start <= now() - make_interval(secs => ${windowSeconds})`)
  await db.execute(sql`
    update login_throttle set attempts = greatest(attempts - 1, 0) where key = ${ipKey(ip)}`)
}
