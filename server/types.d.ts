import type { SessionUser } from '#shared/schemas/auth'
import type { ApiTokenScope } from '#shared/types/api-tokens'

declare module 'h3' {
  interface H3EventContext {
    user: SessionUser | null
    authVia: 'session' | 'token' | null
    /** The stored session id: the SHA-256 of the cookie token, never the token. */
    sessionId?: string
    tokenRejected?: boolean
    /** Why a bearer token was refused (unknown, revoked or expired): requireUser's 401 message. */
    tokenRejectedMessage?: string
    /** The scope of the API token that authenticated the request. */
    tokenScope?: ApiTokenScope
  }
}

export {}
