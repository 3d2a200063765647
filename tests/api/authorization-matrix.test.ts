// Every project route × every role × a non-member × anonymous → expected status.
// Later features add their routes to PROJECT_ROUTES.
import { beforeAll, describe, expect, it } from 'vitest'
import { PROJECT_ROLES, type ProjectRole } from '../../shared/auth/roles'
import { Client, createUser, demoEmail, signIn, uniqueEmail } from '../helpers/http'
import { upload } from '../helpers/upload'

type Caller = ProjectRole | 'nonMember' | 'anonymous'
const CALLERS: Caller[] = [...PROJECT_ROLES, 'nonMember', 'anonymous']

interface Ctx {
  projectId: string
  owner: Client
  clients: Record<Caller, Client>
  ids: Record<Caller, string>
}

interface RouteCase {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  path: string
  /** Roles allowed; everyone else in the project gets 403, a non-member 404, anonymous 401. */
  allowed: readonly ProjectRole[]
  /** Status an allowed caller gets. */
  ok: number
  /** Builds the concrete path and body for one call (fresh targets for writes). */
  prepare?: (ctx: Ctx) => Promise<{ path?: string, body?: unknown }>
}

const ALL = PROJECT_ROLES

async function freshMember(ctx: Ctx): Promise<string> {
  const { email, id } = await createUser(ctx.owner, 'target')
  const r = await ctx.owner.post(`/api/projects/${ctx.projectId}/members`, { email, role: 'viewer' })
  if (r.status !== 201) throw new Error(`could not add target member: ${r.status}`)
  return id
}

let seq = 0
const next = () => `${Date.now().toString(36)}${++seq}`

async function ok<T>(p: Promise<{ status: number, body: T }>, want = 201): Promise<T> {
  const r = await p
  if (r.status !== want) throw new Error(`fixture failed: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body
}

/** A fresh point owned by the matrix project (created by the owner). */
async function freshPoint(ctx: Ctx, kind = 'borehole'): Promise<{ id: string, version: number, url: string }> {
  const b = await ok(ctx.owner.post<{ point: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/points`, { identifier: `P-${next()}`, kind, easting: 1, northing: 2, groundElevation: 3, finalDepth: 20 }))
  return { ...b.point, url: `/api/projects/${ctx.projectId}/points/${b.point.id}` }
}

async function freshSample(ctx: Ctx) {
  const p = await freshPoint(ctx)
  const b = await ok(ctx.owner.post<{ sample: { id: string, version: number } }>(`${p.url}/samples`, { identifier: 'U1', top: 2, bottom: 2.45, type: 'thin-walled-tube' }))
  return { ...b.sample, url: `${p.url}/samples/${b.sample.id}` }
}

async function freshRow(ctx: Ctx, kind: 'spt' | 'groundwater' | 'vane') {
  const p = await freshPoint(ctx)
  const body = kind === 'spt' ? { depth: 5, blows: [1, 2, 3] } : kind === 'vane' ? { depth: 5, peak: 20 } : { kind: 'standing', observedAt: '2025-04-01T09:00:00Z', depth: 1.6 }
  const b = await ok(ctx.owner.post<{ row: { id: string, version: number } }>(`${p.url}/${kind}`, body))
  return { ...b.row, url: `${p.url}/${kind}/${b.row.id}` }
}

async function freshStratum(ctx: Ctx) {
  const b = await ok(ctx.owner.post<{ stratum: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/strata`, { code: `S${next()}`.slice(0, 16), name: 'Stratum', colour: 'c', pattern: 'p', unitWeight: 18, unitWeightSaturated: 19 }))
  return { ...b.stratum, url: `/api/projects/${ctx.projectId}/strata/${b.stratum.id}` }
}

const LOG_WRITERS = ['owner', 'engineer', 'geologist'] as const

async function freshUpload(ctx: Ctx): Promise<string> {
  const r = await upload<{ importId: string }>(ctx.owner, `/api/projects/${ctx.projectId}/imports`, 'points.csv', 'Point,Kind,Easting,Northing,Ground level,Final depth\nMX-1,borehole,1,2,3,10\n')
  if (r.status !== 201) throw new Error(`fixture upload failed: ${r.status}`)
  return `/api/projects/${ctx.projectId}/imports/${r.body.importId}`
}
const CPT_BODY = { areaRatio: 0.8, depth: [0.02, 0.04], qc: [300, 310], fs: [5, 5], u2: [1, 2] }

export const PROJECT_ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId', allowed: ALL, ok: 200 },
  { method: 'PATCH', path: '/api/projects/:projectId', allowed: ['owner'], ok: 200, prepare: async () => ({ body: { description: 'Matrix test description' } }) },
  { method: 'GET', path: '/api/projects/:projectId/members', allowed: ALL, ok: 200 },
  { method: 'GET', path: '/api/projects/:projectId/audit', allowed: ALL, ok: 200 },
  {
    method: 'POST', path: '/api/projects/:projectId/members', allowed: ['owner'], ok: 201,
    prepare: async (ctx) => {
      const email = uniqueEmail('invitee')
      const r = await ctx.owner.post('/api/users', { email, displayName: 'Invitee', password: 'correct-horse-battery-9' })
      if (r.status !== 201) throw new Error('could not create invitee')
      return { body: { email, role: 'viewer' } }
    },
  },
  {
    method: 'PATCH', path: '/api/projects/:projectId/members/:userId', allowed: ['owner'], ok: 200,
    prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/members/${await freshMember(ctx)}`, body: { role: 'designer' } }),
  },
  {
    method: 'DELETE', path: '/api/projects/:projectId/members/:userId', allowed: ['owner'], ok: 200,
    prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/members/${await freshMember(ctx)}` }),
  },
  // Investigation points and their logs
  { method: 'GET', path: '/api/projects/:projectId/points', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/points', allowed: LOG_WRITERS, ok: 201, prepare: async () => ({ body: { identifier: `BH-${next()}`, kind: 'borehole', easting: 0, northing: 0, groundElevation: 1, finalDepth: 10 } }) },
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await freshPoint(ctx)).url }) },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const p = await freshPoint(ctx); return { path: p.url, body: { remarks: 'checked', version: p.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshPoint(ctx)).url }) },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/intervals', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/intervals`, body: { intervals: [{ top: 0, bottom: 1 }] } }) },
  { method: 'POST', path: '/api/projects/:projectId/points/:pointId/samples', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/samples`, body: { identifier: 'U2', top: 1, bottom: 1.45, type: 'piston' } }) },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const s = await freshSample(ctx); return { path: s.url, body: { recovery: 90, version: s.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshSample(ctx)).url }) },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId/index-test', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshSample(ctx)).url}/index-test`, body: { liquidLimit: 60, plasticLimit: 25 } }) },
  ...(['spt', 'groundwater', 'vane'] as const).flatMap((kind): RouteCase[] => [
    {
      method: 'POST', path: `/api/projects/:projectId/points/:pointId/${kind}`, allowed: LOG_WRITERS, ok: 201,
      prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/${kind}`, body: kind === 'spt' ? { depth: 3, blows: [2, 3, 4] } : kind === 'vane' ? { depth: 3, peak: 18 } : { kind: 'strike', observedAt: '2025-03-03T10:00:00Z', depth: 1.6 } }),
    },
    { method: 'DELETE', path: `/api/projects/:projectId/points/:pointId/${kind}/:rowId`, allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshRow(ctx, kind)).url }) },
  ]),
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/spt/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const r = await freshRow(ctx, 'spt'); return { path: r.url, body: { depth: 5, blows: [2, 2, 2], version: r.version } } } },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/groundwater/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const r = await freshRow(ctx, 'groundwater'); return { path: r.url, body: { kind: 'standing', observedAt: '2025-04-02T09:00:00Z', depth: 1.7, version: r.version } } } },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/cpt', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx, 'cpt')).url}/cpt`, body: CPT_BODY }) },
  {
    method: 'GET', path: '/api/projects/:projectId/points/:pointId/cpt', allowed: ALL, ok: 200,
    prepare: async (ctx) => { const p = await freshPoint(ctx, 'cpt'); await ok(ctx.owner.request('PUT', `${p.url}/cpt`, CPT_BODY), 200); return { path: `${p.url}/cpt` } },
  },
  // Imports: a JSON body reaching an allowed caller is 400 (the route wants multipart), which shows the guard let it through.
  { method: 'POST', path: '/api/projects/:projectId/imports', allowed: LOG_WRITERS, ok: 400 },
  { method: 'GET', path: '/api/projects/:projectId/imports/:importId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await freshUpload(ctx)}?target=points` }) },
  { method: 'POST', path: '/api/projects/:projectId/imports/:importId/commit', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await freshUpload(ctx)}/commit`, body: { target: 'points', mapping: { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth' }, dryRun: true } }) },
  // Exports
  { method: 'GET', path: '/exports/:projectId/logs.xlsx', allowed: ALL, ok: 200 },
  // Strata
  { method: 'GET', path: '/api/projects/:projectId/strata', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/strata', allowed: LOG_WRITERS, ok: 201, prepare: async () => ({ body: { code: `N${next()}`.slice(0, 16), name: 'New', colour: 'c', pattern: 'p', unitWeight: 17, unitWeightSaturated: 18 } }) },
  { method: 'PATCH', path: '/api/projects/:projectId/strata/:stratumId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const s = await freshStratum(ctx); return { path: s.url, body: { name: 'Renamed', version: s.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/strata/:stratumId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshStratum(ctx)).url }) },
]

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
    const cases: { method: 'GET' | 'POST', path: string, body?: () => unknown, admin: number }[] = [
      { method: 'GET', path: '/api/users', admin: 200 },
      { method: 'POST', path: '/api/users', body: () => ({ email: uniqueEmail('matrix'), displayName: 'Matrix', password: 'correct-horse-battery-9' }), admin: 201 },
      { method: 'POST', path: '/api/projects', body: () => ({ jobNumber: `MXP-${Math.random().toString(36).slice(2, 8)}`, name: 'Matrix project' }), admin: 201 },
    ]
    for (const c of cases) {
      it(`${c.method} ${c.path}: site admin ${c.admin}, member 403, anonymous 401`, async () => {
        expect((await ctx.owner.request(c.method, c.path, c.body?.())).status).toBe(c.admin)
        expect((await ctx.clients.engineer.request(c.method, c.path, c.body?.())).status).toBe(403)
        expect((await ctx.clients.anonymous.request(c.method, c.path, c.body?.())).status).toBe(401)
      })
    }
    for (const path of ['/api/projects', '/api/auth/me', '/api/account/tokens']) {
      it(`GET ${path}: any signed-in user 200, anonymous 401`, async () => {
        expect((await ctx.clients.viewer.get(path)).status).toBe(200)
        expect((await ctx.clients.anonymous.get(path)).status).toBe(401)
      })
    }
  })
})
