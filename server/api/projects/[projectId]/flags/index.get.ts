import { FlagListQuerySchema } from '#shared/schemas/review'
import { listFlags } from '~~/server/services/review'
import type { ServerReviewFlagPage } from '#shared/types/review'

/** The project's review list, newest first, filtered by status, target type, verdict or target. */
export default defineEventHandler(async (event): Promise<ServerReviewFlagPage> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const query = validateQuery(event, FlagListQuerySchema)
  return listFlags(project.id, query)
})
