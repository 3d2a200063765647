// Shared types and fixtures of the authorization matrix (tests/api/authorization-matrix.test.ts).
// Each domain lists its routes in its own `*.routes.ts` file beside this one.
import { investigationToAgs } from '../../../shared/ags4/investigation'
import { PROJECT_ROLES, type ProjectRole } from '../../../shared/auth/roles'
import { type Client, createUser } from '../../helpers/http'
import { upload } from '../../helpers/upload'

export type Caller = ProjectRole | 'nonMember' | 'anonymous'
export const CALLERS: Caller[] = [...PROJECT_ROLES, 'nonMember', 'anonymous']

export interface Ctx {
  projectId: string
  owner: Client
  clients: Record<Caller, Client>
  ids: Record<Caller, string>
}

export interface RouteCase {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  path: string
  /** Roles allowed; everyone else in the project gets 403, a non-member 404, anonymous 401. */
  allowed: readonly ProjectRole[]
  /** Status an allowed caller gets. */
  ok: number
  /** A Server-Sent Events stream: an allowed caller's answer is read up to its status, then closed. */
  stream?: boolean
  /** Builds the concrete path and body for one call (fresh targets for writes). */
  prepare?: (ctx: Ctx) => Promise<{ path?: string, body?: unknown }>
}

export const ALL = PROJECT_ROLES
export const LOG_WRITERS = ['owner', 'engineer', 'geologist'] as const
export const MODEL_WRITERS = ['owner', 'engineer'] as const
export const REVIEWERS = ['owner', 'reviewer'] as const
export const SETTLEMENT_RUNNERS = ['owner', 'engineer', 'designer'] as const

let seq = 0
export const next = () => `${Date.now().toString(36)}${++seq}`

export async function ok<T>(p: Promise<{ status: number, body: T }>, want = 201): Promise<T> {
  const r = await p
  if (r.status !== want) throw new Error(`fixture failed: ${r.status} ${JSON.stringify(r.body)}`)
  return r.body
}

export async function freshMember(ctx: Ctx): Promise<string> {
  const { email, id } = await createUser(ctx.owner, 'target')
  const r = await ctx.owner.post(`/api/projects/${ctx.projectId}/members`, { email, role: 'viewer' })
  if (r.status !== 201) throw new Error(`could not add target member: ${r.status}`)
  return id
}

/** A fresh point owned by the matrix project (created by the owner). */
export async function freshPoint(ctx: Ctx, kind = 'borehole'): Promise<{ id: string, version: number, url: string }> {
  const b = await ok(ctx.owner.post<{ point: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/points`, { identifier: `P-${next()}`, kind, easting: 1, northing: 2, groundElevation: 3, finalDepth: 20 }))
  return { ...b.point, url: `/api/projects/${ctx.projectId}/points/${b.point.id}` }
}

export async function freshSample(ctx: Ctx) {
  const p = await freshPoint(ctx)
  const b = await ok(ctx.owner.post<{ sample: { id: string, version: number } }>(`${p.url}/samples`, { identifier: 'U1', top: 2, bottom: 2.45, type: 'thin-walled-tube' }))
  return { ...b.sample, pointUrl: p.url, url: `${p.url}/samples/${b.sample.id}` }
}

export async function freshRow(ctx: Ctx, kind: 'spt' | 'groundwater' | 'vane') {
  const p = await freshPoint(ctx)
  const body = kind === 'spt' ? { depth: 5, blows: [1, 2, 3] } : kind === 'vane' ? { depth: 5, peak: 20 } : { kind: 'standing', observedAt: '2025-04-01T09:00:00Z', depth: 1.6 }
  const b = await ok(ctx.owner.post<{ row: { id: string, version: number } }>(`${p.url}/${kind}`, body))
  return { ...b.row, url: `${p.url}/${kind}/${b.row.id}` }
}

export async function freshStratum(ctx: Ctx) {
  const b = await ok(ctx.owner.post<{ stratum: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/strata`, { code: `S${next()}`.slice(0, 16), name: 'Stratum', colour: 'c', pattern: 'p', unitWeight: 18, unitWeightSaturated: 19 }))
  return { ...b.stratum, url: `/api/projects/${ctx.projectId}/strata/${b.stratum.id}` }
}

export async function freshUpload(ctx: Ctx): Promise<string> {
  const r = await upload<{ importId: string }>(ctx.owner, `/api/projects/${ctx.projectId}/imports`, 'points.csv', 'Point,Kind,Easting,Northing,Ground level,Final depth\nMX-1,borehole,1,2,3,10\n')
  if (r.status !== 201) throw new Error(`fixture upload failed: ${r.status}`)
  return `/api/projects/${ctx.projectId}/imports/${r.body.importId}`
}

/** A fresh upload (owner) of a one-borehole AGS4 file whose point is new to the matrix project; the import's URL. */
export async function freshAgsUpload(ctx: Ctx): Promise<string> {
  const text = investigationToAgs({
    project: { jobNumber: 'MX', name: 'Authorization matrix', client: '' },
    strata: [],
    points: [{ identifier: `AGS-${next()}`, kind: 'borehole', easting: 1, northing: 2, groundElevation: 3, finalDepth: 10, startedOn: null, endedOn: null, method: '', loggedBy: '', remarks: '', intervals: [], samples: [], spt: [], groundwater: [], cpt: null, vane: [] }],
  })
  const r = await upload<{ importId: string }>(ctx.owner, `/api/projects/${ctx.projectId}/imports`, 'matrix.ags', text, 'text/plain')
  if (r.status !== 201) throw new Error(`fixture AGS4 upload failed: ${r.status} ${JSON.stringify(r.body)}`)
  return `/api/projects/${ctx.projectId}/imports/${r.body.importId}`
}

/**
 * A route outside projects: `account` routes answer any signed-in person about themselves (`ok`), anonymous 401;
 * `site-admin` routes answer a site admin (`ok`), anyone else signed in 403, anonymous 401.
 */
export interface SiteRouteCase {
  method: RouteCase['method']
  path: string
  who: 'account' | 'site-admin'
  ok: number
  /** Builds the concrete path and body for one caller's call (the caller's own client is given). */
  prepare?: (ctx: Ctx, caller: Client) => Promise<{ path?: string, body?: unknown }>
}
