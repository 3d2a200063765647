import { createUser } from '../../helpers/http'
import { createRunModel, smallRunBody } from '../../helpers/settlement-run'
import { ALL, ok, SETTLEMENT_RUNNERS, type Ctx, type RouteCase } from './types'

/** One model and one small finished run per matrix project, made by a designer who is not one of the callers. */
const fixtures = new WeakMap<Ctx, Promise<{ model: { modelId: string, version: number }, runUrl: string }>>()
function fixture(ctx: Ctx) {
  let f = fixtures.get(ctx)
  if (!f) {
    f = (async () => {
      const model = await createRunModel(ctx.owner, ctx.projectId, undefined, 'Matrix run model')
      const runner = await createUser(ctx.owner, 'runner')
      await ok(ctx.owner.post(`/api/projects/${ctx.projectId}/members`, { email: runner.email, role: 'designer' }))
      const r = await ok(runner.client.post<{ run: { id: string } }>(`/api/projects/${ctx.projectId}/settlement-runs`, smallRunBody(model)))
      return { model, runUrl: `/api/projects/${ctx.projectId}/settlement-runs/${r.run.id}` }
    })()
    fixtures.set(ctx, f)
  }
  return f
}

/** Settlement runs: reads for every member; runs by the settlement runners; a delete only by the run's creator (403 for everyone else, even a runner); a cancel of a finished run is 409. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/settlement-runs', allowed: SETTLEMENT_RUNNERS, ok: 201, prepare: async ctx => ({ body: smallRunBody((await fixture(ctx)).model) }) },
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs/:runId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await fixture(ctx)).runUrl }) },
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs/:runId/points/:index', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await fixture(ctx)).runUrl}/points/0` }) },
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs/:runId/export', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await fixture(ctx)).runUrl}/export?format=json` }) },
  { method: 'GET', path: '/api/projects/:projectId/settlement-runs/scatter', allowed: ALL, ok: 200, prepare: async (ctx) => {
    const { model } = await fixture(ctx)
    return { path: `/api/projects/${ctx.projectId}/settlement-runs/scatter?modelId=${model.modelId}&version=${model.version}` }
  } },
  // The fixture's run has finished: 409 for every runner (the state is checked before who may cancel).
  { method: 'POST', path: '/api/projects/:projectId/settlement-runs/:runId/cancel', allowed: SETTLEMENT_RUNNERS, ok: 409, prepare: async ctx => ({ path: `${(await fixture(ctx)).runUrl}/cancel`, body: {} }) },
  { method: 'DELETE', path: '/api/projects/:projectId/settlement-runs/:runId', allowed: SETTLEMENT_RUNNERS, ok: 403, prepare: async ctx => ({ path: (await fixture(ctx)).runUrl }) },
]
