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

  async function signIn(email: string, password: string) {
    const res = await $fetch('/api/auth/login', { method: 'POST', body: { email, password } })
    // Pages then come from the server with their dates in this browser's zone.
    rememberViewerZone()
    user.value = res.user
    loaded.value = true
  }

  async function signOut() {
    try {
      await $fetch('/api/auth/logout', { method: 'POST' })
    }
    finally {
      user.value = null
      await navigateTo('/login')
    }
  }

  return { user, loaded, refresh, signIn, signOut }
}
