import { createStressEvaluator } from '../geotech/stress'
import { asTrendFit, toStressInput } from './convert'
import { evaluateTrend } from '../geotech/trend-model'
import { stratumBounds } from './definition-plain'
import type { ModelStratum, SiteModelDefinition, TrendProblemCode } from './definition'

/**
 * The checks that keep a fitted σ'p trend from misleading: R² below 0 (the trend
 * explains the points worse than their mean), and σ'p below σ'v0 (OCR < 1, an
 * underconsolidated reading the data rarely support) or σ'p at or below 0
 * anywhere inside the stratum (physically impossible). Such a trend can stay
 * only with a reason (`trend.acceptedDespite`); the fit panel shows the problems
 * and the server refuses a version whose problem trend has no reason.
 *
 * The trends are linear in depth or in σ'v0 between breaks, and σ'v0 is linear
 * in depth between the stress profile's breakpoints (layer boundaries, the water
 * table, the piezometric control points), so checking at the stratum's ends, at
 * those breakpoints and at a crust's base finds the extremes exactly.
 */

export interface TrendProblem {
  code: TrendProblemCode
  /** Where (m) σ'p is worst, for the σ'p checks. */
  depth?: number
  /** σ'p and σ'v0 there (kPa), or R². */
  preconsolidation?: number
  effectiveStress?: number
  r2?: number
}

/** Inside the stratum, just off its ends: σ'v0 is 0 at the ground surface, where POP and OCR forms are undefined. */
const EDGE = 1e-6

/** Depths where a stratum's trend reaches its extremes (ends, stress breakpoints, crust base). */
function checkDepths(def: SiteModelDefinition, s: ModelStratum, b: { top: number, bottom: number }): number[] {
  const inside = (z: number) => z > b.top + EDGE && z < b.bottom - EDGE
  const depths = new Set<number>([b.top + EDGE, b.bottom - EDGE])
  const wt = def.groundwater.waterTableDepth
  if (inside(wt)) depths.add(wt)
  for (const p of def.groundwater.piezometers) if (inside(p.depth)) depths.add(p.depth)
  const bp = s.trend?.parameters.breakpointDepth
  if (bp !== undefined && inside(bp)) {
    depths.add(bp - EDGE)
    depths.add(bp + EDGE)
  }
  return [...depths].sort((x, y) => x - y)
}

/**
 * The problems of one stratum's fitted trend, given σ'v0 at a depth (kPa). A hand-drawn
 * trend carries its own reason and is not checked; no trend, no problems.
 */
export function stratumTrendProblems(def: SiteModelDefinition, bandIndex: number, effectiveStressAt: (depth: number) => number): TrendProblem[] {
  const s = def.strata[bandIndex]
  const b = stratumBounds(def)[bandIndex]
  const fit = s ? asTrendFit(s) : null
  if (!s?.trend || !b || !fit) return []
  const out: TrendProblem[] = []
  if (s.trend.r2 !== null && s.trend.r2 < 0) out.push({ code: 'negative-r2', r2: s.trend.r2 })
  let below: TrendProblem | null = null
  let notPositive: TrendProblem | null = null
  for (const z of checkDepths(def, s, b)) {
    const e = effectiveStressAt(z)
    if (!(e > 0)) continue
    const p = evaluateTrend(fit, z, e)
    if (p <= 0 && (!notPositive || p < notPositive.preconsolidation!)) notPositive = { code: 'not-positive', depth: z, preconsolidation: p, effectiveStress: e }
    else if (p > 0 && p < e && (!below || p - e < below.preconsolidation! - below.effectiveStress!)) below = { code: 'below-effective-stress', depth: z, preconsolidation: p, effectiveStress: e }
  }
  if (below) out.push(below)
  if (notPositive) out.push(notPositive)
  return out
}

export interface StratumProblems { band: number, code: string, problems: TrendProblem[] }

/** Every stratum's trend problems, σ'v0 from the definition's own stress profile. */
export function definitionTrendProblems(def: SiteModelDefinition): StratumProblems[] {
  const stress = createStressEvaluator(toStressInput(def))
  const at = (z: number) => stress(z).effectiveStress
  return def.strata
    .map((s, band) => ({ band, code: s.code, problems: stratumTrendProblems(def, band, at) }))
    .filter(x => x.problems.length > 0)
}

/** The problems a stratum's trend still needs a reason for: those not named in its `acceptedDespite`. */
export function unacceptedProblems(s: ModelStratum, problems: readonly TrendProblem[]): TrendProblem[] {
  const accepted = new Set(s.trend?.acceptedDespite?.problems ?? [])
  return problems.filter(p => !accepted.has(p.code))
}

/** How numbers read in the words below: SI by default, the project's units on screen. */
export interface ProblemFormat { stress: (kPa: number) => string, length: (m: number) => string }
const SI_FORMAT: ProblemFormat = { stress: v => `${v.toFixed(1)} kPa`, length: v => `${v.toFixed(2)} m` }

/** A problem in plain words, e.g. "σ'p 12.0 kPa is below σ'v0 18.3 kPa at 3.20 m". */
export function trendProblemWords(p: TrendProblem, fmt: ProblemFormat = SI_FORMAT): string {
  switch (p.code) {
    case 'negative-r2': return `R² is ${p.r2!.toFixed(2)}: the trend fits the points worse than their mean`
    case 'below-effective-stress': return `σ'p ${fmt.stress(p.preconsolidation!)} is below σ'v0 ${fmt.stress(p.effectiveStress!)} at ${fmt.length(p.depth!)}`
    case 'not-positive': return `σ'p is ${fmt.stress(p.preconsolidation!)} at ${fmt.length(p.depth!)}: it must stay above 0`
  }
}
