import { CreateProjectSchema } from '#shared/schemas/projects'
import { projectMembers, projects } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { isUniqueViolation } from '~~/server/utils/db-errors'

/** A site admin creates a project and becomes its first owner. */
export default defineEventHandler(async (event) => {
  const user = requireSiteAdmin(event)
  const body = await validateBody(event, CreateProjectSchema)
  try {
    const project = await useDb().transaction(async (tx) => {
      const [row] = await tx.insert(projects).values({ ...body, createdBy: user.id }).returning()
      await tx.insert(projectMembers).values({ projectId: row!.id, userId: user.id, role: 'owner' })
      await recordAudit({ actorId: user.id, projectId: row!.id, action: 'create', entity: 'project', entityId: row!.id, after: row }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { project }
  }
  catch (err) {
    if (isUniqueViolation(err)) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Job number ${body.jobNumber} is already used by another project.` })
    }
    throw err
  }
})
