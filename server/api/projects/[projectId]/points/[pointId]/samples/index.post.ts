import { PointParamsSchema, SampleInputSchema } from '#shared/schemas/investigation'
import { samples } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { requirePoint } from '~~/server/services/points'
import { unprocessableError } from '~~/server/services/http-errors'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, SampleInputSchema)
  try {
    const sample = await useDb().transaction(async (tx) => {
      const point = await requirePoint(project.id, pointId, tx)
      if (body.bottom > point.finalDepth) throw unprocessableError(`The sample's bottom (${body.bottom} m) is below the hole's final depth (${point.finalDepth} m).`)
      const [row] = await tx.insert(samples).values({ ...body, pointId: point.id }).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'sample', entityId: row!.id, after: row }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { sample }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Sample ${body.identifier} already exists at this point.` })
    throw err
  }
})
