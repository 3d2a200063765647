import { computeStressProfile } from '#shared/geotech/stress'
import { StressProfileRequestSchema } from '#shared/schemas/calc'
import type { StressProfileReply } from '#shared/types/calc'

/** σv, u and σ'v0 at every breakpoint and requested depth. */
export default defineEventHandler(async (event): Promise<StressProfileReply> => {
  requireUser(event)
  const body = await validateBody(event, StressProfileRequestSchema)
  const profile = runEngine(() => computeStressProfile(body))
  return {
    points: profile.points.map(p => ({ depth: p.depth, layer: p.layer, totalStress: p.totalStress, porePressure: p.porePressure, effectiveStress: p.effectiveStress })),
    warnings: profile.warnings,
  }
})
