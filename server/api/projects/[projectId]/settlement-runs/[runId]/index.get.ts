import { SettlementRunParamsSchema } from '#shared/schemas/settlement-runs'
import type { ServerSettlementRun } from '#shared/types/settlement-runs'
import { getSettlementRun } from '~~/server/services/settlement-runs'

/** One run: its inputs, status and progress, and the results once finished. */
export default defineEventHandler(async (event): Promise<{ run: ServerSettlementRun }> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { runId } = validateParams(event, SettlementRunParamsSchema)
  return getSettlementRun(project.id, runId)
})
