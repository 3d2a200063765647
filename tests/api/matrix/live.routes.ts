import { ALL, type RouteCase } from './types'

/** Live updates: the project's event stream. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/events', allowed: ALL, ok: 200, stream: true },
]
