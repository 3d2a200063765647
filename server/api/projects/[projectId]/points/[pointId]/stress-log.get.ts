import { PointParamsSchema } from '#shared/schemas/investigation'
import type { PointLogReply } from '#shared/types/point-log'
import { pointLogData } from '~~/server/services/reports/point-log'

/** What the point's stress-history log draws (the printable sheet page draws it with the report's code). */
export default defineEventHandler(async (event): Promise<PointLogReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParamsSchema)
  return { log: await pointLogData(project.id, pointId) }
})
