import { ALL, next, ok, type Ctx, type RouteCase } from './types'

// --- site-model version report ---------------------------------------------------
async function savedModelVersion(ctx: Ctx): Promise<string> {
  const b = await ok(ctx.owner.post<{ model: { id: string, version: number } }>(`/api/projects/${ctx.projectId}/models`, { name: `R-${next()}` }))
  const url = `/api/projects/${ctx.projectId}/models/${b.model.id}`
  await ok(ctx.owner.post(`${url}/versions`, { message: 'report save', version: b.model.version }))
  return `${url}/versions/1`
}

/** Report PDFs: every member who can see the record can download its report. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/models/:modelId/versions/:version/report.pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${await savedModelVersion(ctx)}/report.pdf` }) },
]
