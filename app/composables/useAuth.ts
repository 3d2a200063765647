import type { SessionUser } from '#shared/schemas/auth'

/** The signed-in user, shared across the app; loaded once per page load. */
export function useAuth() {
  const user = useState<SessionUser | null>('auth-user', () => null)
  const loaded = useState<boolean>('auth-loaded', () => false)

  async function refresh() {
    try {
      const res = await useRequestFetch()('/api/auth/me')
      user.value = res.user
    }
    catch {
      user.value = null
    }
    finally {
      loaded.value = true
    }
  }

  /** A session has begun (sign-in, an accepted invitation, a new password): the app knows its user from now on. */
  function sessionStarted(signedIn: SessionUser) {
    // Pages then come from the server with their dates in this browser's zone.
    rememberViewerZone()
    user.value = signedIn
    loaded.value = true
  }

  async function signOut() {
    try {
      await $fetch('/api/auth/logout', { method: 'POST' })
    }
    finally {
      user.value = null
      // A whole new page: nothing of the session stays in memory, and the sign-in page comes as sent (no scripts).
      await navigateTo('/login', { external: true })
    }
  }

  return { user, loaded, refresh, sessionStarted, signOut }
}
