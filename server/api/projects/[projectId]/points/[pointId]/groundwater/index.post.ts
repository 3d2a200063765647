import { GroundwaterInputSchema, PointParamsSchema } from '#shared/schemas/investigation'
import { createPointRow } from '~~/server/services/point-rows'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, GroundwaterInputSchema)
  const row = await createPointRow('groundwater', { actorId: user.id, projectId: project.id, pointId }, body)
  setResponseStatus(event, 201)
  return { row }
})
