import { and, eq, sql } from 'drizzle-orm'
import { AddMemberSchema } from '#shared/schemas/projects'
import { projectMembers, users } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { unprocessableError } from '~~/server/services/http-errors'

/** An owner adds an existing user, found by e-mail, with a role. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { email, role } = await validateBody(event, AddMemberSchema)
  const db = useDb()
  const [target] = await db.select({ id: users.id, displayName: users.displayName, email: users.email }).from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  if (!target) {
    throw unprocessableError(`No Pastload account uses ${email}. A site admin can create it first.`, { issues: [{ path: 'email', message: 'no account with this e-mail' }] })
  }
  const [existing] = await db.select().from(projectMembers).where(and(eq(projectMembers.projectId, project.id), eq(projectMembers.userId, target.id)))
  if (existing) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${target.displayName} is already a member (${existing.role}).`, data: { current: existing } })
  }
  const member = await db.transaction(async (tx) => {
    const [row] = await tx.insert(projectMembers).values({ projectId: project.id, userId: target.id, role }).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'project-member', entityId: target.id, after: row }, tx)
    return row!
  })
  setResponseStatus(event, 201)
  return { member: { userId: target.id, email: target.email, displayName: target.displayName, role: member.role } }
})
