import { interpretOedometer } from '#shared/geotech/oedometer'
import { PreconsolidationRequestSchema } from '#shared/schemas/calc'

/** σ'p from an oedometer curve by each method, with Cc, Cr and sample quality. */
export default defineEventHandler(async (event) => {
  requireUser(event)
  const body = await validateBody(event, PreconsolidationRequestSchema)
  const r = runEngine(() => interpretOedometer(body))
  return {
    results: r.results,
    cc: r.cc,
    cr: r.cr,
    recompressionBasis: r.recompressionBasis,
    virginLine: { slope: r.virginLine.slope, intercept: r.virginLine.intercept },
    e0: r.e0,
    ...(r.sampleQuality ? { sampleQuality: r.sampleQuality } : {}),
    warnings: r.warnings,
  }
})
