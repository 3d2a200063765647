import { RESULT_CAUTION } from '#shared/caution'
import { computeSettlement } from '#shared/geotech/settlement'
import { SettlementQuerySchema, SettlementRequestSchema } from '#shared/schemas/calc'
import { unprocessableError } from '~~/server/services/http-errors'

/** 1-D primary consolidation settlement, optionally with time rate and secondary compression. */
export default defineEventHandler(async (event) => {
  requireUser(event)
  const { sublayers } = validateQuery(event, SettlementQuerySchema)
  const body = await validateBody(event, SettlementRequestSchema)
  // The convergence report doubles the count: bound the work before starting it.
  const planned = body.layers.reduce((n, l) => {
    if (!l.compressible || !(l.thickness > 0)) return n
    if (body.sublayers && 'count' in body.sublayers) return n + body.sublayers.count
    const max = body.sublayers?.maxThickness ?? 0.25
    return n + Math.ceil(l.thickness / max)
  }, 0)
  if (planned > MAX_SUBLAYERS) {
    throw unprocessableError(`The sublayering asks for ${planned} sublayers; the limit is ${MAX_SUBLAYERS}. Use a larger maxThickness.`, { code: 'too-many-sublayers' })
  }
  const result = runEngine(() => computeSettlement(body))
  if (!sublayers) {
    // The rows are built only when read: leaving them out skips that work too.
    const { settlement, convergence, layers, time, times, secondary, warnings } = result
    return { settlement, convergence, layers, time, times, secondary, warnings, caution: RESULT_CAUTION }
  }
  return { ...result, caution: RESULT_CAUTION }
})
