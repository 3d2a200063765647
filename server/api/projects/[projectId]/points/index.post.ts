import { PointInputSchema } from '#shared/schemas/investigation'
import { useDb } from '../../../../db/client'
import { investigationPoints } from '../../../../db/schema'
import { recordAudit } from '../../../../services/audit'
import { isUniqueViolation } from '../../../../utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const body = await validateBody(event, PointInputSchema)
  try {
    const point = await useDb().transaction(async (tx) => {
      const [row] = await tx.insert(investigationPoints).values({ ...body, projectId: project.id }).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'point', entityId: row!.id, after: row }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { point }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${body.identifier} already exists in this project.` })
    throw err
  }
})
