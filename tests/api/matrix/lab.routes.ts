import { testBody } from '../../helpers/lab'
import { upload } from '../../helpers/upload'
import { ALL, freshPoint, freshSample, LOG_WRITERS, MODEL_WRITERS, next, ok, type Ctx, type RouteCase } from './types'

const CPT_BODY = { areaRatio: 0.8, depth: [1.02, 1.04, 1.06], qc: [300, 310, 320], fs: [5, 5, 6], u2: [1, 2, 3] }

/** A fresh oedometer test (owner) on a fresh sample of the matrix project. */
async function freshTest(ctx: Ctx): Promise<{ id: string, version: number, url: string }> {
  const s = await freshSample(ctx)
  const b = await ok(ctx.owner.post<{ test: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/tests/oedometer`, testBody(s.id)))
  return { ...b.test, url: `/api/projects/${ctx.projectId}/tests/oedometer/${b.test.id}` }
}

/** A fresh upload (owner) of a small file, for the import commit of test data. */
async function freshDataUpload(ctx: Ctx, csv: string): Promise<string> {
  const r = await upload<{ importId: string }>(ctx.owner, `/api/projects/${ctx.projectId}/imports`, 'test-data.csv', csv)
  if (r.status !== 201) throw new Error(`fixture upload failed: ${r.status}`)
  return `/api/projects/${ctx.projectId}/imports/${r.body.importId}/commit`
}

/** Oedometer tests, σ'p adoptions, the σ'p points list and the CPT interpretation. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/tests/oedometer', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/tests/oedometer', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ body: testBody((await freshSample(ctx)).id) }) },
  { method: 'GET', path: '/api/projects/:projectId/tests/oedometer/:testId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await freshTest(ctx)).url }) },
  { method: 'PATCH', path: '/api/projects/:projectId/tests/oedometer/:testId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const t = await freshTest(ctx); return { path: t.url, body: { label: 'Renamed', version: t.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/tests/oedometer/:testId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshTest(ctx)).url }) },
  { method: 'GET', path: '/api/projects/:projectId/tests/oedometer/:testId/interpretation', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshTest(ctx)).url}/interpretation` }) },
  { method: 'GET', path: '/api/projects/:projectId/tests/oedometer/:testId/adoptions', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshTest(ctx)).url}/adoptions` }) },
  {
    method: 'POST', path: '/api/projects/:projectId/tests/oedometer/:testId/adoptions', allowed: MODEL_WRITERS, ok: 201,
    prepare: async ctx => ({ path: `${(await freshTest(ctx)).url}/adoptions`, body: { method: 'typed', value: 80, reason: 'matrix check' } }),
  },
  { method: 'GET', path: '/api/projects/:projectId/preconsolidation-points', allowed: ALL, ok: 200 },
  {
    method: 'POST', path: '/api/projects/:projectId/preconsolidation-points/evaluate', allowed: ALL, ok: 200,
    prepare: async (ctx) => {
      const m = await ok(ctx.owner.post<{ model: { id: string } }>(`/api/projects/${ctx.projectId}/models`, { name: `evaluate ${next()}` }))
      const got = await ok(ctx.owner.get<{ model: { draft: unknown } }>(`/api/projects/${ctx.projectId}/models/${m.model.id}`), 200)
      return { body: { definition: got.model.draft } }
    },
  },
  {
    method: 'GET', path: '/api/projects/:projectId/points/:pointId/cpt/interpretation', allowed: ALL, ok: 200,
    prepare: async (ctx) => { const p = await freshPoint(ctx, 'cpt'); await ok(ctx.owner.request('PUT', `${p.url}/cpt`, CPT_BODY), 200); return { path: `${p.url}/cpt/interpretation` } },
  },
  // The import commit for test data (oedometer stages, vane readings): log writers who may also enter tests.
  {
    method: 'POST', path: '/api/projects/:projectId/imports/:importId/commit', allowed: LOG_WRITERS, ok: 200,
    prepare: async (ctx) => {
      const t = await freshTest(ctx)
      return { path: await freshDataUpload(ctx, 'stress,e\n10,2.05\n20,2.0\n'), body: { target: 'oedometer-stages', mapping: { stress: 'stress', voidRatio: 'e' }, testId: t.id, testVersion: t.version, dryRun: true } }
    },
  },
  {
    method: 'POST', path: '/api/projects/:projectId/imports/:importId/commit', allowed: LOG_WRITERS, ok: 200,
    prepare: async (ctx) => {
      const p = await ok(ctx.owner.get<{ point: { identifier: string } }>((await freshPoint(ctx)).url), 200)
      return { path: await freshDataUpload(ctx, `point,depth,su\n${p.point.identifier},4,20\n`), body: { target: 'vane', mapping: { point: 'point', depth: 'depth', peak: 'su' }, dryRun: true } }
    },
  },
]
