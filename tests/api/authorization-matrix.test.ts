/// <reference types="vite/client" />
// Every project route × every role × a non-member × anonymous → expected status.
// Routes are listed per domain in tests/api/matrix/*.routes.ts; a route file under
// server/api/projects/ without an entry here fails the suite.
import { readdirSync } from 'node:fs'
import { join, relative, resolve } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { openEventStream } from '../helpers/event-stream'
import { Client, createUser, demoEmail, signIn, uniqueEmail } from '../helpers/http'
import { CALLERS, type Caller, type Ctx, type RouteCase, type SiteRouteCase } from './matrix/types'

// Each domain's routes live in tests/api/matrix/<domain>.routes.ts (export ROUTES).
const modules = import.meta.glob<{ ROUTES: RouteCase[] }>('./matrix/*.routes.ts', { eager: true })
const PROJECT_ROUTES: RouteCase[] = Object.keys(modules).sort().flatMap(k => modules[k]!.ROUTES)
// Account and site-admin routes (optional `SITE_ROUTES` of the same files).
const siteModules = import.meta.glob<{ SITE_ROUTES?: SiteRouteCase[] }>('./matrix/*.routes.ts', { eager: true })
const SITE_ROUTES: SiteRouteCase[] = Object.keys(siteModules).sort().flatMap(k => siteModules[k]!.SITE_ROUTES ?? [])

/** Site-wide routes: the site admin may, a project member may not (403), anonymous 401. */
const SITE_WIDE_CASES: { method: 'GET' | 'POST', path: string, body?: () => unknown, admin: number }[] = [
  { method: 'GET', path: '/api/users', admin: 200 },
  { method: 'POST', path: '/api/users', body: () => ({ email: uniqueEmail('matrix'), displayName: 'Matrix', password: 'correct-horse-battery-9' }), admin: 201 },
  { method: 'POST', path: '/api/projects', body: () => ({ jobNumber: `MXP-${Math.random().toString(36).slice(2, 8)}`, name: 'Matrix project' }), admin: 201 },
  { method: 'GET', path: '/api/admin/users', admin: 200 },
  { method: 'POST', path: '/api/admin/users', body: () => ({ email: uniqueEmail('matrix-site-invite') }), admin: 201 },
  { method: 'GET', path: '/api/admin/invitations', admin: 200 },
]
/** Routes any signed-in user may read. */
const SIGNED_IN_READS = ['/api/projects', '/api/auth/me', '/api/account/tokens']

const API_DIR = resolve(import.meta.dirname, '../../server/api')
const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const

/** Every route file under a folder of server/api as `METHOD /api/path/:param` (Nitro's file-name rules: `index` is the folder itself, `[x]` a parameter). */
function routeFiles(dir: string): { file: string, route: string }[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = join(dir, entry.name)
    if (entry.isDirectory()) return routeFiles(full)
    const m = /^(.+)\.(get|post|put|patch|delete)\.ts$/.exec(entry.name)
    if (!m) return []
    const segments = relative(API_DIR, dir).split(/[\\/]/).filter(Boolean)
    if (m[1] !== 'index') segments.push(m[1]!)
    const path = `/api/${segments.map(s => s.replace(/^\[(.+)\]$/, ':$1')).join('/')}`
    return [{ file: relative(resolve(API_DIR, '../..'), full), route: `${m[2]!.toUpperCase()} ${path}` }]
  })
}

/** Parameter names may differ between a file and its matrix entry: compare with every `:name` as `:`. */
const shape = (route: string) => route.replace(/:[^/]+/g, ':')

function expected(route: RouteCase, caller: Caller): number {
  if (caller === 'anonymous') return 401
  if (caller === 'nonMember') return 404
  return route.allowed.includes(caller) ? route.ok : 403
}

describe('authorization matrix', () => {
  const ctx = {} as Ctx

  beforeAll(async () => {
    ctx.owner = await signIn(demoEmail('owner'))
    const p = await ctx.owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `MX-${Date.now().toString(36)}`, name: 'Authorization matrix' })
    ctx.projectId = p.body.project.id
    const me = await ctx.owner.get<{ user: { id: string } }>('/api/auth/me')
    ctx.clients = { owner: ctx.owner, anonymous: new Client() } as Record<Caller, Client>
    ctx.ids = { owner: me.body.user.id } as Record<Caller, string>
    for (const caller of CALLERS) {
      if (caller === 'owner' || caller === 'anonymous') continue
      const u = await createUser(ctx.owner, caller)
      ctx.clients[caller] = u.client
      ctx.ids[caller] = u.id
      if (caller !== 'nonMember') {
        const r = await ctx.owner.post(`/api/projects/${ctx.projectId}/members`, { email: u.email, role: caller })
        expect(r.status).toBe(201)
      }
    }
  })

  for (const route of PROJECT_ROUTES) {
    for (const caller of CALLERS) {
      const want = expected(route, caller)
      it(`${route.method} ${route.path} as ${caller} → ${want}`, async () => {
        const prepared = route.prepare ? await route.prepare(ctx) : {}
        const path = prepared.path ?? route.path.replace(':projectId', ctx.projectId)
        const body = prepared.body ?? (route.method === 'GET' || route.method === 'DELETE' ? undefined : {})
        if (route.stream) {
          const s = await openEventStream(ctx.clients[caller].base + path, ctx.clients[caller].cookie ? { cookie: ctx.clients[caller].cookie } : {})
          s.close()
          expect(s.status).toBe(want)
          return
        }
        const r = await ctx.clients[caller].request(route.method, path, body)
        expect(r.status, JSON.stringify(r.body)).toBe(want)
      })
    }
  }

  it('answers 404 (not 403) for a project id that does not exist, even to its would-be owner', async () => {
    expect((await ctx.owner.get('/api/projects/00000000-0000-4000-8000-000000000000')).status).toBe(404)
    expect((await ctx.owner.get('/api/projects/not-a-uuid')).status).toBe(404)
  })

  describe('site-wide routes', () => {
    for (const c of SITE_WIDE_CASES) {
      it(`${c.method} ${c.path}: site admin ${c.admin}, member 403, anonymous 401`, async () => {
        expect((await ctx.owner.request(c.method, c.path, c.body?.())).status).toBe(c.admin)
        expect((await ctx.clients.engineer.request(c.method, c.path, c.body?.())).status).toBe(403)
        expect((await ctx.clients.anonymous.request(c.method, c.path, c.body?.())).status).toBe(401)
      })
    }
    for (const route of SITE_ROUTES) {
      const callers: Caller[] = route.who === 'account' ? ['owner', 'viewer', 'nonMember', 'anonymous'] : ['owner', 'engineer', 'nonMember', 'anonymous']
      for (const caller of callers) {
        // The demo owner is the site admin; everyone else here is not.
        const want = caller === 'anonymous' ? 401 : route.who === 'account' || caller === 'owner' ? route.ok : 403
        it(`${route.method} ${route.path} as ${caller} → ${want}`, async () => {
          const client = ctx.clients[caller]
          const prepared = route.prepare ? await route.prepare(ctx, client) : {}
          const body = prepared.body ?? (route.method === 'GET' || route.method === 'DELETE' ? undefined : {})
          const r = await client.request(route.method, prepared.path ?? route.path, body)
          expect(r.status, JSON.stringify(r.body)).toBe(want)
        })
      }
    }
    for (const path of SIGNED_IN_READS) {
      it(`GET ${path}: any signed-in user 200, anonymous 401`, async () => {
        expect((await ctx.clients.viewer.get(path)).status).toBe(200)
        expect((await ctx.clients.anonymous.get(path)).status).toBe(401)
      })
    }
  })
})

describe('authorization matrix coverage', () => {
  const files = routeFiles(join(API_DIR, 'projects'))
  const listed = new Set([
    ...PROJECT_ROUTES.map(r => shape(`${r.method} ${r.path}`)),
    ...SITE_WIDE_CASES.map(c => shape(`${c.method} ${c.path}`)),
    ...SIGNED_IN_READS.map(p => shape(`GET ${p}`)),
  ])

  it('reads the route files under server/api/projects/ (the walk itself finds the routes it should)', () => {
    const routes = files.map(f => f.route)
    expect(routes).toContain('POST /api/projects')
    expect(routes).toContain('GET /api/projects/:projectId')
    expect(routes).toContain('PUT /api/projects/:projectId/points/:pointId/samples/:sampleId/index-test')
    expect(routes).toContain('DELETE /api/projects/:projectId/models/:modelId/versions/:version')
    expect(routes).toContain('POST /api/projects/:projectId/imports/:importId/commit-ags')
    expect(new Set(files.map(f => f.route.split(' ')[0]))).toEqual(new Set(METHODS.map(m => m.toUpperCase())))
  })

  it('has an entry for every route file under server/api/projects/', () => {
    const missing = files.filter(f => !listed.has(shape(f.route))).map(f => `${f.route}  (${f.file})`)
    expect(missing, 'add these routes to tests/api/matrix/*.routes.ts with the roles allowed').toEqual([])
  })

  it('lists no route that has no file (a renamed or removed route leaves no stale entry)', () => {
    const known = new Set(files.map(f => shape(f.route)))
    const stale = PROJECT_ROUTES.filter(r => r.path.startsWith('/api/') && !known.has(shape(`${r.method} ${r.path}`))).map(r => `${r.method} ${r.path}`)
    expect(stale).toEqual([])
  })
})
