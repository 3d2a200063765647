import { SettlementRunListQuerySchema } from '#shared/schemas/settlement-runs'
import type { ServerSettlementRunList } from '#shared/types/settlement-runs'
import { listSettlementRuns } from '~~/server/services/settlement-runs'

/** The project's settlement runs, newest first, with headline figures once finished. */
export default defineEventHandler(async (event): Promise<ServerSettlementRunList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const page = validateQuery(event, SettlementRunListQuerySchema)
  return listSettlementRuns(project.id, page)
})
