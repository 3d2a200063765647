import { CreateSettlementRunSchema } from '#shared/schemas/settlement-runs'
import { createSettlementRun } from '~~/server/services/settlement-runs'

/** Starts a settlement run: 201 with its id and status (finished at once when small, else queued for a worker). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'settlement.run')
  const body = await validateBody(event, CreateSettlementRunSchema)
  const created = await createSettlementRun(project.id, user.id, body)
  setResponseStatus(event, 201)
  return created
})
