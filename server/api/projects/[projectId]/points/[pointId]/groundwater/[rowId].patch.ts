import { GroundwaterUpdateSchema, PointRowParamsSchema } from '#shared/schemas/investigation'
import { updatePointRow } from '~~/server/services/point-rows'

const Body = GroundwaterUpdateSchema

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, rowId } = validateParams(event, PointRowParamsSchema)
  const { version, ...values } = await validateBody(event, Body)
  const row = await updatePointRow('groundwater', { actorId: user.id, projectId: project.id, pointId }, rowId, version, values)
  return { row }
})
