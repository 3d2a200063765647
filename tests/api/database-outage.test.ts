import { createHash, randomUUID } from 'node:crypto'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { closeDb, usePool } from '../../server/db/client'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { tcpRelay, type Relay } from '../helpers/relay'
import { Client, TEST_PASSWORD, demoEmail, uniqueEmail } from '../helpers/http'
import { startServer, type RunningServer } from '../helpers/server'

// A second server reaches the test database through a relay the tests cut, and
// its log (stdout and stderr) is read back: no cookie, session id, password or
// hash may appear in it, whatever fails.

const DB_DOWN = 'The database is not reachable right now, so this request could not be completed. Try again in a few seconds.'

let server: RunningServer
let link: Relay

beforeAll(async () => {
  link = await tcpRelay(process.env.DATABASE_URL!)
  server = await startServer({ DATABASE_URL: link.url, PASTLOAD_SEED: 'none' })
})

afterAll(async () => {
  await server?.stop()
  await link?.cut()
})

async function signInAt(base: string, email: string, password: string): Promise<Client> {
  const c = new Client(base)
  const r = await c.post('/api/auth/login', { email, password })
  if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`)
  return c
}

/** A new account on the relayed server, signed in there; returns its client and cookie token. */
async function newAccount(admin: Client, tag: string) {
  const email = uniqueEmail(tag)
  const r = await admin.post<{ user: { id: string } }>('/api/users', { email, displayName: `Outage ${tag}`, password: TEST_PASSWORD })
  expect(r.status).toBe(201)
  const client = await signInAt(server.url, email, TEST_PASSWORD)
  const token = client.cookie.slice('pastload_session='.length)
  expect(token).toMatch(/^[a-z2-7]{40}$/)
  return { client, email, token }
}

function expectUnavailable(r: { status: number, headers: Headers, body: unknown }) {
  expect(r.status).toBe(503)
  expect(r.headers.get('retry-after')).toBe('5')
  expect(r.headers.get('content-type')).toMatch(/application\/json/)
  expect(r.body).toMatchObject({ statusCode: 503, statusMessage: 'Service Unavailable', message: DB_DOWN, data: { code: 'database-unavailable', retryAfter: 5 } })
}

describe('sessions at rest', () => {
  it('stores the SHA-256 of the cookie token as the session id, never the token, and a stored id is no cookie', async () => {
    const admin = await signInAt(server.url, demoEmail('owner'), DEMO_PASSWORD)
    const { token } = await newAccount(admin, 'atrest')
    const db = new pg.Client({ connectionString: process.env.DATABASE_URL })
    await db.connect()
    try {
      const hash = createHash('sha256').update(token).digest('hex')
      const byHash = await db.query('select count(*)::int as n from sessions where id = $1', [hash])
      const byToken = await db.query('select count(*)::int as n from sessions where id = $1', [token])
      expect(byHash.rows[0].n).toBe(1)
      expect(byToken.rows[0].n).toBe(0)
      // A leaked row cannot be replayed: its id as the cookie signs nobody in, and the cookie is cleared.
      const replay = new Client(server.url)
      replay.cookie = `pastload_session=${hash}`
      const r = await replay.get('/api/auth/me')
      expect(r.status).toBe(401)
      expect(r.headers.getSetCookie().find(c => c.startsWith('pastload_session='))).toMatch(/^pastload_session=;/)
    }
    finally {
      await db.end()
    }
  })
})

describe('while the database is unreachable', () => {
  it('answers reads and writes 503 with Retry-After, logs no cookie, session hash or password, and recovers without a restart', async () => {
    const admin = await signInAt(server.url, demoEmail('owner'), DEMO_PASSWORD)
    const { client: user, token } = await newAccount(admin, 'outage')
    const sessionHash = createHash('sha256').update(token).digest('hex')
    const newPassword = `harbour-silt-${randomUUID().slice(0, 8)}`
    const logBefore = server.output().length

    await link.cut()
    try {
      // Reads: the session lookup itself fails.
      expectUnavailable(await user.get('/api/auth/me'))
      expectUnavailable(await user.get('/api/projects'))
      // Writes, signed in and not.
      expectUnavailable(await admin.post('/api/users', { email: uniqueEmail('during'), displayName: 'Created during outage', password: newPassword }))
      expectUnavailable(await admin.post('/api/projects', { jobNumber: `OUT-${Date.now().toString(36)}`, name: 'Outage site' }))
      expectUnavailable(await new Client(server.url).post('/api/auth/login', { email: demoEmail('engineer'), password: newPassword }))
      // A page is refused the same way, as a page.
      const page = await fetch(`${server.url}/projects`, { headers: { cookie: user.cookie, accept: 'text/html' } })
      expect(page.status).toBe(503)
      expect(page.headers.get('retry-after')).toBe('5')
    }
    finally {
      await link.open()
    }

    // The same session works again once the database is back: no restart, no new sign-in.
    let me = await user.get<{ user: { email: string } }>('/api/auth/me')
    for (let i = 0; i < 40 && me.status !== 200; i++) {
      await new Promise(r => setTimeout(r, 250))
      me = await user.get<{ user: { email: string } }>('/api/auth/me')
    }
    expect(me.status).toBe(200)
    const after = await admin.post('/api/users', { email: uniqueEmail('after'), displayName: 'Created after outage', password: newPassword })
    expect(after.status).toBe(201)
    expect(server.child.exitCode).toBeNull()

    // The failures were logged, redacted.
    await expect.poll(() => server.output().slice(logBefore)).toContain('[pastload] 503 GET /api/auth/me')
    const log = server.output().slice(logBefore)
    expect(log).toContain('query failed: select')
    expect(log).not.toContain(demoEmail('engineer'))
    expect(log).not.toContain(token)
    expect(log).not.toContain(sessionHash)
    expect(log).not.toContain(newPassword)
    expect(log).not.toMatch(/\$argon2/)
    expect(log).not.toContain('params:')
    // Lost connections are handled, never an uncaught exception or unhandled rejection.
    expect(log).not.toMatch(/uncaught|unhandled/i)
  })
})

describe('a query that fails on account creation', () => {
  it('answers 500 "Server Error" and logs the statement, not the e-mail, the password or its hash', async () => {
    const admin = await signInAt(server.url, demoEmail('owner'), DEMO_PASSWORD)
    const probe = `Refused ${randomUUID()}`
    const name = `refuse_${randomUUID().replaceAll('-', '')}`
    const db = new pg.Client({ connectionString: process.env.DATABASE_URL })
    await db.connect()
    // Makes PostgreSQL itself refuse this one insert (and no other).
    await db.query(`create function ${name}() returns trigger language plpgsql as $$
      begin
        if new.display_name = '${probe}' then raise exception 'refused for the log test'; end if;
        return new;
      end $$`)
    await db.query(`create trigger ${name} before insert on users for each row execute function ${name}()`)
    const email = uniqueEmail('refused')
    const password = `estuary-clay-${randomUUID().slice(0, 8)}`
    const logBefore = server.output().length
    let r
    try {
      r = await admin.post('/api/users', { email, displayName: probe, password })
    }
    finally {
      await db.query(`drop trigger ${name} on users`)
      await db.query(`drop function ${name}()`)
      await db.end()
    }
    expect(r.status).toBe(500)
    expect(r.body).toMatchObject({ statusCode: 500, message: 'Server Error' })
    expect(JSON.stringify(r.body)).not.toContain('refused for the log test')

    await expect.poll(() => server.output().slice(logBefore)).toContain('[pastload] 500 POST /api/users: query failed: insert into "users"')
    const log = server.output().slice(logBefore)
    expect(log).toContain('PostgreSQL P0001')
    expect(log).not.toContain(password)
    expect(log).not.toMatch(/\$argon2/)
    expect(log).not.toContain(email)
    expect(log).not.toContain(probe)
    expect(log).not.toContain('params:')
  })
})

describe('the database client', () => {
  it('survives a connection dropped while checked out between queries, without an uncaught exception', async () => {
    const uncaught: unknown[] = []
    let settle!: () => void
    const settled = new Promise<void>((res) => { settle = res })
    const record = (err: unknown) => {
      uncaught.push(err)
      settle()
    }
    process.on('uncaughtException', record)
    const admin = new pg.Client({ connectionString: process.env.DATABASE_URL })
    await admin.connect()
    try {
      const client = await usePool().connect()
      await client.query('begin')
      const { rows } = await client.query<{ pid: number }>('select pg_backend_pid() as pid')
      client.once('end', () => settle())
      // The server ends the connection ("terminating connection due to administrator command").
      await admin.query('select pg_terminate_backend($1)', [rows[0]!.pid])
      await settled
      expect(uncaught).toEqual([])
      await expect(client.query('select 1')).rejects.toThrow(/not queryable|terminat/i)
      client.release(true)
      // The pool hands out a working connection afterwards.
      const again = await usePool().query<{ one: number }>('select 1 as one')
      expect(again.rows[0]!.one).toBe(1)
    }
    finally {
      process.off('uncaughtException', record)
      await admin.end()
      await closeDb()
    }
  })
})
