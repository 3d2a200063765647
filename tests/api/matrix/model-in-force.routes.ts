import { ALL, MODEL_WRITERS, next, ok, type RouteCase } from './types'

/** The model in force and the project's design model. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/model-in-force', allowed: ALL, ok: 200 },
  // Naming the design model is a model write (owner or engineer); the project's other details stay the owner's.
  {
    method: 'PATCH', path: '/api/projects/:projectId', allowed: MODEL_WRITERS, ok: 200,
    prepare: async (ctx) => {
      const m = await ok(ctx.owner.post<{ model: { id: string } }>(`/api/projects/${ctx.projectId}/models`, { name: `Design-${next()}` }))
      return { body: { designModelId: m.model.id } }
    },
  },
]
