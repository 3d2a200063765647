import { desc, eq } from 'drizzle-orm'
import { PageQuerySchema } from '#shared/schemas/common'
import { auditEvents, users } from '~~/server/db/schema'

/** The project's audit trail, newest first, paged. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { limit, offset } = validateQuery(event, PageQuerySchema)
  const events = await useDb()
    .select({ id: auditEvents.id, at: auditEvents.at, action: auditEvents.action, entity: auditEvents.entity, entityId: auditEvents.entityId, actor: users.displayName, before: auditEvents.before, after: auditEvents.after })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(eq(auditEvents.projectId, project.id))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(limit).offset(offset)
  return { events, limit, offset }
})
