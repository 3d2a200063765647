import { deletePointRow } from '../../../../../../services/point-rows'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, rowId } = validateParams(event, PointRowParams)
  await deletePointRow('groundwater', { actorId: user.id, projectId: project.id, pointId }, rowId)
  return { ok: true }
})
