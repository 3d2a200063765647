import { SettlementQuerySchema, SettlementRequestSchema } from '#shared/schemas/calc'
import type { SettlementReply } from '#shared/types/calc'
import { calcSettlement } from '~~/server/services/calc-settlement'

/** 1-D primary consolidation settlement, optionally with time rate, secondary compression and a Monte Carlo block. */
export default defineEventHandler(async (event): Promise<SettlementReply> => {
  requireUser(event)
  const { sublayers } = validateQuery(event, SettlementQuerySchema)
  const body = await validateBody(event, SettlementRequestSchema)
  return calcSettlement(body, { sublayers })
})
