/**
 * The site-model definition's constants and helpers that need no schema library: the browser's
 * stress-model page imports them from here, so its first load carries no zod. The schemas and the
 * types they define are in definition.ts, which exports these too.
 */
import type { DepthTrend, ModelStratum, SiteModelDefinition, StratumTrend } from './definition'

/** The definition's schema version written by this release (`schemaVersion`). */
export const SITE_MODEL_SCHEMA_VERSION = 2
/**
 * Versions this release reads. 2 added depth trends of compressibility
 * (`compressibility.trends`); a version-1 definition has none and reads and
 * converts exactly as before.
 */
export const SITE_MODEL_SCHEMA_VERSIONS = [1, 2] as const

/**
 * What can make a fitted trend mislead (shared/site-model/trend-checks.ts): R² below 0
 * (worse than the points' mean), σ'p below σ'v0, or σ'p at or below 0 inside its stratum.
 */
export const TREND_PROBLEM_CODES = ['negative-r2', 'below-effective-stress', 'not-positive'] as const
export type TrendProblemCode = (typeof TREND_PROBLEM_CODES)[number]

/** The compressibility parameters that may follow a depth trend instead of a constant. */
export const COMPRESSIBILITY_KEYS = ['cc', 'cr', 'e0', 'cv', 'calpha'] as const
export type CompressibilityKey = (typeof COMPRESSIBILITY_KEYS)[number]

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
