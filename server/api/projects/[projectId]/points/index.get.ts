import { PointListQuerySchema } from '#shared/schemas/investigation'
import { listPoints } from '~~/server/services/investigation-points'
import type { ServerPointPage } from '#shared/types/investigation'

/** The project's investigation points, filtered by identifier search and kind, paged. */
export default defineEventHandler(async (event): Promise<ServerPointPage> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const query = validateQuery(event, PointListQuerySchema)
  return listPoints(project.id, query)
})
