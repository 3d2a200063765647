import { pointDetail, requirePoint } from '~~/server/services/points'
import { PointParamsSchema } from '#shared/schemas/investigation'
import type { ServerPointDetail } from '#shared/types/investigation'

/** A point with its log, samples and index tests, SPT, groundwater and vane readings. */
export default defineEventHandler(async (event): Promise<ServerPointDetail> => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParamsSchema)
  const point = await requirePoint(project.id, pointId)
  return { ...(await pointDetail(point)), role }
})
