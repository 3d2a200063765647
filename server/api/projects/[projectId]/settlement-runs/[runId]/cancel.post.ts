import { SettlementRunParamsSchema } from '#shared/schemas/settlement-runs'
import { cancelSettlementRun } from '~~/server/services/settlement-runs'

/** Cancels a queued or running run (its creator or a project owner): `{ run: { id, status: 'cancelled' } }`; 409 once it has ended. */
export default defineEventHandler(async (event) => {
  const { user, project, role } = await requireProjectRole(event, 'settlement.run')
  const { runId } = validateParams(event, SettlementRunParamsSchema)
  return cancelSettlementRun(project.id, { id: user.id, role }, runId)
})
