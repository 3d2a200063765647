import { z } from 'zod'
import { int, str } from '../schemas/common'
import { depthTrendProblems, stratumBounds, TREND_PROBLEM_CODES } from './definition-plain'

// The constants and helpers that need no schema library live in definition-plain.ts (the browser's
// stress-model page loads them without zod); they are exported from here too.
export {
  COMPRESSIBILITY_KEYS, COMPRESSIBILITY_LABELS, depthTrendAt, depthTrendProblems, SITE_MODEL_SCHEMA_VERSION,
  SITE_MODEL_SCHEMA_VERSIONS, stratumBounds, TREND_PROBLEM_CODES, trendFromFit,
} from './definition-plain'
export type { CompressibilityKey, TrendProblemCode } from './definition-plain'

/**
 * Plausibility bounds of a definition's numbers (common practice for soft-ground
 * work, set generously; the same families as the compute API's, shared/schemas/calc.ts):
 * depths ≤ 500 m, stresses ≤ 10 MPa, Cc ≤ 10, Cr ≤ 5, e0 ≤ 15, cv ≤ 10 000 m²/year,
 * Cα ≤ 1. Fitted statistics and trend parameters are bounded only to keep them finite
 * in arithmetic (a fit never gives 10⁹).
 */
const FIT_VALUE = 1e9
const fitted = () => z.number().min(-FIT_VALUE).max(FIT_VALUE)


export const TrendModelSchema = z.enum(['constant', 'linear', 'pop', 'ocr', 'crust'])


export const StratumTrendSchema = z.object({
  model: TrendModelSchema,
  crustBelow: z.enum(['constant', 'linear', 'pop', 'ocr']).optional(),
  logSpace: z.boolean().default(false),
  parameters: z.record(str(40), fitted()),
  n: int(0, 1_000_000),
  r2: fitted().nullable(),
  rmse: fitted().nullable(),
  aic: fitted().nullable(),
  aicc: fitted().nullable(),
  /** σ'p point ids fitted and left out (by the engineer or by reviewer flags). */
  includedPointIds: z.array(str(120)).max(200_000),
  excludedPointIds: z.array(str(120)).max(200_000),
  /** A hand-drawn trend instead of a fit: knots (depth, σ'p), with the reason required. */
  manual: z.object({
    knots: z.array(z.object({ depth: z.number().min(0).max(500), preconsolidation: z.number().min(0).max(10_000) })).min(2).max(50),
    reason: str().trim().min(3, { message: 'a manual trend needs a reason' }).max(1000),
  }).optional(),
  /**
   * A fit kept although it has problems (R² < 0, σ'p < σ'v0 or σ'p ≤ 0 in its stratum):
   * the problems the engineer saw and why the trend stays. A refit drops it.
   */
  acceptedDespite: z.object({
    problems: z.array(z.enum(TREND_PROBLEM_CODES)).min(1).max(TREND_PROBLEM_CODES.length),
    reason: str().trim().min(3, { message: 'a trend kept despite its problems needs a reason' }).max(1000),
  }).optional(),
})
export type StratumTrend = z.infer<typeof StratumTrendSchema>


/**
 * A parameter linear in depth within its stratum, fitted by least squares to the
 * stratum's oedometer tests: value(z) = value + gradient·(z − referenceDepth).
 * The reference depth is the mean depth of the fitted tests, so `value` is their
 * mean and the trend does not move when a stratum break is dragged.
 */
export const DepthTrendSchema = z.object({
  /** m below ground: the mean depth of the fitted tests. */
  referenceDepth: z.number().min(0).max(500),
  /** The parameter at the reference depth (the mean of the fitted tests). */
  value: fitted(),
  /** Change per metre of depth. */
  gradient: fitted(),
  n: int(3, 1_000_000),
  r2: z.number().min(0).max(1).nullable(),
  /** Depth range of the fitted tests, m. */
  testDepths: z.object({ top: z.number().min(0).max(500), bottom: z.number().min(0).max(500) }),
  /** The oedometer tests fitted. */
  testIds: z.array(str(120)).max(1000),
})
export type DepthTrend = z.infer<typeof DepthTrendSchema>

export const CompressibilitySchema = z.object({
  cc: z.number().min(0).max(10),
  cr: z.number().min(0).max(5),
  e0: z.number().gt(0).max(15),
  /** m²/year. */
  cv: z.number().gt(0).max(10_000).optional(),
  calpha: z.number().min(0).max(1).optional(),
  drainage: z.enum(['double', 'top', 'bottom']).default('double'),
  /** How the values were adopted: the mean of the stratum's tests, or typed. */
  source: z.enum(['mean', 'manual']).default('manual'),
  n: int(0, 1_000_000).optional(),
  /**
   * Schema version 2: parameters that follow a depth trend instead of the constant
   * above (which stays as the alternative the engineer can switch back to).
   */
  trends: z.object({
    cc: DepthTrendSchema.optional(),
    cr: DepthTrendSchema.optional(),
    e0: DepthTrendSchema.optional(),
    cv: DepthTrendSchema.optional(),
    calpha: DepthTrendSchema.optional(),
  }).optional(),
})
export type Compressibility = z.infer<typeof CompressibilitySchema>

export const ModelStratumSchema = z.object({
  code: str(16).min(1),
  name: str(120).min(1),
  thickness: z.number().gt(0, { message: 'must be thicker than 0 m' }).max(500),
  unitWeight: z.number().min(5).max(30),
  unitWeightSaturated: z.number().min(5).max(30),
  compressible: z.boolean(),
  compressibility: CompressibilitySchema.optional(),
  trend: StratumTrendSchema.optional(),
  /** CPT cone factor k in σ'p = k·qnet for this stratum (Mayne 1995; default 0.33). */
  cptFactor: z.number().gt(0).max(2).default(0.33),
})
export type ModelStratum = z.infer<typeof ModelStratumSchema>

/**
 * A site model: the stress model of one site as the engineer built it — strata
 * bands top-down with unit weights, groundwater and piezometric profile, surface
 * pressure, per-stratum σ'p trends with the points used and excluded, and
 * adopted compressibility. Stored as the draft of a model and as immutable
 * versions; `schemaVersion` lets later releases read older snapshots.
 * docs/site-model-schema.md describes it for other tools.
 */
export const SiteModelDefinitionSchema = z.object({
  schemaVersion: z.union([z.literal(1), z.literal(2)]),
  surcharge: z.number().min(0).max(10_000).default(0),
  gammaW: z.number().min(9).max(10.5).default(9.81),
  groundwater: z.object({
    waterTableDepth: z.number().min(0).max(500),
    piezometers: z.array(z.object({ depth: z.number().min(0).max(500), porePressure: z.number().min(-100).max(10_000) })).max(100).default([]),
  }),
  strata: z.array(ModelStratumSchema).min(1, { message: 'needs at least one stratum' }).max(50),
  /** Reviewer flags that were in force when the version was saved. */
  flagsInForce: z.array(z.object({ flagId: str(40), targetType: str(40), targetId: str(120), verdict: str(40) })).max(10_000).default([]),
}).superRefine((def, ctx) => {
  const bounds = stratumBounds(def)
  def.strata.forEach((s, i) => {
    const trends = s.compressibility?.trends
    if (!trends || !Object.values(trends).some(Boolean)) return
    if (def.schemaVersion < 2) {
      ctx.addIssue({ code: 'custom', path: ['schemaVersion'], message: 'depth trends of compressibility need schemaVersion 2' })
      return
    }
    const stratumBoundsAt = bounds[i]
    if (!stratumBoundsAt) return
    for (const p of depthTrendProblems(s, stratumBoundsAt)) ctx.addIssue({ code: 'custom', path: ['strata', i, 'compressibility', 'trends', p.key], message: p.message })
  })
}).meta({ id: 'SiteModelDefinition' })
export type SiteModelDefinition = z.infer<typeof SiteModelDefinitionSchema>

