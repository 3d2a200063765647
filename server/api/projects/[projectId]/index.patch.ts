import { eq } from 'drizzle-orm'
import { UpdateProjectSchema } from '#shared/schemas/projects'
import { projects } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'project.manage')
  const body = await validateBody(event, UpdateProjectSchema)
  try {
    const updated = await useDb().transaction(async (tx) => {
      const [row] = await tx.update(projects).set(body).where(eq(projects.id, project.id)).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'project', entityId: project.id, before: project, after: row }, tx)
      return row!
    })
    return { project: updated }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'That job number is already used by another project.' })
    throw err
  }
})
