import { ALL, freshPoint, MODEL_WRITERS, next, ok, REVIEWERS, type Ctx, type RouteCase } from './types'

const REPLIERS = ['owner', 'engineer', 'geologist', 'reviewer'] as const

async function freshModel(ctx: Ctx, withVersion = false) {
  const b = await ok(ctx.owner.post<{ model: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/models`, { name: `M-${next()}` }))
  const url = `/api/projects/${ctx.projectId}/models/${b.model.id}`
  if (withVersion) await ok(ctx.owner.post(`${url}/versions`, { message: 'first save', version: b.model.version }))
  const fresh = await ok(ctx.owner.get<{ model: { version: number, draft: unknown } }>(url), 200)
  return { url, version: fresh.model.version, draft: fresh.model.draft }
}

async function freshFlag(ctx: Ctx) {
  const p = await freshPoint(ctx)
  await ok(ctx.owner.request('PUT', `${p.url}/intervals`, { intervals: [{ top: 0, bottom: 2 }] }), 200)
  const d = await ok(ctx.owner.get<{ intervals: { id: string }[] }>(p.url), 200)
  const f = await ok(ctx.owner.post<{ flag: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/flags`, { targetType: 'log-interval', targetId: d.intervals[0]!.id, verdict: 'questionable', comment: 'matrix flag' }))
  return { url: `/api/projects/${ctx.projectId}/flags/${f.flag.id}`, version: f.flag.version, targetId: d.intervals[0]!.id }
}

/** Site models, their versions and exports; reviewer flags. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/models', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/models', allowed: MODEL_WRITERS, ok: 201, prepare: async () => ({ body: { name: `New-${next()}` } }) },
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await freshModel(ctx)).url }) },
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/drawing', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshModel(ctx)).url}/drawing` }) },
  { method: 'PUT', path: '/api/projects/:projectId/models/:modelId/draft', allowed: MODEL_WRITERS, ok: 200, prepare: async (ctx) => { const m = await freshModel(ctx); return { path: `${m.url}/draft`, body: { draft: m.draft, version: m.version } } } },
  { method: 'POST', path: '/api/projects/:projectId/models/:modelId/versions', allowed: MODEL_WRITERS, ok: 201, prepare: async (ctx) => { const m = await freshModel(ctx); return { path: `${m.url}/versions`, body: { message: 'saved', version: m.version } } } },
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/versions/:version', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1` }) },
  { method: 'PATCH', path: '/api/projects/:projectId/models/:modelId/versions/:version', allowed: MODEL_WRITERS, ok: 409, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1`, body: { message: 'edit' } }) },
  { method: 'PUT', path: '/api/projects/:projectId/models/:modelId/versions/:version', allowed: MODEL_WRITERS, ok: 409, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1`, body: { message: 'edit' } }) },
  { method: 'DELETE', path: '/api/projects/:projectId/models/:modelId/versions/:version', allowed: MODEL_WRITERS, ok: 409, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1` }) },
  { method: 'POST', path: '/api/projects/:projectId/models/:modelId/versions/:version/checkout', allowed: MODEL_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1/checkout` }) },
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/versions/:version/export', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/versions/1/export` }) },
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/compare', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshModel(ctx, true)).url}/compare?a=1&b=1` }) },
  { method: 'GET', path: '/api/projects/:projectId/flags', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/flags', allowed: REVIEWERS, ok: 201, prepare: async (ctx) => { const f = await freshFlag(ctx); return { body: { targetType: 'log-interval', targetId: f.targetId, verdict: 'accepted', comment: 'fine' } } } },
  { method: 'GET', path: '/api/projects/:projectId/flags/:flagId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await freshFlag(ctx)).url }) },
  { method: 'PATCH', path: '/api/projects/:projectId/flags/:flagId', allowed: REVIEWERS, ok: 200, prepare: async (ctx) => { const f = await freshFlag(ctx); return { path: f.url, body: { status: 'resolved', version: f.version } } } },
  { method: 'POST', path: '/api/projects/:projectId/flags/:flagId/replies', allowed: REPLIERS, ok: 201, prepare: async ctx => ({ path: `${(await freshFlag(ctx)).url}/replies`, body: { body: 'reply' } }) },
]
