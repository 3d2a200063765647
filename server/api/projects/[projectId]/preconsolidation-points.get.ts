import { RESULT_CAUTION } from '#shared/caution'
import { PreconsolidationPointsQuerySchema } from '#shared/schemas/lab'
import { stressContext } from '~~/server/services/lab'
import { allPreconsolidationPoints } from '~~/server/services/preconsolidation-points'
import type { ServerPreconsolidationPointsReply } from '#shared/types/lab'

/**
 * Every σ'p point of the project from all sources, with σ'v0 from the stress model in force:
 * adopted oedometer values, CPT σ'p = k·qnet resampled at `spacing` (median per window), and field
 * vane σ'p = μ·su,FV/0.22. `dense=1` adds every CPT row as compact arrays.
 */
export default defineEventHandler(async (event): Promise<ServerPreconsolidationPointsReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { spacing, dense } = validateQuery(event, PreconsolidationPointsQuerySchema)
  const stress = await stressContext(project.id)
  const result = await allPreconsolidationPoints(project.id, stress, { spacing, dense })
  return { ...result, spacing, stressModel: stress.info, caution: RESULT_CAUTION }
})
