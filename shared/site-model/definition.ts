import { z } from 'zod'
import { int, str } from '../schemas/common'

/**
 * Plausibility bounds of a definition's numbers (common practice for soft-ground
 * work, set generously; the same families as the compute API's, shared/schemas/calc.ts):
 * depths ≤ 500 m, stresses ≤ 10 MPa, Cc ≤ 10, Cr ≤ 5, e0 ≤ 15, cv ≤ 10 000 m²/year,
 * Cα ≤ 1. Fitted statistics and trend parameters are bounded only to keep them finite
 * in arithmetic (a fit never gives 10⁹).
 */
const FIT_VALUE = 1e9
const fitted = () => z.number().min(-FIT_VALUE).max(FIT_VALUE)

/**
 * A site model: the stress model of one site as the engineer built it — strata
 * bands top-down with unit weights, groundwater and piezometric profile, surface
 * pressure, per-stratum σ'p trends with the points used and excluded, and
 * adopted compressibility. Stored as the draft of a model and as immutable
 * versions; `schemaVersion` lets later releases read older snapshots.
 * docs/site-model-schema.md describes it for other tools.
 */
export const SITE_MODEL_SCHEMA_VERSION = 2
/**
 * Versions this release reads. 2 added depth trends of compressibility
 * (`compressibility.trends`); a version-1 definition has none and reads and
 * converts exactly as before.
 */
export const SITE_MODEL_SCHEMA_VERSIONS = [1, 2] as const

export const TrendModelSchema = z.enum(['constant', 'linear', 'pop', 'ocr', 'crust'])

/**
 * What can make a fitted trend mislead (shared/site-model/trend-checks.ts): R² below 0
 * (worse than the points' mean), σ'p below σ'v0, or σ'p at or below 0 inside its stratum.
 */
export const TREND_PROBLEM_CODES = ['negative-r2', 'below-effective-stress', 'not-positive'] as const
export type TrendProblemCode = (typeof TREND_PROBLEM_CODES)[number]

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

/** The compressibility parameters that may follow a depth trend instead of a constant. */
export const COMPRESSIBILITY_KEYS = ['cc', 'cr', 'e0', 'cv', 'calpha'] as const
export type CompressibilityKey = (typeof COMPRESSIBILITY_KEYS)[number]

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

/** A stratum's trend from a fit (the engine's or the fit route's answer) and the σ'p point ids it was fitted on and left out. */
export function trendFromFit(
  fit: Pick<StratumTrend, 'model' | 'crustBelow' | 'parameters' | 'n' | 'r2' | 'rmse' | 'aic' | 'aicc'>,
  logSpace: boolean,
  includedIds: string[],
  excludedIds: string[],
): StratumTrend {
  return {
    model: fit.model,
    ...(fit.crustBelow ? { crustBelow: fit.crustBelow } : {}),
    logSpace,
    parameters: fit.parameters,
    n: fit.n,
    r2: fit.r2,
    rmse: fit.rmse,
    aic: fit.aic,
    aicc: fit.aicc,
    includedPointIds: includedIds,
    excludedPointIds: excludedIds,
  }
}

/** Depth of each stratum's top and bottom, from the thicknesses. */
export function stratumBounds(def: Pick<SiteModelDefinition, 'strata'>): { top: number, bottom: number }[] {
  let top = 0
  return def.strata.map((s) => {
    const b = { top, bottom: top + s.thickness }
    top = b.bottom
    return b
  })
}

/** Readable names of the compressibility parameters, for messages. */
export const COMPRESSIBILITY_LABELS: Record<CompressibilityKey, string> = { cc: 'Cc', cr: 'Cr', e0: 'e0', cv: 'cv', calpha: 'Cα' }

/** A depth trend's value at a depth. */
export function depthTrendAt(t: Pick<DepthTrend, 'referenceDepth' | 'value' | 'gradient'>, depth: number): number {
  return t.value + t.gradient * (depth - t.referenceDepth)
}

/**
 * Where a stratum's depth trends leave the physical range: Cc, Cr, e0 and cv must
 * stay above 0 and Cα at or above 0 from the stratum's top to its base (a linear
 * trend is extreme at the ends). Such a trend is refused, never clamped: a clamped
 * line would no longer be the fit whose n and R² are shown.
 */
export function depthTrendProblems(s: Pick<ModelStratum, 'name' | 'compressibility'>, bounds: { top: number, bottom: number }): { key: CompressibilityKey, message: string }[] {
  const trends = s.compressibility?.trends
  if (!trends) return []
  const out: { key: CompressibilityKey, message: string }[] = []
  for (const key of COMPRESSIBILITY_KEYS) {
    const t = trends[key]
    if (!t) continue
    const strict = key !== 'calpha'
    for (const [where, z] of [['top', bounds.top], ['base', bounds.bottom]] as const) {
      const v = depthTrendAt(t, z)
      if (strict ? v > 0 : v >= 0) continue
      out.push({
        key,
        message: `the ${COMPRESSIBILITY_LABELS[key]} trend gives ${Number(v.toPrecision(3))} at the ${where} of ${s.name} (${z.toFixed(2)} m); it must stay ${strict ? 'above 0' : 'at or above 0'} through the stratum: keep the constant`,
      })
      break
    }
  }
  return out
}
