// HTTP helpers for API and browser tests: a tiny client with a cookie jar that
// sends the Origin header like a browser does.
import { beforeAll, inject } from 'vitest'
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../shared/demo/scenario'
import type { ProjectRole } from '../../shared/auth/roles'

export function baseUrl(): string {
  return inject('baseUrl')
}

export interface Reply<T = unknown> {
  status: number
  headers: Headers
  body: T
}

export class Client {
  cookie = ''
  bearer = ''
  origin: string | null
  forwardedFor: string | null = null

  constructor(public readonly base = baseUrl()) {
    this.origin = base
  }

  async request<T = Record<string, unknown>>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply<T>> {
    const h: Record<string, string> = { ...headers }
    if (body !== undefined && !h['content-type']) h['content-type'] = 'application/json'
    if (this.cookie) h.cookie = this.cookie
    if (this.bearer) h.authorization = `Bearer ${this.bearer}`
    if (this.origin && method !== 'GET') h.origin = this.origin
    if (this.forwardedFor) h['x-forwarded-for'] = this.forwardedFor
    const res = await fetch(this.base + path, {
      method,
      headers: h,
      body: body === undefined ? undefined : (typeof body === 'string' ? body : JSON.stringify(body)),
      redirect: 'manual',
    })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      if (pair?.startsWith('pastload_session=')) this.cookie = pair.endsWith('=') ? '' : pair
    }
    const text = await res.text()
    let parsed: unknown = text
    try { parsed = text ? JSON.parse(text) : null }
    catch { /* not JSON */ }
    return { status: res.status, headers: res.headers, body: parsed as T }
  }

  get<T = Record<string, unknown>>(path: string) { return this.request<T>('GET', path) }
  post<T = Record<string, unknown>>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = Record<string, unknown>>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  delete<T = Record<string, unknown>>(path: string) { return this.request<T>('DELETE', path) }
}

export function demoEmail(role: ProjectRole): string {
  const p = DEMO_PEOPLE.find(d => d.role === role)
  if (!p) throw new Error(`No demo person has role ${role}`)
  return p.email
}

async function logIn(c: Client, email: string, password: string): Promise<Client> {
  const r = await c.post('/api/auth/login', { email, password })
  if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`)
  return c
}

/** A client signed in as `email` (demo password unless given). */
export async function signIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  return logIn(new Client(), email, password)
}

/**
 * The demo people of the given roles, one client each, signed in by a `beforeAll`
 * of the describe block this is called in (so before the hooks declared after it).
 */
export function signedInDemo<R extends ProjectRole>(...roles: R[]): Record<R, Client> {
  const clients = Object.fromEntries(roles.map(role => [role, new Client()])) as Record<R, Client>
  beforeAll(async () => {
    for (const role of roles) await logIn(clients[role], demoEmail(role), DEMO_PASSWORD)
  })
  return clients
}

export async function demoProjectId(c: Client): Promise<string> {
  const r = await c.get<{ projects: { id: string, jobNumber: string }[] }>('/api/projects')
  const p = r.body.projects.find(x => x.jobNumber === 'TRN-0417')
  if (!p) throw new Error('demo project TRN-0417 not found')
  return p.id
}

let counter = 0
/** A unique e-mail for accounts a test creates. */
export function uniqueEmail(tag: string): string {
  counter += 1
  return `${tag}.${Date.now().toString(36)}${counter}@test.example`
}

export const TEST_PASSWORD = 'correct-horse-battery-9'

async function addAccount(admin: Client, email: string, tag: string): Promise<string> {
  const r = await admin.post<{ user: { id: string } }>('/api/users', { email, displayName: `Test ${tag}`, password: TEST_PASSWORD })
  if (r.status !== 201) throw new Error(`creating ${email} failed: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body.user.id
}

/** Creates an account through the admin API and returns a signed-in client for it. */
export async function createUser(admin: Client, tag: string): Promise<{ client: Client, email: string, id: string }> {
  const email = uniqueEmail(tag)
  const id = await addAccount(admin, email, tag)
  return { client: await signIn(email, TEST_PASSWORD), email, id }
}

/**
 * An account of the describe block's own, created by `admin` and signed in by a
 * `beforeAll` of the block: `client` can be kept at once, `email` and `id` are
 * set once the tests run.
 */
export function useNewAccount(admin: Client, tag: string): { readonly client: Client, readonly email: string, readonly id: string } {
  const account = { client: new Client(), email: '', id: '' }
  beforeAll(async () => {
    account.email = uniqueEmail(tag)
    account.id = await addAccount(admin, account.email, tag)
    await logIn(account.client, account.email, TEST_PASSWORD)
  })
  return account
}
