import type { SessionUser } from '#shared/schemas/auth'

declare module 'h3' {
  interface H3EventContext {
    user: SessionUser | null
    authVia: 'session' | 'token' | null
    sessionId?: string
    tokenRejected?: boolean
  }
}

export {}
