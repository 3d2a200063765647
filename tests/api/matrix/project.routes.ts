import { ALL, freshMember, type RouteCase } from './types'
import { uniqueEmail } from '../../helpers/http'

/** Project settings, members and the audit trail. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId', allowed: ALL, ok: 200 },
  { method: 'PATCH', path: '/api/projects/:projectId', allowed: ['owner'], ok: 200, prepare: async () => ({ body: { description: 'Matrix test description' } }) },
  // The units (settings page) are the owner's like the other details.
  { method: 'PATCH', path: '/api/projects/:projectId', allowed: ['owner'], ok: 200, prepare: async () => ({ body: { unitSystem: 'SI', usStressUnit: 'tsf' } }) },
  { method: 'GET', path: '/api/projects/:projectId/members', allowed: ALL, ok: 200 },
  { method: 'GET', path: '/api/projects/:projectId/audit', allowed: ALL, ok: 200 },
  { method: 'GET', path: '/api/projects/:projectId/site-reference', allowed: ALL, ok: 200 },
  {
    method: 'POST', path: '/api/projects/:projectId/members', allowed: ['owner'], ok: 201,
    prepare: async (ctx) => {
      const email = uniqueEmail('invitee')
      const r = await ctx.owner.post('/api/users', { email, displayName: 'Invitee', password: 'correct-horse-battery-9' })
      if (r.status !== 201) throw new Error('could not create invitee')
      return { body: { email, role: 'viewer' } }
    },
  },
  {
    method: 'PATCH', path: '/api/projects/:projectId/members/:userId', allowed: ['owner'], ok: 200,
    prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/members/${await freshMember(ctx)}`, body: { role: 'designer' } }),
  },
  {
    method: 'DELETE', path: '/api/projects/:projectId/members/:userId', allowed: ['owner'], ok: 200,
    prepare: async ctx => ({ path: `/api/projects/${ctx.projectId}/members/${await freshMember(ctx)}` }),
  },
]
