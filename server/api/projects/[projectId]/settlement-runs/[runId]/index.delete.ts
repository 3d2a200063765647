import { SettlementRunParamsSchema } from '#shared/schemas/settlement-runs'
import { deleteSettlementRun } from '~~/server/services/settlement-runs'

/** Deletes a run: only its creator (403 for anyone else). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'settlement.run')
  const { runId } = validateParams(event, SettlementRunParamsSchema)
  await deleteSettlementRun(project.id, user.id, runId)
  setResponseStatus(event, 204)
  return null
})
