// API token rules that need no server: which requests a read-only token may make, and the
// expiry a new token gets from the form's choices.
import { describe, expect, it } from 'vitest'
import { CreateTokenSchema, TOKEN_DEFAULT_DAYS, tokenExpiry } from '../../../shared/schemas/auth'
import { readOnlyTokenMayCall } from '../../../server/services/token-scope'

const DAY_MS = 24 * 60 * 60 * 1000

describe('readOnlyTokenMayCall', () => {
  it.each([
    // Reads go through anywhere.
    ['GET', '/api/projects', true],
    ['head', '/api/projects/1', true],
    // A write goes through only on a plain compute path.
    ['POST', '/api/calc/settlement', true],
    ['POST', '/api/calc/stress-profile?x=1', true],
    ['POST', '/api/projects/1/points', false],
    ['PATCH', '/api/calc/settlement', true],
    ['DELETE', '/api/account/tokens/1', false],
    // Paths that only look like compute routes are refused.
    ['POST', '/api/calc/../projects/1/points', false],
    ['POST', '/api/calc/%2e%2e/projects/1/points', false],
    ['POST', '/api/calc//settlement', false],
    ['POST', '/api/calculator', false],
  ] as const)('%s %s → %s', (method, path, allowed) => {
    expect(readOnlyTokenMayCall(method, path)).toBe(allowed)
  })
})

describe('token expiry', () => {
  const now = Date.UTC(2026, 5, 1, 12)

  it('is 90 days by default, or the days or moment chosen', () => {
    expect(tokenExpiry({}, now).getTime()).toBe(now + TOKEN_DEFAULT_DAYS * DAY_MS)
    expect(tokenExpiry({ expiresInDays: 7 }, now).getTime()).toBe(now + 7 * DAY_MS)
    expect(tokenExpiry({ expiresAt: '2026-07-01T00:00:00+02:00' }, now).toISOString()).toBe('2026-06-30T22:00:00.000Z')
  })

  it('is bounded to a year by the schema', () => {
    const in365 = new Date(Date.now() + 365 * DAY_MS - 60_000).toISOString()
    const in366 = new Date(Date.now() + 366 * DAY_MS).toISOString()
    expect(CreateTokenSchema.safeParse({ name: 'a', expiresInDays: 365 }).success).toBe(true)
    expect(CreateTokenSchema.safeParse({ name: 'a', expiresInDays: 366 }).success).toBe(false)
    expect(CreateTokenSchema.safeParse({ name: 'a', expiresAt: in365 }).success).toBe(true)
    expect(CreateTokenSchema.safeParse({ name: 'a', expiresAt: in366 }).success).toBe(false)
    expect(CreateTokenSchema.parse({ name: 'a' }).readOnly).toBe(false)
  })
})
