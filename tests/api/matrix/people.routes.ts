import { uniqueEmail } from '../../helpers/http'
import { ok, type RouteCase } from './types'

/** Invitations by e-mail from the team panel (owners only: they show addresses). */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/invitations', allowed: ['owner'], ok: 200 },
  {
    method: 'POST', path: '/api/projects/:projectId/invitations', allowed: ['owner'], ok: 201,
    prepare: async () => ({ body: { email: uniqueEmail('mx-invite'), role: 'viewer' } }),
  },
  {
    method: 'DELETE', path: '/api/projects/:projectId/invitations/:invitationId', allowed: ['owner'], ok: 200,
    prepare: async (ctx) => {
      const r = await ok(ctx.owner.post<{ invitation: { id: string } }>(`/api/projects/${ctx.projectId}/invitations`, { email: uniqueEmail('mx-withdraw'), role: 'viewer' }))
      return { path: `/api/projects/${ctx.projectId}/invitations/${r.invitation.id}` }
    },
  },
]
