import { MODEL_WRITERS, next, ok, REVIEWERS, type Ctx, type RouteCase } from './types'

/** A model of the matrix project with version 1 saved by the engineer (so the owner, who also reviews, may decide on it). */
async function engineerVersion(ctx: Ctx) {
  const b = await ok(ctx.owner.post<{ model: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/models`, { name: `R-${next()}` }))
  const url = `/api/projects/${ctx.projectId}/models/${b.model.id}`
  await ok(ctx.clients.engineer.post(`${url}/versions`, { message: 'for review', version: b.model.version }))
  return `${url}/versions/1`
}

/** Version review: sending a saved version for review, and deciding on a submitted one. */
export const ROUTES: RouteCase[] = [
  { method: 'POST', path: '/api/projects/:projectId/models/:modelId/versions/:version/submit', allowed: MODEL_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await engineerVersion(ctx)}/submit`, body: { message: 'please review', reviewerIds: [ctx.ids.reviewer] } }) },
  {
    method: 'POST',
    path: '/api/projects/:projectId/models/:modelId/versions/:version/decision',
    allowed: REVIEWERS,
    ok: 200,
    prepare: async (ctx) => {
      const url = await engineerVersion(ctx)
      await ok(ctx.clients.engineer.post(`${url}/submit`, { message: 'please review', reviewerIds: [ctx.ids.reviewer] }), 200)
      return { path: `${url}/decision`, body: { decision: 'return', comment: 'needs another look' } }
    },
  },
]
