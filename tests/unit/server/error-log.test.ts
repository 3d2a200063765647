import { createHash } from 'node:crypto'
import { DrizzleQueryError } from 'drizzle-orm/errors'
import { createError } from 'h3'
import pg from 'pg'
import { describe, expect, it } from 'vitest'
import { isDatabaseUnavailable } from '../../../server/utils/db-errors'
import { describeError, redactedErrorReport, scrubText } from '../../../server/utils/error-log'

// Values shaped like the ones the server handles; invented for this test.
const TOKEN = 'k3mzq7x2vb4n5c6d7f2g3h4j5k6l7m2n3p4q5r6s'
const SESSION_HASH = createHash('sha256').update(TOKEN).digest('hex')
const ARGON = '$argon2id$v=19$m=19456,t=2,p=1$c2FsdHNhbHRzYWx0$aGFzaGhhc2hoYXNoaGFzaGhhc2hoYXNoaGFzaA'
const PASSWORD = 'tidal-flat-sounding-77'

function pgError(message: string, fields: Record<string, string>): pg.DatabaseError {
  const e = new pg.DatabaseError(message, 0, 'error')
  Object.assign(e, { severity: 'ERROR' }, fields)
  return e
}

describe('redacted error log', () => {
  it('logs a failed query by its text and PostgreSQL code, never its parameters', () => {
    const cause = pgError('invalid byte sequence for encoding "UTF8": 0x00', { code: '22021', table: 'users' })
    const err = new DrizzleQueryError(
      'insert into "users" ("email", "display_name", "password_hash") values ($1, $2, $3)',
      ['lee.moreau@harrow-estuary.example', 'Lee\u0000', ARGON],
      cause,
    )
    const line = redactedErrorReport('500 POST /api/users', err)
    expect(line).toContain('query failed: insert into "users" ("email", "display_name", "password_hash") values ($1, $2, $3)')
    expect(line).toContain('PostgreSQL 22021 (table users)')
    expect(line).not.toContain('argon2')
    expect(line).not.toContain('harrow-estuary')
    expect(line).not.toContain('params')
    expect(line).not.toContain('Lee')
  })

  it('keeps neither a session token nor its hash from a session lookup that failed', () => {
    const cause = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' })
    const err = new DrizzleQueryError('select "id", "user_id", "expires_at" from "sessions" where "sessions"."id" = $1', [SESSION_HASH], cause)
    const line = redactedErrorReport('503 GET /api/auth/me', err)
    expect(line).not.toContain(SESSION_HASH)
    expect(line).not.toContain(TOKEN)
    expect(line).toContain('Error [ECONNREFUSED]: connect ECONNREFUSED 127.0.0.1:5432')
  })

  it('takes the query text from the message when h3 has wrapped the failed query, dropping the values', () => {
    const cause = pgError('refused', { code: 'P0001' })
    const wrapped = createError(new DrizzleQueryError('select "id" from "sessions" where "sessions"."id" = $1', [SESSION_HASH], cause))
    const line = redactedErrorReport('503 GET /api/auth/me', wrapped, false)
    expect(line).toBe('503 GET /api/auth/me: query failed: select "id" from "sessions" where "sessions"."id" = $1 ← PostgreSQL P0001: refused')
  })

  it('keeps only stack frames, not a multi-line message that carries values', () => {
    const err = new DrizzleQueryError('update "users" set "password_hash" = $1', [`${PASSWORD}\n    at evil (x.js:1:1)`], undefined)
    const report = redactedErrorReport('500 POST /api/account/password', err)
    expect(report).not.toContain(PASSWORD)
    expect(report).not.toContain('evil')
    expect(report.split('\n').slice(1).every(l => /^ {4}at \S/.test(l))).toBe(true)
  })

  it('scrubs quoted literals, hashes, e-mails and token-like runs from free text', () => {
    expect(scrubText('invalid input syntax for type uuid: "not-a-uuid"')).toBe('invalid input syntax for type uuid: "…"')
    expect(scrubText(`hash ${ARGON} rejected`)).toBe('hash [redacted] rejected')
    expect(scrubText('no account for ana.ferreira@harrow-estuary.example')).toBe('no account for [e-mail]')
    expect(scrubText(`cookie ${TOKEN}`)).toBe('cookie [redacted]')
    expect(scrubText(`bad row\nDETAIL: Failing row contains (${SESSION_HASH}).`)).toBe('bad row\nDETAIL: [redacted]')
  })

  it('describes a non-error value without throwing', () => {
    expect(describeError(undefined)).toBe('unknown error')
    expect(describeError(`token ${TOKEN}`)).toBe('token [redacted]')
  })
})

describe('database unavailable', () => {
  const wrap = (cause: unknown) => new DrizzleQueryError('select 1', [], cause as Error)

  it('recognises refused, reset, timed-out and terminated connections through the query wrapper', () => {
    expect(isDatabaseUnavailable(wrap(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:1'), { code: 'ECONNREFUSED' })))).toBe(true)
    expect(isDatabaseUnavailable(wrap(Object.assign(new Error('read ECONNRESET'), { code: 'ECONNRESET' })))).toBe(true)
    expect(isDatabaseUnavailable(new Error('timeout exceeded when trying to connect'))).toBe(true)
    expect(isDatabaseUnavailable(wrap(new Error('Connection terminated unexpectedly')))).toBe(true)
    expect(isDatabaseUnavailable(pgError('terminating connection due to administrator command', { code: '57P01' }))).toBe(true)
    expect(isDatabaseUnavailable(pgError('the database system is starting up', { code: '57P03' }))).toBe(true)
    expect(isDatabaseUnavailable(pgError('connection failure', { code: '08006' }))).toBe(true)
  })

  it('does not take a query fault, or a value that reads like an outage, for one', () => {
    expect(isDatabaseUnavailable(wrap(pgError('duplicate key value violates unique constraint', { code: '23505' })))).toBe(false)
    expect(isDatabaseUnavailable(wrap(pgError('invalid byte sequence for encoding "UTF8": 0x00', { code: '22021' })))).toBe(false)
    // The failed query's message holds its parameters: a note saying "Connection terminated" is not an outage.
    const err = new DrizzleQueryError('insert into "notes" ("text") values ($1)', ['Connection terminated at 4 m'], pgError('value too long', { code: '22001' }))
    expect(isDatabaseUnavailable(err)).toBe(false)
    expect(isDatabaseUnavailable(new Error('Maximum call stack size exceeded'))).toBe(false)
  })
})
