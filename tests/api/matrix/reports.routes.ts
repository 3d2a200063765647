import { ALL, freshPoint, type RouteCase } from './types'

/** Reports: every member who can see the record can download its PDF preview. */
export const ROUTES: RouteCase[] = [
  // Point log (the stress-history log and the data its sheet page draws)
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId/report.pdf', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/report.pdf?scale=200` }) },
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId/stress-log', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/stress-log` }) },
]
