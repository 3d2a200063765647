// E-mail and the in-app inbox, end to end: events write inbox and outbox rows in their own transaction;
// the app's delivery worker sends the outbox through SMTP to a catcher embedded in this test process
// (read back with mailparser), retries while the catcher is down, never sends one message twice with two
// app processes polling, and leaves out the kinds a person turned off. The file runs its own servers on
// a database of its own in the test cluster, so no other server's worker delivers its outbox.
import { randomUUID } from 'node:crypto'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { Client, demoEmail, TEST_PASSWORD, uniqueEmail } from '../helpers/http'
import { TestMailCatcher } from '../helpers/mail-catcher'
import { type RunningServer, startServer } from '../helpers/server'

const PUBLIC_URL = 'https://pastload.test'

interface OutboxRow { id: number, kind: string, toAddress: string, subject: string, status: 'pending' | 'sent' | 'failed', attempts: number, lastError: string | null }
interface InboxRow { id: string, kind: string, title: string, body: string, link: string, readAt: string | null }

async function login(base: string, email: string, password: string): Promise<Client> {
  const c = new Client(base)
  const r = await c.post('/api/auth/login', { email, password })
  if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status}`)
  return c
}

async function must<T>(what: string, p: Promise<{ status: number, body: T }>, want = 200): Promise<T> {
  const r = await p
  if (r.status !== want) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body
}

/** Waits (polling) until `check` returns a value, or fails saying what it waited for. */
async function eventually<T>(what: string, check: () => Promise<T | undefined | null | false>, ms = 20_000): Promise<T> {
  const deadline = Date.now() + ms
  for (;;) {
    const v = await check()
    if (v) return v
    if (Date.now() > deadline) throw new Error(`Gave up waiting for ${what}`)
    await new Promise(r => setTimeout(r, 150))
  }
}

describe('notifications and e-mail', { timeout: 90_000 }, () => {
  const tag = randomUUID().slice(0, 8)
  const name = `pastload_mail_${tag}`
  const sourceUrl = process.env.DATABASE_URL ?? ''
  const port = Number(new URL(sourceUrl || 'postgres://x@127.0.0.1:1/x').port)
  // The test cluster's superuser, over its socket (trust on local connections), creates and drops the database.
  const superuser = { host: `/tmp/pastload-pg-${port}`, port, user: 'postgres', database: 'postgres' }
  const catcher = new TestMailCatcher()
  const servers: RunningServer[] = []
  let env: Record<string, string>
  let base = ''
  let admin: Client
  let engineer: { client: Client, email: string, id: string }
  let reviewer: { client: Client, email: string, id: string }
  let projectId = ''

  async function account(tagName: string) {
    const email = uniqueEmail(tagName)
    const created = await must(`creating ${tagName}`, admin.post<{ user: { id: string } }>('/api/users', { email, displayName: `Mail ${tagName}`, password: TEST_PASSWORD }), 201)
    return { client: await login(base, email, TEST_PASSWORD), email, id: created.user.id }
  }

  /** A fresh point whose log the engineer saves (one interval); its interval id. */
  async function loggedInterval(): Promise<string> {
    const point = await must('point', engineer.client.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: `BH-${randomUUID().slice(0, 6)}`, kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 12 }), 201)
    const log = await must('log', engineer.client.request<{ intervals: { id: string }[] }>('PUT', `/api/projects/${projectId}/points/${point.point.id}/intervals`, { intervals: [{ top: 0, bottom: 4.5, description: 'Soft grey CLAY' }] }))
    return log.intervals[0]!.id
  }

  async function raiseFlag(by: Client, intervalId: string, comment: string): Promise<string> {
    const r = await must('flag', by.post<{ flag: { id: string } }>(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'questionable', comment }), 201)
    return r.flag.id
  }

  const outbox = async (status?: string) =>
    (await must('outbox', admin.get<{ messages: OutboxRow[] }>(`/api/admin/mail?limit=100${status ? `&status=${status}` : ''}`))).messages

  beforeAll(async () => {
    if (!sourceUrl) throw new Error('DATABASE_URL is not set: run through `npm run test:db` or `npm test`.')
    const su = new pg.Client(superuser)
    await su.connect()
    await su.query(`create database ${name} owner pastload`)
    await su.end()
    const u = new URL(sourceUrl)
    u.pathname = `/${name}`
    await catcher.start()
    env = {
      DATABASE_URL: u.toString(),
      PASTLOAD_SMTP_PORT: String(catcher.port),
      PASTLOAD_PUBLIC_URL: PUBLIC_URL,
      PASTLOAD_MAIL_POLL_MS: '300',
      PASTLOAD_MAIL_RETRY_BASE_MS: '200',
      PASTLOAD_MAIL_RETRY_MAX_MS: '600',
      PASTLOAD_MAIL_MAX_ATTEMPTS: '1000',
    }
    servers.push(await startServer(env))
    base = servers[0]!.url
    admin = await login(base, demoEmail('owner'), DEMO_PASSWORD)
    engineer = await account('engineer')
    reviewer = await account('reviewer')
    const p = await must('project', admin.post<{ project: { id: string } }>('/api/projects', { jobNumber: `ML-${tag}`, name: 'Mail project' }), 201)
    projectId = p.project.id
    for (const [who, role] of [[engineer, 'engineer'], [reviewer, 'reviewer']] as const) {
      await must('member', admin.post(`/api/projects/${projectId}/members`, { email: who.email, role }), 201)
    }
  }, 180_000)

  afterAll(async () => {
    for (const s of servers) await s.stop()
    await catcher.stop()
    if (!sourceUrl) return
    const su = new pg.Client(superuser)
    await su.connect()
    await su.query(`drop database if exists ${name} with (force)`)
    await su.end()
  })

  it('a flag on an interval the engineer logged reaches the engineer: inbox entry and an e-mail with the words and an absolute link to the flag', async () => {
    const intervalId = await loggedInterval()
    const flagId = await raiseFlag(reviewer.client, intervalId, 'Description says CLAY but the <SPT> blows look like sand & gravel.')
    await catcher.waitFor(() => catcher.to(engineer.email).some(m => m.text.includes(flagId)), 'flag e-mail to the engineer')
    const mail = catcher.to(engineer.email).find(m => m.text.includes(flagId))!
    expect(mail.subject).toMatch(/^Questionable flag on BH-\w+ 0–4\.5 m$/)
    expect(mail.text).toContain('A reviewer raised a flag on a test you adopted or an interval you logged.')
    expect(mail.text).toContain('> Description says CLAY but the <SPT> blows look like sand & gravel.')
    const link = `${PUBLIC_URL}/projects/${projectId}/review?status=all&flag=${flagId}`
    expect(mail.links).toContain(link)
    expect(mail.html).toContain(`href="${link.replace(/&/g, '&#38;')}"`)
    expect(mail.html).toContain('the &#60;SPT&#62; blows look like sand &#38; gravel')
    expect(mail.text).toContain(`${PUBLIC_URL}/account#notifications`)
    // Nobody is told of their own flag.
    expect(catcher.to(reviewer.email).filter(m => m.text.includes(flagId))).toEqual([])

    const inbox = await must('inbox', engineer.client.get<{ notifications: InboxRow[], unread: number }>('/api/account/inbox'))
    const entry = inbox.notifications.find(n => n.link.endsWith(flagId))
    expect(entry).toMatchObject({ kind: 'flag-raised', readAt: null, body: 'Description says CLAY but the <SPT> blows look like sand & gravel.', link: `/projects/${projectId}/review?status=all&flag=${flagId}` })
    const sent = (await outbox('sent')).find(m => m.toAddress === engineer.email && m.subject === mail.subject)
    expect(sent).toMatchObject({ kind: 'flag-raised', attempts: 1, lastError: null })
  })

  it('a reply reaches the flag\'s author and the earlier repliers, not the one replying', async () => {
    const other = await account('geologist')
    await must('member', admin.post(`/api/projects/${projectId}/members`, { email: other.email, role: 'geologist' }), 201)
    const flagId = await raiseFlag(reviewer.client, await loggedInterval(), 'Check the boundary depth.')
    await must('reply 1', engineer.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: 'Boundary from the CPT.' }), 201)
    await must('reply 2', other.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: 'Agree with 4.5 m.' }), 201)
    await catcher.waitFor(() => catcher.to(engineer.email).some(m => m.subject.startsWith('New reply') && m.text.includes('Agree with 4.5 m.')), 'reply e-mail to the engineer')
    await catcher.waitFor(() => catcher.to(reviewer.email).filter(m => m.subject.startsWith('New reply') && m.text.includes(flagId)).length === 2, 'both reply e-mails to the flag author')
    // The geologist replied last: told of nothing (the engineer's reply came before they were in the thread).
    const inbox = await must('inbox', other.client.get<{ notifications: InboxRow[] }>('/api/account/inbox'))
    expect(inbox.notifications.filter(n => n.link.endsWith(flagId))).toEqual([])
  })

  it('with the catcher down the message waits in the outbox (attempts counted, the error kept) and arrives once it is back', async () => {
    const intervalId = await loggedInterval()
    await catcher.stop()
    try {
      const flagId = await raiseFlag(reviewer.client, intervalId, 'Raised while the mail server is down.')
      const row = await eventually('a failed attempt', async () => (await outbox('pending')).find(m => m.toAddress === engineer.email && m.attempts > 0))
      expect(row.status).toBe('pending')
      expect(row.lastError).toMatch(/ECONNREFUSED|connect/i)
      expect(row.lastError).not.toContain('Raised while the mail server is down.')
      await catcher.start()
      await catcher.waitFor(() => catcher.to(engineer.email).some(m => m.text.includes(flagId)), 'the delayed e-mail')
      const sent = await eventually('the row marked sent', async () => (await outbox('sent')).find(m => m.id === row.id))
      expect(sent.attempts).toBeGreaterThan(1)
      expect(sent.lastError).toBeNull()
    }
    finally {
      await catcher.start()
    }
  })

  it('a failed message is listed for site admins and sent again when one retries it (409 for one not failed, 404 for none)', async () => {
    const flagId = await raiseFlag(reviewer.client, await loggedInterval(), 'This one will be marked failed.')
    await catcher.waitFor(() => catcher.to(engineer.email).some(m => m.text.includes(flagId)), 'the flag e-mail')
    const outboxId = Number(catcher.to(engineer.email).find(m => m.text.includes(flagId))!.headers.get('x-pastload-outbox-id'))
    const row = await eventually('the row marked sent', async () => (await outbox('sent')).find(m => m.id === outboxId))
    expect((await admin.post(`/api/admin/mail/${row.id}/retry`)).status).toBe(409)
    // As after the last attempt: the worker marks a message failed once it has used up its attempts.
    const db = new pg.Client({ connectionString: env.DATABASE_URL })
    await db.connect()
    await db.query(`update mail_outbox set status = 'failed', attempts = 8, last_error = 'Greeting never received' where id = $1`, [row.id])
    await db.end()
    const failed = (await outbox('failed')).find(m => m.id === row.id)
    expect(failed).toMatchObject({ status: 'failed', attempts: 8, lastError: 'Greeting never received' })
    expect(failed).not.toHaveProperty('textBody')
    expect(failed).not.toHaveProperty('htmlBody')
    const before = catcher.to(engineer.email).filter(m => m.text.includes(flagId)).length
    expect((await engineer.client.post(`/api/admin/mail/${row.id}/retry`)).status).toBe(403)
    const retried = await admin.post<{ status: string }>(`/api/admin/mail/${row.id}/retry`)
    expect(retried.status).toBe(200)
    expect(retried.body.status).toBe('pending')
    await catcher.waitFor(() => catcher.to(engineer.email).filter(m => m.text.includes(flagId)).length === before + 1, 'the retried e-mail')
    expect((await admin.post('/api/admin/mail/2147483000/retry')).status).toBe(404)
    expect((await admin.post('/api/admin/mail/not-a-number/retry')).status).toBe(404)
    expect((await engineer.client.get('/api/admin/mail')).status).toBe(403)
    expect((await new Client(base).get('/api/admin/mail')).status).toBe(401)
  })

  it('two app processes polling the same outbox never send a message twice', async () => {
    servers.push(await startServer(env))
    const flagId = await raiseFlag(reviewer.client, await loggedInterval(), 'Many replies follow.')
    await must('first reply', engineer.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: 'Looking at it.' }), 201)
    const N = 24
    for (let i = 0; i < N; i++) await must(`reply ${i}`, reviewer.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: `Note ${i} of the review round.` }), 201)
    const mine = () => catcher.to(engineer.email).filter(m => m.subject.startsWith('New reply') && m.text.includes(flagId))
    await catcher.waitFor(() => mine().length >= N, `${N} reply e-mails`)
    const ids = mine().map(m => String(m.headers.get('x-pastload-outbox-id')))
    expect(new Set(ids).size).toBe(ids.length)
    expect(ids).toHaveLength(N)
    const rows = (await outbox('sent')).filter(m => ids.includes(String(m.id)))
    expect(rows).toHaveLength(N)
    expect(rows.every(r => r.attempts === 1)).toBe(true)
  })

  it('a kind turned off sends no e-mail (no outbox row) but the inbox still has the notice', async () => {
    const quiet = await account('quiet')
    await must('member', admin.post(`/api/projects/${projectId}/members`, { email: quiet.email, role: 'engineer' }), 201)
    const prefs = await must('preferences', quiet.client.get<{ preferences: { kind: string, mode: string }[] }>('/api/account/notifications'))
    expect(prefs.preferences.map(p => p.kind)).toEqual(['review-requested', 'version-approved', 'version-returned', 'flag-raised', 'flag-reply', 'member-added'])
    expect(prefs.preferences.every(p => p.mode === 'immediate')).toBe(true)
    const put = await must('turn off', quiet.client.request<{ preferences: { kind: string, mode: string }[] }>('PUT', '/api/account/notifications', { preferences: { 'flag-raised': 'off' } }))
    expect(put.preferences.find(p => p.kind === 'flag-raised')?.mode).toBe('off')
    expect(put.preferences.find(p => p.kind === 'flag-reply')?.mode).toBe('immediate')
    // Account mail cannot be turned off; unknown kinds and modes are 400.
    expect((await quiet.client.request('PUT', '/api/account/notifications', { preferences: { 'password-reset': 'off' } })).status).toBe(400)
    expect((await quiet.client.request('PUT', '/api/account/notifications', { preferences: { 'flag-raised': 'weekly' } })).status).toBe(400)
    expect((await quiet.client.request('PUT', '/api/account/notifications', { preferences: {} })).status).toBe(400)
    expect((await new Client(base).request('PUT', '/api/account/notifications', { preferences: { 'flag-raised': 'off' } })).status).toBe(401)

    const point = await must('point', quiet.client.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: `BQ-${tag}`, kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 10 }), 201)
    const log = await must('log', quiet.client.request<{ intervals: { id: string }[] }>('PUT', `/api/projects/${projectId}/points/${point.point.id}/intervals`, { intervals: [{ top: 0, bottom: 3, description: 'Peat' }] }))
    const flagId = await raiseFlag(reviewer.client, log.intervals[0]!.id, 'Peat or organic clay?')
    const inbox = await must('inbox', quiet.client.get<{ notifications: InboxRow[], unread: number }>('/api/account/inbox'))
    expect(inbox.notifications.map(n => n.kind)).toEqual(['flag-raised'])
    expect(inbox.unread).toBe(1)
    expect((await outbox()).filter(m => m.toAddress === quiet.email)).toEqual([])
    // A reply in the same thread is still e-mailed (that kind stays on).
    await must('reply', quiet.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: 'Organic clay, see the photo.' }), 201)
    await must('answer', reviewer.client.post(`/api/projects/${projectId}/flags/${flagId}/replies`, { body: 'Thanks.' }), 201)
    await catcher.waitFor(() => catcher.to(quiet.email).some(m => m.subject.startsWith('New reply')), 'the reply e-mail')
    expect(catcher.to(quiet.email).map(m => m.subject.split(' ')[0])).toEqual(['New'])
  })

  it('the inbox: unread count, list, mark one read, mark all read; only one\'s own entries', async () => {
    const me = await account('inbox')
    const stranger = await account('stranger')
    await must('member', admin.post(`/api/projects/${projectId}/members`, { email: me.email, role: 'engineer' }), 201)
    const anonymous = new Client(base)
    expect((await anonymous.get('/api/account/inbox')).status).toBe(401)
    expect((await anonymous.get('/api/account/inbox/count')).status).toBe(401)
    expect((await anonymous.post('/api/account/inbox/read-all')).status).toBe(401)
    expect(await must('count', me.client.get('/api/account/inbox/count'))).toEqual({ unread: 0 })

    for (const words of ['First', 'Second', 'Third']) {
      const point = await must('point', me.client.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: `BI-${words}-${tag}`, kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 10 }), 201)
      const log = await must('log', me.client.request<{ intervals: { id: string }[] }>('PUT', `/api/projects/${projectId}/points/${point.point.id}/intervals`, { intervals: [{ top: 0, bottom: 2, description: 'Fill' }] }))
      await raiseFlag(reviewer.client, log.intervals[0]!.id, `${words} look at the fill.`)
    }
    expect(await must('count', me.client.get('/api/account/inbox/count'))).toEqual({ unread: 3 })
    const list = await must('inbox', me.client.get<{ notifications: InboxRow[], unread: number, total: number }>('/api/account/inbox?limit=2'))
    expect(list.total).toBe(3)
    expect(list.notifications.map(n => n.body)).toEqual(['Third look at the fill.', 'Second look at the fill.'])
    const third = list.notifications[0]!

    // Someone else cannot read or mark my entry; a malformed id names nothing (404, as everywhere).
    expect((await stranger.client.post(`/api/account/inbox/${third.id}/read`)).status).toBe(404)
    expect((await stranger.client.get<{ notifications: InboxRow[] }>('/api/account/inbox')).body.notifications).toEqual([])
    expect((await me.client.post('/api/account/inbox/not-a-uuid/read')).status).toBe(404)
    expect((await me.client.get('/api/account/inbox?limit=1000')).status).toBe(400)

    expect(await must('read one', me.client.post(`/api/account/inbox/${third.id}/read`))).toEqual({ marked: 1, unread: 2 })
    expect(await must('read again', me.client.post(`/api/account/inbox/${third.id}/read`))).toEqual({ marked: 0, unread: 2 })
    const unread = await must('unread', me.client.get<{ notifications: InboxRow[] }>('/api/account/inbox?unread=1'))
    expect(unread.notifications.map(n => n.body)).toEqual(['Second look at the fill.', 'First look at the fill.'])
    expect(await must('read all', me.client.post('/api/account/inbox/read-all'))).toEqual({ marked: 2, unread: 0 })
    expect(await must('count', me.client.get('/api/account/inbox/count'))).toEqual({ unread: 0 })
  })
})
