import { CreateSettlementRunSchema } from '#shared/schemas/settlement-runs'
import { createSettlementRun } from '~~/server/services/settlement-runs'

/** Starts a settlement run: 201 with its id and status (finished at once when small, else queued for a worker). */
export default projectCreateHandler('settlement.run', CreateSettlementRunSchema, createSettlementRun)
