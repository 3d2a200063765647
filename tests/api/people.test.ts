// Invitations (project and site), password reset and the people page: one-time links stored
// hashed (the token read back from the outbox row's text, as the e-mail carries it), expiry,
// single use, withdrawal, account disabling that stops sessions and tokens at once, and the
// last enabled site admin.
import { createHash, randomBytes } from 'node:crypto'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createUser, demoEmail, signIn, signedInDemo, uniqueEmail, useNewAccount } from '../helpers/http'
import { createProject, useTestProject } from '../helpers/project'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

const NEW_PASSWORD = 'a-brand-new-passphrase-42'
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')

/** A client from an address of its own, so the public doors' throttle of one test touches no other. */
function anonymous(): Client {
  const c = new Client()
  c.forwardedFor = `10.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250) + 1}`
  return c
}

/** The token of the newest e-mail of this kind to this address, read from the outbox row's text. */
async function linkFromOutbox(email: string, kind: 'invitation' | 'password-reset'): Promise<string> {
  const { rows } = await pool.query<{ text_body: string }>('select text_body from mail_outbox where lower(to_address) = lower($1) and kind = $2 order by id desc limit 1', [email, kind])
  const text = rows[0]?.text_body ?? ''
  const path = kind === 'invitation' ? 'invitations' : 'reset-password'
  const m = new RegExp(`/${path}/([A-Za-z0-9_-]{43})`).exec(text)
  if (!m) throw new Error(`no ${kind} link in the outbox for ${email}`)
  return m[1]!
}

async function outboxCount(email: string, kind: string): Promise<number> {
  const { rows } = await pool.query<{ n: string }>('select count(*) as n from mail_outbox where lower(to_address) = lower($1) and kind = $2', [email, kind])
  return Number(rows[0]!.n)
}

interface InviteReply { outcome: string, member?: { userId: string, role: string }, invitation?: { id: string, email: string, role: string } }
interface Issue { message: string, data?: { state?: string } }

describe('project invitations', () => {
  const { owner: admin } = signedInDemo('owner')
  const ownerAccount = useNewAccount(admin, 'inv-owner')
  const owner = ownerAccount.client
  // The admin makes the project and hands it to the test's own owner.
  const project = useTestProject(admin, 'INV', 'Invitation test site', () => [{ email: ownerAccount.email, role: 'owner' }])
  const invitations = () => `${project.base}/invitations`
  let ownerName: string

  beforeAll(async () => {
    ownerName = (await owner.get<{ user: { displayName: string } }>('/api/auth/me')).body.user.displayName
  })

  it('adds an existing account at once (any case of the address), tells them, and refuses a second time with 409', async () => {
    const invitee = await createUser(admin, 'inv-existing')
    const r = await owner.post<InviteReply>(invitations(), { email: invitee.email.toUpperCase(), role: 'reviewer' })
    expect(r.status).toBe(201)
    expect(r.body.outcome).toBe('member-added')
    expect(r.body.member).toMatchObject({ userId: invitee.id, role: 'reviewer' })
    const members = await owner.get<{ members: { userId: string, role: string }[] }>(`/api/projects/${project.id}/members`)
    expect(members.body.members.find(m => m.userId === invitee.id)?.role).toBe('reviewer')
    const notices = await pool.query<{ kind: string, link: string, project_id: string }>('select kind, link, project_id from notifications where user_id = $1', [invitee.id])
    expect(notices.rows).toEqual([{ kind: 'member-added', link: `/projects/${project.id}`, project_id: project.id }])
    // The project is theirs to open now.
    expect((await invitee.client.get(`/api/projects/${project.id}`)).status).toBe(200)
    // No invitation row for someone who already has an account.
    expect((await pool.query('select 1 from invitations where lower(email) = lower($1)', [invitee.email])).rowCount).toBe(0)

    const again = await owner.post<Issue>(invitations(), { email: invitee.email, role: 'viewer' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/already a member \(reviewer\)/)
  })

  it('invites an unknown address: a hashed one-time link by e-mail, listed as pending; accepting creates the account, signs in and joins with the role', async () => {
    const email = uniqueEmail('inv-new')
    const r = await owner.post<InviteReply>(invitations(), { email, role: 'geologist' })
    expect(r.status).toBe(201)
    expect(r.body.outcome).toBe('invited')
    expect(r.body.invitation).toMatchObject({ email, role: 'geologist' })
    const token = await linkFromOutbox(email, 'invitation')
    // The reply never carries the token or its hash; the database only the hash.
    expect(JSON.stringify(r.body)).not.toContain(token)
    expect(JSON.stringify(r.body)).not.toContain(sha256(token))
    const stored = await pool.query<{ token_hash: string, expires_at: Date }>('select token_hash, expires_at from invitations where id = $1', [r.body.invitation!.id])
    expect(stored.rows[0]!.token_hash).toBe(sha256(token))
    const days = (stored.rows[0]!.expires_at.getTime() - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(6.9)
    expect(days).toBeLessThanOrEqual(7)

    const pending = await owner.get<{ invitations: { id: string, email: string, role: string, invitedByName: string }[] }>(invitations())
    expect(pending.body.invitations.find(i => i.id === r.body.invitation!.id)).toMatchObject({ email, role: 'geologist', invitedByName: ownerName })
    expect(JSON.stringify(pending.body)).not.toContain(sha256(token))

    const guest = anonymous()
    const preview = await guest.get<{ email: string, role: string, project: { id: string }, invitedByName: string }>(`/api/invitations/${token}`)
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({ email, role: 'geologist', project: { id: project.id }, invitedByName: ownerName })

    const accepted = await guest.post<{ user: { email: string, displayName: string }, next: string }>(`/api/invitations/${token}/accept`, { displayName: 'Ines Varga', password: NEW_PASSWORD })
    expect(accepted.status).toBe(201)
    expect(accepted.body.next).toBe(`/projects/${project.id}`)
    expect(guest.cookie).toMatch(/^pastload_session=/)
    const me = await guest.get<{ user: { email: string, displayName: string } }>('/api/auth/me')
    expect(me.body.user).toMatchObject({ email, displayName: 'Ines Varga' })
    const asGuest = await guest.get<{ role: string }>(`/api/projects/${project.id}`)
    expect(asGuest.status).toBe(200)
    expect(asGuest.body.role).toBe('geologist')
    // The password is theirs: a fresh sign-in works with it.
    expect((await signIn(email, NEW_PASSWORD)).cookie).toMatch(/^pastload_session=/)
    // No longer pending; the link works once.
    expect((await owner.get<{ invitations: { id: string }[] }>(invitations())).body.invitations.some(i => i.id === r.body.invitation!.id)).toBe(false)
    const reused = await anonymous().post<Issue>(`/api/invitations/${token}/accept`, { displayName: 'Someone Else', password: NEW_PASSWORD })
    expect(reused.status).toBe(410)
    expect(reused.body.data?.state).toBe('used')
    expect(reused.body.message).toMatch(/already been used/)
    expect((await anonymous().get<Issue>(`/api/invitations/${token}`)).status).toBe(410)
    const audit = await pool.query<{ action: string }>('select action from audit_events where entity = $1 and entity_id = $2 order by id', ['invitation', r.body.invitation!.id])
    expect(audit.rows.map(a => a.action)).toEqual(['invite', 'accept'])
  })

  it('refuses a bad name or short password with 400 and leaves the invitation pending', async () => {
    const email = uniqueEmail('inv-short')
    await owner.post(invitations(), { email, role: 'viewer' })
    const token = await linkFromOutbox(email, 'invitation')
    const r = await anonymous().post<{ data: { issues: { path: string }[] } }>(`/api/invitations/${token}/accept`, { displayName: '', password: 'short' })
    expect(r.status).toBe(400)
    expect(r.body.data.issues.map(i => i.path).sort()).toEqual(['displayName', 'password'])
    expect((await anonymous().get(`/api/invitations/${token}`)).status).toBe(200)
    expect((await pool.query('select 1 from users where lower(email) = lower($1)', [email])).rowCount).toBe(0)
  })

  it('says plainly when a link has expired, was withdrawn, is unknown, or its address has an account by now', async () => {
    // Expired: the row's expiry moved into the past.
    const e1 = uniqueEmail('inv-expired')
    const r1 = await owner.post<InviteReply>(invitations(), { email: e1, role: 'viewer' })
    const t1 = await linkFromOutbox(e1, 'invitation')
    await pool.query(`update invitations set expires_at = now() - interval '1 minute' where id = $1`, [r1.body.invitation!.id])
    const expired = await anonymous().get<Issue>(`/api/invitations/${t1}`)
    expect(expired.status).toBe(410)
    expect(expired.body.data?.state).toBe('expired')
    expect(expired.body.message).toMatch(/expired/)
    expect((await anonymous().post(`/api/invitations/${t1}/accept`, { displayName: 'Late', password: NEW_PASSWORD })).status).toBe(410)
    expect((await pool.query('select 1 from users where lower(email) = lower($1)', [e1])).rowCount).toBe(0)

    // Withdrawn from the team panel: the link stops; withdrawing again is 409.
    const e2 = uniqueEmail('inv-revoked')
    const r2 = await owner.post<InviteReply>(invitations(), { email: e2, role: 'viewer' })
    const t2 = await linkFromOutbox(e2, 'invitation')
    expect((await owner.delete(`${invitations()}/${r2.body.invitation!.id}`)).status).toBe(200)
    const revoked = await anonymous().post<Issue>(`/api/invitations/${t2}/accept`, { displayName: 'Gone', password: NEW_PASSWORD })
    expect(revoked.status).toBe(410)
    expect(revoked.body.data?.state).toBe('revoked')
    expect(revoked.body.message).toMatch(/withdrawn/)
    expect((await owner.delete(`${invitations()}/${r2.body.invitation!.id}`)).status).toBe(409)
    // Another project's id does not reach this invitation.
    const other = await createProject(admin, 'INV2', 'Other site')
    expect((await admin.delete(`/api/projects/${other.id}/invitations/${r2.body.invitation!.id}`)).status).toBe(404)

    // Unknown or mangled tokens: 404, nothing looked up beyond the hash.
    const wrong = randomBytes(32).toString('base64url')
    const unknown = await anonymous().get<Issue>(`/api/invitations/${wrong}`)
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toMatch(/not valid/)
    expect((await anonymous().post(`/api/invitations/${wrong}/accept`, { displayName: 'Nobody', password: NEW_PASSWORD })).status).toBe(404)
    expect((await anonymous().get('/api/invitations/short')).status).toBe(404)
    expect((await anonymous().get(`/api/invitations/${'x'.repeat(200)}`)).status).toBe(404)

    // The address got an account (from an admin) before the invitee answered: 409, sign in instead.
    const e3 = uniqueEmail('inv-taken')
    await owner.post(invitations(), { email: e3, role: 'viewer' })
    const t3 = await linkFromOutbox(e3, 'invitation')
    expect((await admin.post('/api/users', { email: e3, displayName: 'Already Here', password: TEST_PASSWORD })).status).toBe(201)
    const taken = await anonymous().post<Issue>(`/api/invitations/${t3}/accept`, { displayName: 'Second Try', password: NEW_PASSWORD })
    expect(taken.status).toBe(409)
    expect(taken.body.message).toMatch(/sign in/)
  })

  it('a new invitation to the same address withdraws the earlier link', async () => {
    const email = uniqueEmail('inv-again')
    await owner.post(invitations(), { email, role: 'viewer' })
    const first = await linkFromOutbox(email, 'invitation')
    await owner.post(invitations(), { email, role: 'designer' })
    const second = await linkFromOutbox(email, 'invitation')
    expect(second).not.toBe(first)
    expect((await anonymous().get<Issue>(`/api/invitations/${first}`)).body.data?.state).toBe('revoked')
    expect((await anonymous().get<{ role: string }>(`/api/invitations/${second}`)).body.role).toBe('designer')
  })
})

describe('site invitations from the people page', () => {
  it('creates an account of no project; an address with an account is 409; withdraw works', async () => {
    const admin = await signIn(demoEmail('owner'))
    const email = uniqueEmail('site-inv')
    const r = await admin.post<{ invitation: { id: string, email: string, role: null } }>('/api/admin/users', { email })
    expect(r.status).toBe(201)
    expect(r.body.invitation).toMatchObject({ email, role: null })
    const listed = await admin.get<{ invitations: { id: string }[] }>('/api/admin/invitations')
    expect(listed.body.invitations.some(i => i.id === r.body.invitation.id)).toBe(true)
    const token = await linkFromOutbox(email, 'invitation')
    const guest = anonymous()
    const preview = await guest.get<{ project: null, role: null }>(`/api/invitations/${token}`)
    expect(preview.body).toMatchObject({ project: null, role: null })
    const accepted = await guest.post<{ projectId: null, next: string }>(`/api/invitations/${token}/accept`, { displayName: 'Site Newcomer', password: NEW_PASSWORD })
    expect(accepted.status).toBe(201)
    expect(accepted.body).toMatchObject({ projectId: null, next: '/' })
    expect((await guest.get<{ projects: unknown[] }>('/api/projects')).body.projects).toEqual([])
    expect((await admin.post('/api/admin/users', { email: email.toUpperCase() })).status).toBe(409)

    const e2 = uniqueEmail('site-inv-withdraw')
    const r2 = await admin.post<{ invitation: { id: string } }>('/api/admin/users', { email: e2 })
    expect((await admin.delete(`/api/admin/invitations/${r2.body.invitation.id}`)).status).toBe(200)
    expect((await anonymous().get<Issue>(`/api/invitations/${await linkFromOutbox(e2, 'invitation')}`)).status).toBe(410)
  })
})

describe('password reset', () => {
  const { owner: admin } = signedInDemo('owner')

  it('answers 202 with the same message for an unknown and a known address; only the known one gets a link', async () => {
    const known = await createUser(admin, 'reset-known')
    const unknownEmail = uniqueEmail('reset-nobody')
    const a = await anonymous().post<{ message: string }>('/api/auth/password-reset', { email: unknownEmail })
    const b = await anonymous().post<{ message: string }>('/api/auth/password-reset', { email: known.email.toUpperCase() })
    expect(a.status).toBe(202)
    expect(b.status).toBe(202)
    expect(a.body).toEqual(b.body)
    expect(a.body.message).toMatch(/If an account uses this address/)
    expect(await outboxCount(unknownEmail, 'password-reset')).toBe(0)
    expect(await outboxCount(known.email, 'password-reset')).toBe(1)
    const token = await linkFromOutbox(known.email, 'password-reset')
    const row = await pool.query<{ token_hash: string, expires_at: Date }>('select token_hash, expires_at from password_resets where user_id = $1', [known.id])
    expect(row.rows.map(x => x.token_hash)).toEqual([sha256(token)])
    const minutes = (row.rows[0]!.expires_at.getTime() - Date.now()) / 60_000
    expect(minutes).toBeGreaterThan(58)
    expect(minutes).toBeLessThanOrEqual(60)
    expect((await anonymous().post('/api/auth/password-reset', { email: 'not-an-address' })).status).toBe(400)
  })

  it('sets the new password, ends every session and token of the account, signs this browser in, and works once', async () => {
    const u = await createUser(admin, 'reset-flow')
    const second = await signIn(u.email, TEST_PASSWORD)
    const tok = await u.client.post<{ token: { token: string } }>('/api/account/tokens', { name: 'script' })
    expect(tok.status).toBe(201)
    const script = new Client()
    script.origin = null
    script.bearer = tok.body.token.token
    expect((await script.get('/api/auth/me')).status).toBe(200)

    await anonymous().post('/api/auth/password-reset', { email: u.email })
    const token = await linkFromOutbox(u.email, 'password-reset')
    const browser = anonymous()
    expect((await browser.get<{ expiresAt: string }>(`/api/auth/password-reset/${token}`)).status).toBe(200)
    const short = await browser.post(`/api/auth/password-reset/${token}`, { password: 'short' })
    expect(short.status).toBe(400)
    const done = await browser.post<{ user: { id: string }, tokensRevoked: number }>(`/api/auth/password-reset/${token}`, { password: NEW_PASSWORD })
    expect(done.status).toBe(200)
    expect(done.body).toMatchObject({ user: { id: u.id }, tokensRevoked: 1 })

    // Every earlier session and the token are dead; this browser is signed in afresh.
    expect((await u.client.get('/api/auth/me')).status).toBe(401)
    expect((await second.get('/api/auth/me')).status).toBe(401)
    expect((await script.get('/api/auth/me')).status).toBe(401)
    expect((await browser.get<{ user: { id: string } }>('/api/auth/me')).body.user.id).toBe(u.id)
    expect((await new Client().post('/api/auth/login', { email: u.email, password: TEST_PASSWORD })).status).toBe(401)
    expect((await signIn(u.email, NEW_PASSWORD)).cookie).toMatch(/^pastload_session=/)
    const audit = await pool.query<{ after: { via: string } }>(`select after from audit_events where entity = 'user' and entity_id = $1 and action = 'password-change'`, [u.id])
    expect(audit.rows.map(a => a.after.via)).toEqual(['reset-link'])

    // Single use.
    const reused = await anonymous().post<Issue>(`/api/auth/password-reset/${token}`, { password: 'yet-another-passphrase-9' })
    expect(reused.status).toBe(410)
    expect(reused.body.data?.state).toBe('used')
    expect((await anonymous().get(`/api/auth/password-reset/${token}`)).status).toBe(410)
  })

  it('an expired or unknown link is refused plainly; a disabled account gets no link', async () => {
    const u = await createUser(admin, 'reset-expired')
    await anonymous().post('/api/auth/password-reset', { email: u.email })
    const token = await linkFromOutbox(u.email, 'password-reset')
    await pool.query(`update password_resets set expires_at = now() - interval '1 second' where user_id = $1`, [u.id])
    const expired = await anonymous().post<Issue>(`/api/auth/password-reset/${token}`, { password: NEW_PASSWORD })
    expect(expired.status).toBe(410)
    expect(expired.body.data?.state).toBe('expired')
    expect(expired.body.message).toMatch(/expired/)
    expect((await signIn(u.email, TEST_PASSWORD)).cookie).toMatch(/^pastload_session=/)
    expect((await anonymous().post(`/api/auth/password-reset/${randomBytes(32).toString('base64url')}`, { password: NEW_PASSWORD })).status).toBe(404)

    const d = await createUser(admin, 'reset-disabled')
    expect((await admin.patch(`/api/admin/users/${d.id}`, { disabled: true })).status).toBe(200)
    expect((await anonymous().post('/api/auth/password-reset', { email: d.email })).status).toBe(202)
    expect(await outboxCount(d.email, 'password-reset')).toBe(0)
  })

  it('throttles requests from one address for one e-mail (429 with Retry-After)', async () => {
    const c = anonymous()
    const email = uniqueEmail('reset-throttle')
    const statuses: number[] = []
    for (let i = 0; i < 6; i++) statuses.push((await c.post('/api/auth/password-reset', { email })).status)
    expect(statuses).toEqual([202, 202, 202, 202, 202, 429])
    const last = await c.post('/api/auth/password-reset', { email })
    expect(Number(last.headers.get('retry-after'))).toBeGreaterThan(0)
  })
})

describe('people page (site admins)', () => {
  const { owner: admin } = signedInDemo('owner')
  let adminId: string
  beforeAll(async () => {
    adminId = (await admin.get<{ user: { id: string } }>('/api/auth/me')).body.user.id
  })

  it('is for site admins only: a member 403, anonymous 401, on every people route', async () => {
    const member = await signIn(demoEmail('engineer'))
    const target = await createUser(admin, 'people-target')
    for (const [method, path, body] of [
      ['GET', '/api/admin/users', undefined],
      ['POST', '/api/admin/users', { email: uniqueEmail('people-no') }],
      ['PATCH', `/api/admin/users/${target.id}`, { disabled: true }],
      ['GET', '/api/admin/invitations', undefined],
      ['DELETE', '/api/admin/invitations/00000000-0000-4000-8000-000000000000', undefined],
    ] as const) {
      expect((await member.request(method, path, body)).status, `${method} ${path}`).toBe(403)
      expect((await new Client().request(method, path, body)).status, `${method} ${path}`).toBe(401)
    }
    expect((await target.client.get('/api/auth/me')).status).toBe(200)
  })

  it('lists accounts with site admin, disabled and project count; finds by name or e-mail', async () => {
    const u = await createUser(admin, 'people-list')
    await createProject(admin, 'PPL', 'People count site', [{ email: u.email, role: 'viewer' }])
    const r = await admin.get<{ users: { id: string, email: string, isSiteAdmin: boolean, disabledAt: string | null, projects: number }[], total: number }>(`/api/admin/users?q=${encodeURIComponent(u.email)}`)
    expect(r.status).toBe(200)
    expect(r.body.total).toBe(1)
    expect(r.body.users).toEqual([expect.objectContaining({ id: u.id, email: u.email, isSiteAdmin: false, disabledAt: null, projects: 1 })])
    const all = await admin.get<{ users: { id: string, isSiteAdmin: boolean }[] }>('/api/admin/users?limit=200')
    expect(all.body.users.find(x => x.id === adminId)?.isSiteAdmin).toBe(true)
    expect((await admin.get('/api/admin/users?limit=0')).status).toBe(400)
  })

  it('disabling stops the sessions and API tokens at once and refuses sign-in plainly; enabling lets them back', async () => {
    const u = await createUser(admin, 'people-disable')
    const tok = await u.client.post<{ token: { token: string } }>('/api/account/tokens', { name: 'nightly' })
    const script = new Client()
    script.origin = null
    script.bearer = tok.body.token.token
    expect((await script.get('/api/projects')).status).toBe(200)

    const off = await admin.patch<{ user: { disabledAt: string | null } }>(`/api/admin/users/${u.id}`, { disabled: true })
    expect(off.status).toBe(200)
    expect(off.body.user.disabledAt).not.toBeNull()
    expect((await u.client.get('/api/auth/me')).status).toBe(401)
    const refused = await script.get<{ message: string }>('/api/projects')
    expect(refused.status).toBe(401)
    expect(refused.body.message).toMatch(/disabled/)
    expect((await pool.query('select 1 from sessions where user_id = $1', [u.id])).rowCount).toBe(0)
    const login = await new Client().post<{ message: string }>('/api/auth/login', { email: u.email, password: TEST_PASSWORD })
    expect(login.status).toBe(403)
    expect(login.body.message).toBe('This account is disabled. Ask a site admin to enable it.')
    // A wrong password still gets the plain 401: nothing tells a guesser the account is disabled.
    expect((await new Client().post('/api/auth/login', { email: u.email, password: 'wrong-password-123' })).status).toBe(401)

    const on = await admin.patch<{ user: { disabledAt: string | null } }>(`/api/admin/users/${u.id}`, { disabled: false })
    expect(on.body.user.disabledAt).toBeNull()
    expect((await signIn(u.email, TEST_PASSWORD)).cookie).toMatch(/^pastload_session=/)
    expect((await script.get('/api/projects')).status).toBe(200)
    const audit = await pool.query<{ action: string }>(`select action from audit_events where entity = 'user' and entity_id = $1 and action in ('disable', 'enable') order by id`, [u.id])
    expect(audit.rows.map(a => a.action)).toEqual(['disable', 'enable'])
  })

  it('grants and revokes site admin; nobody disables themselves; the last enabled site admin stays (409)', async () => {
    const u = await createUser(admin, 'people-admin')
    const granted = await admin.patch<{ user: { isSiteAdmin: boolean } }>(`/api/admin/users/${u.id}`, { isSiteAdmin: true })
    expect(granted.body.user.isSiteAdmin).toBe(true)
    expect((await u.client.get<{ user: { isSiteAdmin: boolean } }>('/api/auth/me')).body.user.isSiteAdmin).toBe(true)
    expect((await u.client.get('/api/admin/users')).status).toBe(200)

    const self = await u.client.patch<{ message: string }>(`/api/admin/users/${u.id}`, { disabled: true })
    expect(self.status).toBe(409)
    expect(self.body.message).toBe('You cannot disable your own account.')
    expect((await admin.patch('/api/admin/users/00000000-0000-4000-8000-000000000000', { disabled: true })).status).toBe(404)
    expect((await admin.patch(`/api/admin/users/${u.id}`, {})).status).toBe(400)

    // Make `u` the only enabled site admin for a moment (files run one at a time), then put the others back.
    const others = await pool.query<{ id: string }>('update users set is_site_admin = false where is_site_admin and disabled_at is null and id <> $1 returning id', [u.id])
    try {
      const last = await u.client.patch<{ message: string }>(`/api/admin/users/${u.id}`, { isSiteAdmin: false })
      expect(last.status).toBe(409)
      expect(last.body.message).toMatch(/last enabled site admin/)
    }
    finally {
      await pool.query('update users set is_site_admin = true where id = any($1::uuid[])', [others.rows.map(r => r.id)])
    }
    const revoked = await admin.patch<{ user: { isSiteAdmin: boolean } }>(`/api/admin/users/${u.id}`, { isSiteAdmin: false })
    expect(revoked.body.user.isSiteAdmin).toBe(false)
    expect((await u.client.get('/api/admin/users')).status).toBe(403)
  })
})
