import { createHash } from 'node:crypto'
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { H3Event } from 'h3'
import { Lucia, TimeSpan, generateIdFromEntropySize, type Cookie } from 'lucia'
import { useDb } from '../db/client'
import { sessions, users } from '../db/schema'

let instance: Lucia<Record<never, never>, DatabaseUserAttributes> | undefined

interface DatabaseUserAttributes {
  email: string
  displayName: string
  isSiteAdmin: boolean
  disabledAt: Date | null
}

/** Lucia v3 over the sessions table; 14-day sessions, extended while in use (sliding expiry). */
export function useLucia() {
  instance ??= new Lucia(new DrizzlePostgreSQLAdapter(useDb(), sessions, users), {
    sessionExpiresIn: new TimeSpan(14, 'd'),
    sessionCookie: {
      name: 'pastload_session',
      attributes: { sameSite: 'lax', secure: false },
    },
    getUserAttributes: a => ({ email: a.email, displayName: a.displayName, isSiteAdmin: a.isSiteAdmin, disabledAt: a.disabledAt }),
  })
  return instance
}

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof useLucia>
    DatabaseUserAttributes: DatabaseUserAttributes
  }
}

/**
 * Sessions are stored under the SHA-256 of the cookie's token, never the token
 * itself: a leaked sessions row or a logged session id cannot be replayed as a
 * cookie. The token has 200 bits of entropy, so a fast hash is enough.
 */
export function sessionIdFromToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

/** A session token as Lucia makes its ids: 25 random bytes in lower-case base32 (40 characters). */
const TOKEN_PATTERN = /^[a-z2-7]{40}$/

/** The session token from the request's cookie, or null when absent or not shaped like one (never looked up). */
export function sessionTokenFromCookie(event: H3Event): { token: string | null, present: boolean } {
  const raw = getCookie(event, useLucia().sessionCookieName)
  if (!raw) return { token: null, present: false }
  return { token: TOKEN_PATTERN.test(raw) ? raw : null, present: true }
}

/** Starts a session for the user: the cookie carries a fresh token, the database only its hash. */
export async function startSession(event: H3Event, userId: string): Promise<void> {
  const lucia = useLucia()
  const token = generateIdFromEntropySize(25)
  await lucia.createSession(userId, {}, { sessionId: sessionIdFromToken(token) })
  writeSessionCookie(event, lucia.createSessionCookie(token))
}

/** Signs this browser in as the user, ending the session the request came with (if any). */
export async function replaceSession(event: H3Event, userId: string): Promise<void> {
  if (event.context.sessionId) await useLucia().invalidateSession(event.context.sessionId)
  await startSession(event, userId)
}

/** True when the request came over HTTPS (directly or through a trusted proxy). */
export function isHttps(event: H3Event): boolean {
  return getRequestProtocol(event, { xForwardedProto: trustProxy() }) === 'https'
}

export function trustProxy(): boolean {
  return process.env.PASTLOAD_TRUST_PROXY === '1'
}

/** Writes a Lucia cookie with HttpOnly, SameSite=Lax, and Secure when served over HTTPS. */
export function writeSessionCookie(event: H3Event, cookie: Cookie) {
  setCookie(event, cookie.name, cookie.value, {
    maxAge: cookie.attributes.maxAge,
    expires: cookie.attributes.expires,
    httpOnly: true,
    sameSite: 'lax',
    secure: isHttps(event),
    path: '/',
  })
}

export function clientIp(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: trustProxy() }) ?? 'unknown'
}
