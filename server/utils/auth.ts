import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { H3Event } from 'h3'
import { Lucia, TimeSpan, type Cookie } from 'lucia'
import { useDb } from '../db/client'
import { sessions, users } from '../db/schema'

let instance: Lucia<Record<never, never>, DatabaseUserAttributes> | undefined

interface DatabaseUserAttributes {
  email: string
  displayName: string
  isSiteAdmin: boolean
}

/** Lucia v3 over the sessions table; 14-day sessions, extended while in use (sliding expiry). */
export function useLucia() {
  instance ??= new Lucia(new DrizzlePostgreSQLAdapter(useDb(), sessions, users), {
    sessionExpiresIn: new TimeSpan(14, 'd'),
    sessionCookie: {
      name: 'pastload_session',
      attributes: { sameSite: 'lax', secure: false },
    },
    getUserAttributes: a => ({ email: a.email, displayName: a.displayName, isSiteAdmin: a.isSiteAdmin }),
  })
  return instance
}

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof useLucia>
    DatabaseUserAttributes: DatabaseUserAttributes
  }
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
