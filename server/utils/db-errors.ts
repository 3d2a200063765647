/** PostgreSQL's unique_violation (23505), as raised through pg and Drizzle. */
export function isUniqueViolation(err: unknown): boolean {
  return pgCode(err) === '23505'
}

export function pgCode(err: unknown): string | undefined {
  let e: unknown = err
  for (let i = 0; i < 3 && e && typeof e === 'object'; i++) {
    const code = (e as { code?: unknown }).code
    if (typeof code === 'string') return code
    e = (e as { cause?: unknown }).cause
  }
  return undefined
}

/** Socket-level failures reaching PostgreSQL (from Node's net module through pg). */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN', 'ENOTFOUND'])
/** SQLSTATEs meaning the server cannot serve us now: admin/crash shutdown, starting up, too many connections. */
const UNAVAILABLE_SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300'])
/** pg's own messages for a lost or unobtainable connection (they carry no code). */
const UNAVAILABLE_MESSAGE = /connection terminated|timeout exceeded when trying to connect|encountered a connection error and is not queryable|client was closed and is not queryable|terminating connection due to|the database system is (starting up|shutting down|in recovery mode)/i

/**
 * True when the error (or one of its causes) says PostgreSQL could not be
 * reached or dropped the connection: the request can be retried later (503),
 * it is not a fault of the request or of the code.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  let e: unknown = err
  for (let i = 0; i < 6 && e && typeof e === 'object'; i++) {
    const { code, message } = e as { code?: unknown, message?: unknown }
    if (typeof code === 'string' && (NETWORK_CODES.has(code) || UNAVAILABLE_SQLSTATES.has(code) || code.startsWith('08'))) return true
    // A failed query's message and h3's copy of it hold the query's values: only the driver's own text counts.
    const wrapper = 'params' in e || 'statusCode' in e
    if (!wrapper && typeof message === 'string' && UNAVAILABLE_MESSAGE.test(message)) return true
    e = (e as { cause?: unknown }).cause
  }
  return false
}

/** Seconds a client is told to wait before retrying while the database is unreachable. */
export const DATABASE_RETRY_AFTER_SECONDS = 5

export const DATABASE_UNAVAILABLE_MESSAGE = 'The database is not reachable right now, so this request could not be completed. Try again in a few seconds.'
