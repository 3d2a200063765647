import { and, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { Capability, ProjectRole } from '#shared/auth/roles'
import { roleCan } from '#shared/auth/roles'
import type { SessionUser } from '#shared/schemas/auth'
import { UuidSchema } from '#shared/schemas/common'
import { useDb } from '../db/client'
import { projectMembers, projects } from '../db/schema'

/** The signed-in caller (session or API token), or 401. */
export function requireUser(event: H3Event): SessionUser {
  const user = event.context.user
  if (!user) {
    const message = event.context.tokenRejected ? (event.context.tokenRejectedMessage ?? 'The API token is invalid or revoked.') : 'Sign in first.'
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message })
  }
  return user
}

/**
 * The caller signed in with a browser session (403 for an API token): managing tokens and
 * changing the password must not be possible with a token that leaked.
 */
export function requireSessionUser(event: H3Event, action: string): SessionUser {
  const user = requireUser(event)
  if (event.context.authVia !== 'session') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `${action} needs a signed-in browser session; an API token cannot do it.` })
  }
  return user
}

/** The caller, who must be a site admin (403 otherwise). */
export function requireSiteAdmin(event: H3Event): SessionUser {
  const user = requireUser(event)
  if (!user.isSiteAdmin) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Only a site admin may do this.' })
  return user
}

export type ProjectRow = typeof projects.$inferSelect

/**
 * The caller's membership of the project in the route, checked against a
 * capability: `{ user, project, role }`. A project the caller is not a member of
 * (or that does not exist) is 404, so ids cannot be probed; a member without the
 * capability is 403.
 */
export async function requireProjectRole(event: H3Event, capability: Capability): Promise<{ user: SessionUser, project: ProjectRow, role: ProjectRole }> {
  const user = requireUser(event)
  const parsed = UuidSchema.safeParse(getRouterParam(event, 'projectId'))
  if (!parsed.success) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Project not found.' })
  const [row] = await useDb()
    .select({ project: projects, role: projectMembers.role })
    .from(projects)
    .innerJoin(projectMembers, and(eq(projectMembers.projectId, projects.id), eq(projectMembers.userId, user.id)))
    .where(eq(projects.id, parsed.data))
    .limit(1)
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Project not found.' })
  if (!roleCan(row.role, capability)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `Your role (${row.role}) cannot do this.` })
  }
  return { user, project: row.project, role: row.role }
}

/**
 * A member's role checked against capabilities decided by the request itself (a PATCH whose fields
 * need different capabilities): 403 with the same words as `requireProjectRole` when one is missing.
 */
export function requireRoleCan(role: ProjectRole, capabilities: Iterable<Capability>): void {
  for (const capability of capabilities) {
    if (!roleCan(role, capability)) {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `Your role (${role}) cannot do this.` })
    }
  }
}
