import type { SessionUser } from '#shared/schemas/auth'

declare module 'h3' {
  interface H3EventContext {
    user: SessionUser | null
    authVia: 'session' | 'token' | null
    /** The stored session id: the SHA-256 of the cookie token, never the token. */
    sessionId?: string
    tokenRejected?: boolean
  }
}

export {}
