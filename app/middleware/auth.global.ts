import { signInNext } from '#shared/auth/sign-in'

// Pages need a signed-in user; the server still checks every request itself.
export default defineNuxtRouteMiddleware(async (to) => {
  const { user, loaded, refresh } = useAuth()
  if (!loaded.value) await refresh()
  // The one-time links and the reset request work without an account.
  if (to.path === '/forgot-password' || to.path.startsWith('/reset-password/') || to.path.startsWith('/invitations/')) return
  if (to.path === '/login') {
    if (user.value) return navigateTo(signInNext(to.query.next))
    return
  }
  if (!user.value) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
})
