import { deletePointRow } from '~~/server/services/point-rows'
import { PointRowParamsSchema } from '#shared/schemas/investigation'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, rowId } = validateParams(event, PointRowParamsSchema)
  await deletePointRow('groundwater', { actorId: user.id, projectId: project.id, pointId }, rowId)
  return { ok: true }
})
