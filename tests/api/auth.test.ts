import { describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createUser, demoEmail, signIn } from '../helpers/http'

describe('sign-in, me, sign-out', () => {
  it('signs in with the demo engineer and sets an HttpOnly, SameSite=Lax session cookie', async () => {
    const c = new Client()
    const r = await c.request('POST', '/api/auth/login', { email: demoEmail('engineer'), password: 'pastload-demo-2026' })
    expect(r.status).toBe(200)
    const cookie = r.headers.getSetCookie().find(s => s.startsWith('pastload_session='))
    expect(cookie).toMatch(/HttpOnly/)
    expect(cookie).toMatch(/SameSite=Lax/)
    // Served over plain HTTP here, so not Secure.
    expect(cookie).not.toMatch(/Secure/)
    const me = await c.get<{ user: { email: string, displayName: string } }>('/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(demoEmail('engineer'))
    expect(me.body.user.displayName).toBe('Tomas Lindqvist')
  })

  it('marks the cookie Secure when the request came over HTTPS through the proxy', async () => {
    const c = new Client()
    const res = await c.request('POST', '/api/auth/login', { email: demoEmail('designer'), password: 'pastload-demo-2026' }, { 'x-forwarded-proto': 'https' })
    expect(res.status).toBe(200)
    expect(res.headers.getSetCookie().find(s => s.startsWith('pastload_session='))).toMatch(/Secure/)
  })

  it('treats e-mail case-insensitively', async () => {
    const c = new Client()
    const r = await c.post('/api/auth/login', { email: demoEmail('reviewer').toUpperCase(), password: 'pastload-demo-2026' })
    expect(r.status).toBe(200)
  })

  it('gives the same 401 for an unknown e-mail and a wrong password', async () => {
    const a = await new Client().post<{ message: string }>('/api/auth/login', { email: 'nobody@harrow-estuary.example', password: 'pastload-demo-2026' })
    const b = await new Client().post<{ message: string }>('/api/auth/login', { email: demoEmail('engineer'), password: 'wrong-password-123' })
    expect(a.status).toBe(401)
    expect(b.status).toBe(401)
    expect(a.body.message).toBe(b.body.message)
    expect(a.body.message).toBe('E-mail or password is wrong.')
  })

  it('rejects a malformed body with 400 and the zod issues', async () => {
    const r = await new Client().post<{ data: { issues: { path: string, message: string }[] } }>('/api/auth/login', { email: 'not-an-email' })
    expect(r.status).toBe(400)
    const paths = r.body.data.issues.map(i => i.path).sort()
    expect(paths).toEqual(['email', 'password'])
  })

  it('answers 401 to /me without a session and after sign-out', async () => {
    expect((await new Client().get('/api/auth/me')).status).toBe(401)
    const c = await signIn(demoEmail('geologist'))
    const cookie = c.cookie
    expect((await c.post('/api/auth/logout')).status).toBe(200)
    expect((await c.get('/api/auth/me')).status).toBe(401)
    // The old session id is dead on the server, not just forgotten by the client.
    const replay = new Client()
    replay.cookie = cookie
    expect((await replay.get('/api/auth/me')).status).toBe(401)
  })
})

/** A client whose requests say they come from this address (X-Forwarded-For). */
function clientAt(address: string): Client {
  const c = new Client()
  c.forwardedFor = address
  return c
}

/** Someone else, from another address, still signs in: a throttle stays on its (e-mail, address) pair. */
async function expectDesignerSignsInFrom(address: string) {
  expect((await clientAt(address).post('/api/auth/login', { email: demoEmail('designer'), password: 'pastload-demo-2026' })).status).toBe(200)
}

describe('rate limit', () => {
  it('refuses the 11th failed attempt for one e-mail with 429 and Retry-After, even with the right password', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { email } = await createUser(admin, 'throttle')
    const c = clientAt('203.0.113.10')
    for (let i = 0; i < 10; i++) {
      const r = await c.post('/api/auth/login', { email, password: `wrong-password-${i}` })
      expect(r.status).toBe(401)
    }
    const blocked = await c.post('/api/auth/login', { email, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    const retry = Number(blocked.headers.get('retry-after'))
    expect(retry).toBeGreaterThan(800)
    expect(retry).toBeLessThanOrEqual(900)
    // Another e-mail from another address is unaffected.
    await expectDesignerSignsInFrom('203.0.113.11')
  })

  it('throttles the (e-mail, IP) pair only: the owner still signs in from another address', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { email } = await createUser(admin, 'pair')
    const attacker = clientAt('198.51.100.1')
    for (let i = 0; i < 10; i++) {
      expect((await attacker.post('/api/auth/login', { email, password: `guess-${i}-wrong` })).status).toBe(401)
    }
    const blocked = await attacker.post<{ message: string }>('/api/auth/login', { email, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(800)
    expect(blocked.body.message).toMatch(/^Too many failed sign-ins\. Try again in \d+ minute\(s\)\.$/)
    const owner = clientAt('198.51.100.2')
    expect((await owner.post('/api/auth/login', { email, password: TEST_PASSWORD })).status).toBe(200)
    expect((await owner.get('/api/auth/me')).status).toBe(200)
    // The owner's success does not lift the throttle on the guessing address.
    expect((await attacker.post('/api/auth/login', { email, password: TEST_PASSWORD })).status).toBe(429)
  })

  it('evaluates exactly ten of 40 parallel wrong attempts and answers 429 to the rest', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { email } = await createUser(admin, 'burst')
    const replies = await Promise.all(Array.from({ length: 40 }, (_, i) => {
      const c = clientAt('198.51.100.3')
      return c.post('/api/auth/login', { email, password: `burst-guess-${i}` })
    }))
    const statuses = replies.map(r => r.status)
    expect(statuses.filter(s => s === 401)).toHaveLength(10)
    expect(statuses.filter(s => s === 429)).toHaveLength(30)
    for (const r of replies.filter(x => x.status === 429)) expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(800)
  })

  it('refuses an IP after 50 attempts across different e-mails, looser than the pair limit', async () => {
    const c = clientAt('198.51.100.4')
    for (let i = 0; i < 50; i++) {
      expect((await c.post('/api/auth/login', { email: `probe${i}@nowhere.example`, password: 'wrong-password-1' })).status).toBe(401)
    }
    const r = await c.post('/api/auth/login', { email: demoEmail('designer'), password: 'pastload-demo-2026' })
    expect(r.status).toBe(429)
    expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(800)
    // Another address is not affected.
    await expectDesignerSignsInFrom('198.51.100.5')
  })

  it('gives byte-identical bodies for an unknown e-mail and a wrong password', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { email } = await createUser(admin, 'same')
    const a = clientAt('198.51.100.6')
    const b = clientAt('198.51.100.7')
    const unknown = await a.request('POST', '/api/auth/login', { email: 'nobody-here@test.example', password: 'wrong-password-123' })
    const wrong = await b.request('POST', '/api/auth/login', { email, password: 'wrong-password-123' })
    expect(unknown.status).toBe(401)
    expect(wrong.status).toBe(401)
    expect(JSON.stringify(wrong.body)).toBe(JSON.stringify(unknown.body))
    expect((wrong.body as { message: string }).message).toBe('E-mail or password is wrong.')
  })
})

describe('Origin check (CSRF)', () => {
  it('refuses a state-changing request from another origin with 403', async () => {
    const c = await signIn(demoEmail('owner'))
    c.origin = 'http://evil.example'
    const r = await c.post<{ message: string }>('/api/auth/logout')
    expect(r.status).toBe(403)
    expect(r.body.message).toMatch(/Origin/)
    c.origin = c.base
    expect((await c.get('/api/auth/me')).status).toBe(200)
  })

  it('refuses a cookie-authenticated write without any Origin header', async () => {
    const c = await signIn(demoEmail('owner'))
    c.origin = null
    expect((await c.post('/api/auth/logout')).status).toBe(403)
  })

  it('lets a GET through without Origin', async () => {
    const c = await signIn(demoEmail('owner'))
    c.origin = null
    expect((await c.get('/api/auth/me')).status).toBe(200)
  })
})

describe('password change', () => {
  it('changes the password, signs out other sessions, and enforces 12 characters', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { client, email } = await createUser(admin, 'pw')
    const second = await signIn(email, TEST_PASSWORD)
    const short = await client.post<{ data: { issues: { path: string }[] } }>('/api/account/password', { currentPassword: TEST_PASSWORD, newPassword: 'short' })
    expect(short.status).toBe(400)
    expect(short.body.data.issues[0]!.path).toBe('newPassword')
    const wrong = await client.post('/api/account/password', { currentPassword: 'not-my-password', newPassword: 'a-brand-new-passphrase' })
    expect(wrong.status).toBe(422)
    const ok = await client.post('/api/account/password', { currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-passphrase' })
    expect(ok.status).toBe(200)
    expect((await client.get('/api/auth/me')).status).toBe(200)
    expect((await second.get('/api/auth/me')).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password: TEST_PASSWORD })).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password: 'a-brand-new-passphrase' })).status).toBe(200)
  })
})

/** The sign-in page's form as a browser sends it (the page has no scripts). */
async function postForm(c: Client, fields: Record<string, string>) {
  return c.request('POST', '/api/auth/login-form', new URLSearchParams(fields).toString(), { 'content-type': 'application/x-www-form-urlencoded' })
}

describe('the sign-in page\'s form (POST /api/auth/login-form)', () => {
  it('signs in and sends the browser on to `next` with 303 and the session cookie', async () => {
    const c = clientAt('198.51.100.20')
    const r = await postForm(c, { email: demoEmail('engineer'), password: 'pastload-demo-2026', next: '/account' })
    expect(r.status).toBe(303)
    expect(r.headers.get('location')).toBe('/account')
    expect(c.cookie).toMatch(/^pastload_session=./)
    expect((await c.get('/api/auth/me')).status).toBe(200)
  })

  it('sends a wrong password back to the sign-in page, keeping `next`, with no session and no password in the address', async () => {
    const c = clientAt('198.51.100.21')
    const r = await postForm(c, { email: demoEmail('engineer'), password: 'not-the-password-42', next: '/projects?x=1' })
    expect(r.status).toBe(303)
    expect(r.headers.get('location')).toBe('/login?failed=wrong&next=%2Fprojects%3Fx%3D1')
    expect(r.headers.get('location')).not.toContain('not-the-password')
    expect(c.cookie).toBe('')
  })

  it('follows `next` only to a path of this site', async () => {
    for (const next of ['//elsewhere.example/x', 'https://elsewhere.example/', '/\\elsewhere.example', 'projects', '/a\nb']) {
      const r = await postForm(clientAt('198.51.100.22'), { email: demoEmail('designer'), password: 'pastload-demo-2026', next })
      expect(r.status, next).toBe(303)
      expect(r.headers.get('location'), next).toBe('/')
    }
  })

  it('says an empty or malformed form is incomplete, and a JSON body too', async () => {
    const c = clientAt('198.51.100.23')
    expect((await postForm(c, {})).headers.get('location')).toBe('/login?failed=incomplete')
    expect((await postForm(c, { email: 'not-an-email', password: 'x' })).headers.get('location')).toBe('/login?failed=incomplete')
    const json = await c.request('POST', '/api/auth/login-form', { email: demoEmail('engineer') })
    expect([json.status, json.headers.get('location')]).toEqual([303, '/login?failed=incomplete'])
  })

  it('answers hostile fields with the sign-in page again, never a 5xx, never a session', async () => {
    const c = clientAt('198.51.100.26')
    for (const v of ['a\u0000b', '\uD800', 'x'.repeat(5000), '%00', '<script>']) {
      const r = await postForm(c, { email: v, password: v, next: v })
      expect(r.status, JSON.stringify(v).slice(0, 20)).toBe(303)
      expect(r.headers.get('location')).toBe('/login?failed=incomplete')
      expect(c.cookie).toBe('')
    }
  })

  it('shares the JSON route\'s throttle: after ten wrong guesses the form says how long to wait', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { email } = await createUser(admin, 'form-throttle')
    const guesser = clientAt('198.51.100.24')
    for (let i = 0; i < 10; i++) expect((await postForm(guesser, { email, password: `form-guess-${i}` })).headers.get('location')).toBe('/login?failed=wrong')
    const blocked = await postForm(guesser, { email, password: TEST_PASSWORD, next: '/account' })
    expect(blocked.headers.get('location')).toBe('/login?failed=throttled&wait=15&next=%2Faccount')
    expect((await clientAt('198.51.100.25').post('/api/auth/login', { email, password: TEST_PASSWORD })).status).toBe(200)
  })
})
