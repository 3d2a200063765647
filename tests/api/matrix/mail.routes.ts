import type { RouteCase, SiteRouteCase } from './types'

/** Notifications and mail have no project routes. */
export const ROUTES: RouteCase[] = []

/** The inbox and e-mail preferences of the signed-in person; the outgoing mail of the site (site admins). */
export const SITE_ROUTES: SiteRouteCase[] = [
  { method: 'GET', path: '/api/account/inbox', who: 'account', ok: 200 },
  { method: 'GET', path: '/api/account/inbox/count', who: 'account', ok: 200 },
  { method: 'POST', path: '/api/account/inbox/read-all', who: 'account', ok: 200 },
  // An entry that is not the caller's (here: nobody's) is 404 to everyone: the route lets them through to the service.
  { method: 'POST', path: '/api/account/inbox/:notificationId/read', who: 'account', ok: 404, prepare: async () => ({ path: '/api/account/inbox/00000000-0000-4000-8000-000000000000/read' }) },
  { method: 'GET', path: '/api/account/notifications', who: 'account', ok: 200 },
  { method: 'PUT', path: '/api/account/notifications', who: 'account', ok: 200, prepare: async () => ({ body: { preferences: { 'flag-reply': 'immediate' } } }) },
  { method: 'GET', path: '/api/admin/mail', who: 'site-admin', ok: 200 },
  { method: 'POST', path: '/api/admin/mail/:messageId/retry', who: 'site-admin', ok: 404, prepare: async () => ({ path: '/api/admin/mail/2147483000/retry' }) },
]
