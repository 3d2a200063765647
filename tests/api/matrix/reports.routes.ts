import { waitForReport } from '../../helpers/reports'
import { createRunModel, smallRunBody } from '../../helpers/settlement-run'
import { ALL, freshPoint, next, ok, SETTLEMENT_RUNNERS, type Ctx, type RouteCase } from './types'

// Reports. Each report kind keeps its own block below.

// --- site-model version report ---------------------------------------------------
async function savedModelVersion(ctx: Ctx): Promise<string> {
  const b = await ok(ctx.owner.post<{ model: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/models`, { name: `R-${next()}` }))
  const url = `/api/projects/${ctx.projectId}/models/${b.model.id}`
  await ok(ctx.owner.post(`${url}/versions`, { message: 'report save', version: b.model.version }))
  return `${url}/versions/1`
}

// ── Settlement-run report and issued reports ──
/** One finished small run and one issued report of it per matrix project, made by the owner. */
const fixtures = new WeakMap<Ctx, Promise<{ runId: string, reportId: string }>>()
function fixture(ctx: Ctx) {
  let f = fixtures.get(ctx)
  if (!f) {
    f = (async () => {
      const model = await createRunModel(ctx.owner, ctx.projectId, undefined, 'Matrix report model')
      const r = await ok(ctx.owner.post<{ run: { id: string } }>(`/api/projects/${ctx.projectId}/settlement-runs`, smallRunBody(model, { name: 'Matrix report run' })))
      // A settlement-run report is made on the job queue (202): its PDF route answers once it is stored.
      const issued = await ok(ctx.owner.post<{ report: { id: string } }>(`/api/projects/${ctx.projectId}/reports`, { kind: 'settlement-run', runId: r.run.id }), 202)
      await waitForReport(ctx.owner, ctx.projectId, issued.report.id)
      return { runId: r.run.id, reportId: issued.report.id }
    })()
    fixtures.set(ctx, f)
  }
  return f
}

/** Report PDFs: every member who can see the record can download its report; owner, engineer and designer issue. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/versions/:version/report.pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${await savedModelVersion(ctx)}/report.pdf` }) },
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs/:runId/report.pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/settlement-runs/${(await fixture(ctx)).runId}/report.pdf` }) },
  { method: 'GET', path: '/api/projects/:projectId/reports', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/reports', allowed: SETTLEMENT_RUNNERS, ok: 202, prepare: async ctx => ({ body: { kind: 'settlement-run', runId: (await fixture(ctx)).runId } }) },
  { method: 'GET', path: '/api/projects/:projectId/reports/:reportId/pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/reports/${(await fixture(ctx)).reportId}/pdf` }) },
  // Point log (the stress-history log and the data its sheet page draws)
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId/report.pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/report.pdf?scale=200` }) },
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId/stress-log', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/stress-log` }) },
]
