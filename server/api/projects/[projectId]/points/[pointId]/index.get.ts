import { pointDetail, requirePoint } from '../../../../../services/points'

/** A point with its log, samples and index tests, SPT, groundwater and vane readings. */
export default defineEventHandler(async (event) => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParams)
  const point = await requirePoint(project.id, pointId)
  return { ...(await pointDetail(point)), role }
})
