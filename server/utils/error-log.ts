/**
 * The one way the server writes an error to its log. A failed query's values
 * (session ids, password hashes, e-mails, anything a user typed) never reach a
 * log line: only the query text, PostgreSQL's error code and the names of the
 * constraint, table and column, and the stack frames.
 */

const MAX_CHAIN = 6
const MAX_QUERY_CHARS = 400
const MAX_FRAMES = 8

interface ErrorLike {
  name?: unknown
  message?: unknown
  code?: unknown
  cause?: unknown
  stack?: unknown
}

function asObject(err: unknown): ErrorLike | null {
  return err && typeof err === 'object' ? err : null
}

/**
 * The query text of Drizzle's failed-query error, which carries the query and its
 * parameters (never logged). h3 keeps only the message of the errors it wraps,
 * "Failed query: <text>\nparams: <values>": the text is taken from it then.
 */
function failedQueryText(e: ErrorLike): string | null {
  const q = (e as { query?: unknown }).query
  if (typeof q === 'string' && 'params' in e) return q
  const m = typeof e.message === 'string' ? /^Failed query: ([\s\S]*?)\nparams: /.exec(e.message) : null
  return m?.[1] ?? null
}

/** A PostgreSQL error from the server (pg's DatabaseError): five-character SQLSTATE plus severity. */
function isPostgresError(e: ErrorLike): boolean {
  return typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code) && typeof (e as { severity?: unknown }).severity === 'string'
}

/**
 * Removes what could be a value from free text: everything after a "params:" or
 * "detail:" marker, quoted literals, argon2 hashes, e-mail addresses and long
 * token-like runs (hex, base32, base64url).
 */
export function scrubText(text: string): string {
  return text
    .replace(/\b(params|parameters|detail)\s*:[\s\S]*$/i, '$1: [redacted]')
    .replace(/\$argon2[a-z]*\$[^\s"']*/gi, '[redacted]')
    .replace(/"[^"\n]*"/g, '"…"')
    .replace(/'[^'\n]*'/g, '\'…\'')
    .replace(/[\w.+-]+@[\w-]+(\.[\w-]+)+/g, '[e-mail]')
    .replace(/[A-Za-z0-9_-]{24,}/g, '[redacted]')
}

/** The query text with its literal strings blanked (parameters are placeholders and are not in it). */
function scrubQuery(query: string): string {
  const short = query.length > MAX_QUERY_CHARS ? `${query.slice(0, MAX_QUERY_CHARS)}…` : query
  return short.replace(/'[^']*'/g, '\'…\'').replace(/\s+/g, ' ')
}

function describeOne(e: ErrorLike): string | null {
  const query = failedQueryText(e)
  if (query !== null) return `query failed: ${scrubQuery(query)}`
  if (isPostgresError(e)) {
    const names = (['constraint', 'table', 'column'] as const)
      .map((k) => {
        const v = (e as Record<string, unknown>)[k]
        return typeof v === 'string' ? `${k} ${v}` : null
      })
      .filter(Boolean)
    const message = typeof e.message === 'string' ? scrubText(e.message) : ''
    return `PostgreSQL ${e.code as string}${names.length ? ` (${names.join(', ')})` : ''}: ${message}`
  }
  const name = typeof e.name === 'string' ? e.name : 'Error'
  const message = typeof e.message === 'string' ? scrubText(e.message) : ''
  const code = typeof e.code === 'string' && /^[A-Z0-9_]{2,40}$/.test(e.code) ? ` [${e.code}]` : ''
  return `${name}${code}: ${message}`
}

/** Stack frames only (file paths and functions), never the message line at the top. */
function frames(err: unknown): string[] {
  for (let e = asObject(err), i = 0; e && i < MAX_CHAIN; e = asObject(e.cause), i++) {
    if (typeof e.stack !== 'string') continue
    // The stack opens with the message, which may span lines (a query's parameters): skip all of it.
    const messageLines = typeof e.message === 'string' ? e.message.split('\n').length : 1
    const lines = e.stack.split('\n').slice(messageLines).map(l => l.trim()).filter(l => /^at \S/.test(l))
    if (lines.length) return lines.slice(0, MAX_FRAMES)
  }
  return []
}

/** A redacted, one-line description of an error and its causes. */
export function describeError(err: unknown): string {
  const parts: string[] = []
  let e = asObject(err)
  for (let i = 0; e && i < MAX_CHAIN; e = asObject(e.cause), i++) {
    // A wrapper repeating its cause's message (h3's) is described by the cause.
    if (typeof e.message === 'string' && e.message === asObject(e.cause)?.message) continue
    const part = describeOne(e)
    if (part) parts.push(part)
  }
  if (!parts.length) return typeof err === 'string' ? scrubText(err) : 'unknown error'
  return parts.join(' ← ')
}

/** The redacted text written to the log for an error: one line, then its stack frames indented. */
export function redactedErrorReport(context: string, err: unknown, withStack = true): string {
  const head = `${context}: ${describeError(err)}`
  const stack = withStack ? frames(err) : []
  return stack.length ? `${head}\n    ${stack.join('\n    ')}` : head
}

/** Writes a redacted error to the server log. */
export function logServerError(context: string, err: unknown, options: { stack?: boolean, level?: 'error' | 'warn' } = {}): void {
  const text = redactedErrorReport(`[pastload] ${context}`, err, options.stack ?? true)
  if (options.level === 'warn') console.warn(text)
  else console.error(text)
}
