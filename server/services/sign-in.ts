import { sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { SIGN_IN_FAILURES, signInNext, throttledMessage, type SignInFailure } from '#shared/auth/sign-in'
import { LoginSchema, type SessionUser } from '#shared/schemas/auth'
import { useDb } from '~~/server/db/client'
import { users } from '~~/server/db/schema'
import { startSession } from '~~/server/utils/auth'
import { dummyPasswordHash, verifyPassword } from '~~/server/utils/password'
import { recordAudit } from './audit'
import { recordSuccess, takeAttempt } from './login-throttle'

/** How a sign-in ended: the person signed in, or which failure (and, for the throttle, the wait in seconds). */
type SignInOutcome = { user: SessionUser } | { failed: 'throttled', wait: number } | { failed: 'wrong' | 'disabled', wait?: undefined }

/**
 * One sign-in with e-mail and password: the throttle per e-mail and address, the same work and answer for an unknown
 * e-mail and a wrong password, a disabled account told only to someone who knows its password, then the session
 * cookie and the audit entry. Each route says the outcome its own way.
 */
async function attemptSignIn(event: H3Event, email: string, password: string): Promise<SignInOutcome> {
  const ip = clientIp(event)
  const wait = await takeAttempt(email, ip)
  if (wait > 0) return { failed: 'throttled', wait }
  const [user] = await useDb().select().from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  const ok = await verifyPassword(user?.passwordHash ?? await dummyPasswordHash(), password)
  if (!user || !ok) return { failed: 'wrong' }
  await recordSuccess(email, ip)
  if (user.disabledAt) return { failed: 'disabled' }
  await startSession(event, user.id)
  await recordAudit({ actorId: user.id, action: 'login', entity: 'session', entityId: null, after: { ip } })
  return { user: { id: user.id, email: user.email, displayName: user.displayName, isSiteAdmin: user.isSiteAdmin } }
}

const FAILURE_STATUS: Record<Exclude<SignInOutcome, { user: SessionUser }>['failed'], { statusCode: number, statusMessage: string }> = {
  wrong: { statusCode: 401, statusMessage: 'Unauthorized' },
  disabled: { statusCode: 403, statusMessage: 'Forbidden' },
  throttled: { statusCode: 429, statusMessage: 'Too Many Requests' },
}

/** The JSON sign-in: the signed-in person, or 401, 403 or 429 (with Retry-After) saying what went wrong. */
export async function signInWithPassword(event: H3Event, email: string, password: string): Promise<SessionUser> {
  const outcome = await attemptSignIn(event, email, password)
  if ('user' in outcome) return outcome.user
  if (outcome.failed === 'throttled') {
    setResponseHeader(event, 'Retry-After', outcome.wait)
    throw createError({ ...FAILURE_STATUS.throttled, message: throttledMessage(outcome.wait) })
  }
  throw createError({ ...FAILURE_STATUS[outcome.failed], message: SIGN_IN_FAILURES[outcome.failed] })
}

/**
 * The sign-in page's form as the browser sends it (the page has no scripts): where to send the browser next — the
 * form's `next` (a path of this site) once signed in, else the sign-in page again with what went wrong
 * (`failed`, and for the throttle `wait` in minutes), keeping `next`. The password is never put in an address.
 */
export async function signInFromForm(event: H3Event, form: unknown): Promise<string> {
  const fields = typeof form === 'object' && form !== null ? form as Record<string, unknown> : {}
  const next = signInNext(fields.next)
  const back = (failed: SignInFailure, wait?: number) => {
    const q = new URLSearchParams({ failed })
    if (wait) q.set('wait', String(Math.max(1, Math.ceil(wait / 60))))
    if (next !== '/') q.set('next', next)
    return `/login?${q.toString()}`
  }
  const parsed = LoginSchema.safeParse({ email: fields.email, password: fields.password })
  if (!parsed.success) return back('incomplete')
  const outcome = await attemptSignIn(event, parsed.data.email, parsed.data.password)
  if ('failed' in outcome) return back(outcome.failed, outcome.wait)
  return next
}
