import { fitTrend } from '#shared/geotech/trends'
import { TrendFitRequestSchema } from '#shared/schemas/calc'
import type { TrendFitReply } from '#shared/types/calc'

/** A σ'p trend with depth for one stratum's points (or `auto`: lowest AICc). */
export default defineEventHandler(async (event): Promise<TrendFitReply> => {
  requireUser(event)
  const { model, points, logSpace } = await validateBody(event, TrendFitRequestSchema)
  const fit = runEngine(() => fitTrend(points, { model, logSpace }))
  return {
    model: fit.model,
    ...(fit.crustBelow ? { crustBelow: fit.crustBelow } : {}),
    parameters: fit.parameters,
    n: fit.n,
    r2: fit.r2,
    rmse: fit.rmse,
    aic: fit.aic,
    // AICc is undefined (infinite) with too few points: JSON has no Infinity, so null.
    aicc: Number.isFinite(fit.aicc) ? fit.aicc : null,
    band: fit.band,
    depthRange: fit.depthRange,
    ...(fit.reason ? { reason: fit.reason } : {}),
    ...(fit.candidates ? { candidates: fit.candidates.map(c => ('aicc' in c && !Number.isFinite(c.aicc) ? { ...c, aicc: null } : c)) } : {}),
  }
})
