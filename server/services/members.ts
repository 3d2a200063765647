import { and, count, eq, sql } from 'drizzle-orm'
import type { ProjectRole } from '#shared/auth/roles'
import { useDb } from '../db/client'
import { projectMembers, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { recordAudit } from './audit'
import { publishLiveEvent } from './live-events'
import { unprocessableError } from './http-errors'

/**
 * Changes a member's role, or removes the member when `role` is null. The last
 * owner can neither be removed nor demoted (409): a project always has an owner.
 * Runs in one transaction with the owner rows locked, so two owners demoting each
 * other at once cannot both succeed.
 */
export async function changeMemberRole(args: { actorId: string, projectId: string, userId: string, role: ProjectRole | null }) {
  const { actorId, projectId, userId, role } = args
  return useDb().transaction(async (tx) => {
    const [current] = await tx.select().from(projectMembers)
      .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)))
      .for('update')
    if (!current) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'That user is not a member of this project.' })
    if (current.role === 'owner' && role !== 'owner') {
      await tx.select({ userId: projectMembers.userId }).from(projectMembers)
        .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.role, 'owner')))
        .for('update')
      const [owners] = await tx.select({ n: count() }).from(projectMembers)
        .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.role, 'owner')))
      if ((owners?.n ?? 0) <= 1) {
        throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This is the project\'s last owner: make another member owner first.' })
      }
    }
    if (role === null) {
      await tx.delete(projectMembers).where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)))
      await recordAudit({ actorId, projectId, action: 'delete', entity: 'project-member', entityId: userId, before: current }, tx)
      await publishLiveEvent({ type: 'member.changed', projectId, entityId: userId }, tx)
      return null
    }
    const row = returnedRow(await tx.update(projectMembers).set({ role })
      .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)))
      .returning())
    await recordAudit({ actorId, projectId, action: 'update', entity: 'project-member', entityId: userId, before: current, after: row }, tx)
    await publishLiveEvent({ type: 'member.changed', projectId, entityId: userId }, tx)
    return row
  })
}

/** An owner adds an existing user, found by e-mail, with a role (no such account: 422; already a member: 409). */
export async function addMember(args: { actorId: string, projectId: string, email: string, role: ProjectRole }) {
  const { actorId, projectId, email, role } = args
  const db = useDb()
  const [target] = await db.select({ id: users.id, displayName: users.displayName, email: users.email }).from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  if (!target) {
    throw unprocessableError(`No Pastload account uses ${email}. A site admin can create it first.`, { issues: [{ path: 'email', message: 'no account with this e-mail' }] })
  }
  const [existing] = await db.select().from(projectMembers).where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, target.id)))
  if (existing) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${target.displayName} is already a member (${existing.role}).`, data: { current: existing } })
  }
  const member = await db.transaction(async (tx) => {
    const row = returnedRow(await tx.insert(projectMembers).values({ projectId, userId: target.id, role }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'project-member', entityId: target.id, after: row }, tx)
    await publishLiveEvent({ type: 'member.changed', projectId, entityId: target.id }, tx)
    return row
  })
  return { userId: target.id, email: target.email, displayName: target.displayName, role: member.role }
}
