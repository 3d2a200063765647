import { SettlementRunPointParamsSchema } from '#shared/schemas/settlement-runs'
import type { RunPointDetail } from '#shared/types/settlement-runs'
import { settlementRunPoint } from '~~/server/services/settlement-runs'

/** One named point's full result with its sublayer table (409 until the run has finished). */
export default defineEventHandler(async (event): Promise<{ point: RunPointDetail }> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { runId, index } = validateParams(event, SettlementRunPointParamsSchema)
  return settlementRunPoint(project.id, runId, index)
})
