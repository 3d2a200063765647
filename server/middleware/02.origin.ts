import { verifyRequestOrigin } from 'lucia'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * CSRF: a state-changing request must come from our own origin. A request that
 * carries the session cookie must send a matching Origin (browsers always do on
 * POST/PATCH/DELETE); scripts using a bearer token send no cookie and may omit it.
 */
export default defineEventHandler((event) => {
  if (SAFE.has(event.method)) return
  const origin = getRequestHeader(event, 'origin')
  const host = getRequestHost(event, { xForwardedHost: trustProxy() })
  if (origin) {
    if (!verifyRequestOrigin(origin, [host])) {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Cross-origin request refused (Origin does not match this site).' })
    }
    return
  }
  const hasCookie = Boolean(getCookie(event, useLucia().sessionCookieName))
  if (hasCookie) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'A signed-in request that changes data must send an Origin header.' })
  }
})
