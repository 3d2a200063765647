import { PointParamsSchema, PointUpdateSchema } from '#shared/schemas/investigation'
import { updatePoint } from '~~/server/services/investigation-points'

/** Edits a point (stale version or an identifier already used: 409; a final depth above logged data: 422). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, PointUpdateSchema)
  return { point: await updatePoint(project.id, user.id, pointId, body) }
})
