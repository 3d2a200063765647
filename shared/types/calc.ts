/**
 * Replies of the compute routes (`/api/calc/…`). They hold no dates, so the
 * route's value and the page's reading are one type.
 */
import type { StressProfilePoint } from '#shared/geotech/stress'
import type { SettlementResult } from '#shared/geotech/settlement'
import type { TrendCandidate, TrendFit } from '#shared/geotech/trends'
import type { Distribution, ProbabilisticVariable } from '#shared/probabilistic/monte-carlo'
import type { Histogram } from '#shared/probabilistic/summary'

/** A row of a stress profile: σv, u and σ'v0 at a depth, with its layer's name. */
export type ProfilePoint = Omit<StressProfilePoint, 'layerIndex'>

/** POST /api/calc/stress-profile */
export interface StressProfileReply { points: ProfilePoint[], warnings: string[] }

/** A candidate of an `auto` fit; AICc is null where it is infinite (JSON has no Infinity). */
export type TrendCandidateReply =
  | (Omit<Extract<TrendCandidate, { aicc: number }>, 'aicc'> & { aicc: number | null })
  | Extract<TrendCandidate, { skipped: string }>

/** POST /api/calc/trend-fit */
export type TrendFitReply = Pick<TrendFit, 'model' | 'crustBelow' | 'parameters' | 'n' | 'r2' | 'rmse' | 'aic' | 'band' | 'depthRange' | 'reason'> & {
  /** Null with too few points (infinite). */
  aicc: number | null
  candidates?: TrendCandidateReply[]
}

/** The `probabilistic` block of POST /api/calc/settlement: Monte Carlo final primary settlement, m. */
export interface ProbabilisticSettlementReply extends Distribution {
  realizations: number
  seed: number
  histogram: Histogram
  /** Probability of exceeding the request's `limit` (m). */
  exceedance?: { limit: number, probability: number }
  /** Years to 90 % of primary settlement, when every compressible layer has cv. */
  t90?: Distribution
  sensitivity: { layer: string, variable: ProbabilisticVariable, rankCorrelation: number }[]
  warnings: string[]
}

/** POST /api/calc/settlement (`sublayers` absent with `?sublayers=false`). */
export type SettlementReply = Omit<SettlementResult, 'sublayers'> & {
  sublayers?: SettlementResult['sublayers']
  probabilistic?: ProbabilisticSettlementReply
  caution: string
}
