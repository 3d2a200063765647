import { SettlementRunParamsSchema, SettlementRunQuerySchema } from '#shared/schemas/settlement-runs'
import type { ServerSettlementRun, ServerSettlementRunView } from '#shared/types/settlement-runs'
import { getSettlementRun } from '~~/server/services/settlement-runs'

/** One run: its inputs, status and progress, and the results once finished (with or without the points' time curves). */
export default defineEventHandler(async (event): Promise<{ run: ServerSettlementRun | ServerSettlementRunView }> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { runId } = validateParams(event, SettlementRunParamsSchema)
  const { curves } = validateQuery(event, SettlementRunQuerySchema)
  return getSettlementRun(project.id, runId, curves)
})
