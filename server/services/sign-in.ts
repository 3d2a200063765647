import { sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { isError } from 'h3'
import { SIGN_IN_FAILURES, signInNext, throttledMessage, type SignInFailure } from '#shared/auth/sign-in'
import { LoginSchema, type SessionUser } from '#shared/schemas/auth'
import { useDb } from '~~/server/db/client'
import { users } from '~~/server/db/schema'
import { startSession } from '~~/server/utils/auth'
import { dummyPasswordHash, verifyPassword } from '~~/server/utils/password'
import { recordAudit } from './audit'
import { recordSuccess, takeAttempt } from './login-throttle'

/**
 * Signs a person in with e-mail and password: the throttle per e-mail and address (429 with Retry-After), the same
 * work and answer for an unknown e-mail and a wrong password (401), a disabled account told only to someone who
 * knows its password (403), then the session cookie and the audit entry.
 */
export async function signInWithPassword(event: H3Event, email: string, password: string): Promise<SessionUser> {
  const ip = clientIp(event)
  const wait = await takeAttempt(email, ip)
  if (wait > 0) {
    setResponseHeader(event, 'Retry-After', wait)
    throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: throttledMessage(wait) })
  }
  const [user] = await useDb().select().from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  const ok = await verifyPassword(user?.passwordHash ?? await dummyPasswordHash(), password)
  if (!user || !ok) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: SIGN_IN_FAILURES.wrong })
  await recordSuccess(email, ip)
  if (user.disabledAt) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: SIGN_IN_FAILURES.disabled })
  await startSession(event, user.id)
  await recordAudit({ actorId: user.id, action: 'login', entity: 'session', entityId: null, after: { ip } })
  return { id: user.id, email: user.email, displayName: user.displayName, isSiteAdmin: user.isSiteAdmin }
}

const FAILURE_BY_STATUS: Record<number, SignInFailure> = { 401: 'wrong', 403: 'disabled', 429: 'throttled' }

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
  try {
    await signInWithPassword(event, parsed.data.email, parsed.data.password)
  }
  catch (err) {
    const failed = isError(err) ? FAILURE_BY_STATUS[err.statusCode] : undefined
    if (!failed) throw err
    return back(failed, failed === 'throttled' ? Number(getResponseHeader(event, 'Retry-After')) || 60 : undefined)
  }
  return next
}
