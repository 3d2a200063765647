import { RunScatterQuerySchema } from '#shared/schemas/settlement-runs'
import type { RunScatterReply } from '#shared/types/settlement-runs'
import { settlementRunScatter } from '~~/server/services/settlement-run-scatter'

/** The COVs "from the data" of a model version's compressible strata (tests, n, defaults, σ'p trend lines). */
export default defineEventHandler(async (event): Promise<RunScatterReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId, version } = validateQuery(event, RunScatterQuerySchema)
  return settlementRunScatter(project.id, modelId, version)
})
