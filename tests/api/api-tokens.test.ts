// API tokens: expiry (default 90 days, at most a year), read-only scope, revocation by a
// password change, session-only management, and the token + audit row in one transaction.
import pg from 'pg'
import { afterAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createUser, demoEmail, signIn } from '../helpers/http'
import { PLAIN_TEXT_MESSAGE } from '../../shared/schemas/common'

const DAY_MS = 24 * 60 * 60 * 1000

interface Created { token: { id: string, token: string, prefix: string, scope: string, createdAt: string, expiresAt: string } }
interface Listed { tokens: { id: string, scope: string, expiresAt: string, revokedAt: string | null }[] }
interface Issues { message: string, data: { issues: { path: string, message: string }[] } }

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

async function newUser(tag: string) {
  const admin = await signIn(demoEmail('owner'))
  return createUser(admin, tag)
}

function bearer(secret: string): Client {
  const c = new Client()
  c.origin = null
  c.bearer = secret
  return c
}

async function countFor(userId: string): Promise<{ tokens: number, audits: number }> {
  const t = await pool.query<{ n: string }>('select count(*) as n from api_tokens where user_id = $1', [userId])
  const a = await pool.query<{ n: string }>(`select count(*) as n from audit_events where actor_id = $1 and entity = 'api-token' and action = 'create'`, [userId])
  return { tokens: Number(t.rows[0]!.n), audits: Number(a.rows[0]!.n) }
}

describe('API token expiry', () => {
  it('defaults to 90 days and lists the expiry and scope', async () => {
    const { client } = await newUser('tok-default')
    const before = Date.now()
    const r = await client.post<Created>('/api/account/tokens', { name: 'nightly export' })
    expect(r.status).toBe(201)
    const expires = Date.parse(r.body.token.expiresAt)
    expect(expires).toBeGreaterThanOrEqual(before + 90 * DAY_MS - 1000)
    expect(expires).toBeLessThanOrEqual(Date.now() + 90 * DAY_MS + 1000)
    expect(r.body.token.scope).toBe('read-write')
    const list = await client.get<Listed>('/api/account/tokens')
    const row = list.body.tokens.find(t => t.id === r.body.token.id)!
    expect(row.expiresAt).toBe(r.body.token.expiresAt)
    expect(row.scope).toBe('read-write')
  })

  it('takes a number of days or a date, up to one year', async () => {
    const { client } = await newUser('tok-days')
    const days = await client.post<Created>('/api/account/tokens', { name: 'a year', expiresInDays: 365 })
    expect(days.status).toBe(201)
    expect(Math.round((Date.parse(days.body.token.expiresAt) - Date.parse(days.body.token.createdAt)) / DAY_MS)).toBe(365)
    const at = new Date(Date.now() + 30 * DAY_MS)
    at.setUTCMilliseconds(0)
    const dated = await client.post<Created>('/api/account/tokens', { name: 'dated', expiresAt: at.toISOString() })
    expect(dated.status).toBe(201)
    expect(dated.body.token.expiresAt).toBe(at.toISOString())
  })

  it('refuses more than a year, a past date, a fraction of a day and both kinds at once with 400', async () => {
    const { client } = await newUser('tok-bad')
    const cases: [unknown, string][] = [
      [{ name: 'x', expiresInDays: 366 }, 'expiresInDays'],
      [{ name: 'x', expiresInDays: 0 }, 'expiresInDays'],
      [{ name: 'x', expiresInDays: 1.5 }, 'expiresInDays'],
      [{ name: 'x', expiresAt: new Date(Date.now() + 366 * DAY_MS).toISOString() }, 'expiresAt'],
      [{ name: 'x', expiresAt: '2020-01-01T00:00:00Z' }, 'expiresAt'],
      [{ name: 'x', expiresAt: 'next tuesday' }, 'expiresAt'],
      [{ name: 'x', expiresInDays: 10, expiresAt: new Date(Date.now() + 10 * DAY_MS).toISOString() }, 'expiresAt'],
      [{ name: 'x', readOnly: 'yes' }, 'readOnly'],
    ]
    for (const [body, path] of cases) {
      const r = await client.post<Issues>('/api/account/tokens', body)
      expect(r.status, JSON.stringify(body)).toBe(400)
      expect(r.body.data.issues.map(i => i.path)).toContain(path)
    }
    const over = await client.post<Issues>('/api/account/tokens', { name: 'x', expiresInDays: 366 })
    expect(over.body.data.issues[0]!.message).toBe('must be at most 365 days (one year)')
    expect((await countFor((await client.get<{ user: { id: string } }>('/api/auth/me')).body.user.id)).tokens).toBe(0)
  })

  it('refuses an expired token with 401 at once, saying it expired', async () => {
    const { client } = await newUser('tok-expired')
    const r = await client.post<Created>('/api/account/tokens', { name: 'short lived', expiresInDays: 1 })
    const script = bearer(r.body.token.token)
    expect((await script.get('/api/auth/me')).status).toBe(200)
    await pool.query(`update api_tokens set expires_at = now() - interval '1 second' where id = $1`, [r.body.token.id])
    const after = await script.get<{ message: string }>('/api/auth/me')
    expect(after.status).toBe(401)
    expect(after.body.message).toMatch(/^The API token expired on \d{4}-\d{2}-\d{2}/)
    expect((await script.get('/api/projects')).status).toBe(401)
  })
})

describe('read-only API tokens', () => {
  it('read (GET 200) and compute, but any write is 403 with a plain message', async () => {
    const owner = await signIn(demoEmail('owner'))
    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `TOK-${Date.now().toString(36)}`, name: 'Read-only token site' })
    expect(p.status).toBe(201)
    const projectId = p.body.project.id
    const created = await owner.post<Created>('/api/account/tokens', { name: 'dashboard', readOnly: true })
    expect(created.status).toBe(201)
    expect(created.body.token.scope).toBe('read-only')
    const script = bearer(created.body.token.token)
    expect((await script.get(`/api/projects/${projectId}`)).status).toBe(200)
    // The compute routes write nothing: a read-only token may use them.
    const profile = await script.post<{ points: unknown[] }>('/api/calc/stress-profile', {
      layers: [{ name: 'Clay', thickness: 4, unitWeight: 17, unitWeightSaturated: 17 }],
      groundwater: { waterTableDepth: 1 },
      depths: [2],
    })
    expect(profile.status).toBe(200)
    const write = await script.post<{ message: string }>(`/api/projects/${projectId}/points`, { name: 'RO-1', kind: 'borehole' })
    expect(write.status).toBe(403)
    expect(write.body.message).toMatch(/read-only/)
    expect((await script.patch(`/api/projects/${projectId}`, { name: 'renamed' })).status).toBe(403)
    const list = await owner.get<Listed>('/api/account/tokens')
    expect(list.body.tokens.find(t => t.id === created.body.token.id)!.scope).toBe('read-only')
    // The same request with a read-write token reaches the route (and its own checks).
    const rw = await owner.post<Created>('/api/account/tokens', { name: 'writer' })
    const writer = bearer(rw.body.token.token)
    expect((await writer.patch(`/api/projects/${projectId}`, {})).status).not.toBe(403)
  })
})

describe('tokens need a session to be managed', () => {
  it('answers 403 to a bearer token on the token routes and the password change', async () => {
    const { client, email } = await newUser('tok-session')
    const created = await client.post<Created>('/api/account/tokens', { name: 'script' })
    const script = bearer(created.body.token.token)
    const calls = [
      await script.get<{ message: string }>('/api/account/tokens'),
      await script.post<{ message: string }>('/api/account/tokens', { name: 'child' }),
      await script.delete<{ message: string }>(`/api/account/tokens/${created.body.token.id}`),
      await script.post<{ message: string }>('/api/account/password', { currentPassword: TEST_PASSWORD, newPassword: 'token-chosen-passphrase' }),
    ]
    for (const r of calls) {
      expect(r.status).toBe(403)
      expect(r.body.message).toMatch(/needs a signed-in browser session; an API token cannot do it\.$/)
    }
    // Nothing changed: the token still works and the password is the old one.
    expect((await script.get('/api/auth/me')).status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email, password: TEST_PASSWORD })).status).toBe(200)
  })
})

describe('a password change revokes every token', () => {
  it('turns all the user\'s tokens to 401 and lists them revoked', async () => {
    const { client, id } = await newUser('tok-pw')
    const a = await client.post<Created>('/api/account/tokens', { name: 'one' })
    const b = await client.post<Created>('/api/account/tokens', { name: 'two', readOnly: true })
    expect((await bearer(a.body.token.token).get('/api/auth/me')).status).toBe(200)
    const other = await newUser('tok-pw-other')
    const keep = await other.client.post<Created>('/api/account/tokens', { name: 'not mine' })

    const changed = await client.post<{ tokensRevoked: number }>('/api/account/password', { currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-passphrase' })
    expect(changed.status).toBe(200)
    expect(changed.body.tokensRevoked).toBe(2)
    for (const t of [a, b]) {
      const r = await bearer(t.body.token.token).get<{ message: string }>('/api/auth/me')
      expect(r.status).toBe(401)
      expect(r.body.message).toBe('The API token is invalid or revoked.')
    }
    const list = await client.get<Listed>('/api/account/tokens')
    expect(list.body.tokens.every(t => t.revokedAt !== null)).toBe(true)
    // Another user's token is untouched.
    expect((await bearer(keep.body.token.token).get('/api/auth/me')).status).toBe(200)
    const audit = await pool.query<{ after: { tokensRevoked: number } }>(`select after from audit_events where actor_id = $1 and action = 'password-change'`, [id])
    expect(audit.rows.map(r => r.after.tokensRevoked)).toEqual([2])
  })
})

describe('a token and its audit entry are one transaction', () => {
  it('writes both on success', async () => {
    const { client, id } = await newUser('tok-audit')
    const before = await countFor(id)
    expect((await client.post('/api/account/tokens', { name: 'audited' })).status).toBe(201)
    expect(await countFor(id)).toEqual({ tokens: before.tokens + 1, audits: before.audits + 1 })
  })

  it('leaves no token behind when the audit entry cannot be written', async () => {
    const { client, id } = await newUser('tok-rollback')
    const marker = `audit-fails-${Date.now().toString(36)}`
    const fn = `test_fail_audit_${Date.now().toString(36)}`
    // Fails only this test's audit row, so other files running meanwhile are unaffected.
    await pool.query(`create function ${fn}() returns trigger language plpgsql as $$
      begin
        if new.entity = 'api-token' and new.after->>'name' = '${marker}' then raise exception 'audit refused for the test'; end if;
        return new;
      end $$`)
    await pool.query(`create trigger ${fn} before insert on audit_events for each row execute function ${fn}()`)
    try {
      const before = await countFor(id)
      const r = await client.post('/api/account/tokens', { name: marker })
      expect(r.status).toBeGreaterThanOrEqual(500)
      expect(await countFor(id)).toEqual(before)
      const live = await pool.query<{ n: string }>('select count(*) as n from api_tokens where name = $1', [marker])
      expect(Number(live.rows[0]!.n)).toBe(0)
    }
    finally {
      await pool.query(`drop trigger if exists ${fn} on audit_events`)
      await pool.query(`drop function if exists ${fn}()`)
    }
  })

  it('refuses a token name that cannot be stored with 400 and writes nothing', async () => {
    const { client, id } = await newUser('tok-name')
    const before = await countFor(id)
    for (const name of ['half\ud800pair', 'nul\u0000byte']) {
      const r = await client.post<Issues>('/api/account/tokens', { name })
      expect(r.status).toBe(400)
      expect(r.body.data.issues[0]).toEqual({ path: 'name', message: PLAIN_TEXT_MESSAGE })
    }
    expect(await countFor(id)).toEqual(before)
  })
})
