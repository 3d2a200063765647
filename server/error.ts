import { getRequestURL, setResponseHeader } from 'h3'
import { defineNitroErrorHandler } from 'nitropack/runtime'
import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from './utils/db-errors'
import { logServerError } from './utils/error-log'

/**
 * First of the server's error handlers (nuxt.config.ts puts it before the page
 * renderer's and the JSON one). A deliberate `createError` (4xx, 503 from
 * storage…) passes through as thrown. An unexpected error is logged once,
 * redacted, and replaced by a plain one so no later handler logs or answers
 * its text: a lost database connection becomes 503 with Retry-After, anything
 * else 500 "Server Error".
 */
export default defineNitroErrorHandler((error, event) => {
  if (!error.unhandled && !error.fatal) return
  const unavailable = isDatabaseUnavailable(error)
  const status = unavailable ? 503 : 500
  // The path only: a query string may carry something private; a one-time link's token (a long run) is cut out.
  const path = getRequestURL(event).pathname.replace(/[A-Za-z0-9_-]{40,}/g, '[token]')
  logServerError(`${status} ${event.method} ${path}`, error, { stack: !unavailable })
  if (unavailable) setResponseHeader(event, 'Retry-After', DATABASE_RETRY_AFTER_SECONDS)
  error.statusCode = status
  error.statusMessage = unavailable ? 'Service Unavailable' : 'Server Error'
  error.message = unavailable ? DATABASE_UNAVAILABLE_MESSAGE : 'Server Error'
  error.data = unavailable ? { code: 'database-unavailable', retryAfter: DATABASE_RETRY_AFTER_SECONDS } : undefined
  error.unhandled = false
  error.fatal = false
  // Its stack stays (h3 may have made it read-only): no later handler logs or sends it now.
  error.cause = undefined
})
