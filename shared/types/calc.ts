/**
 * Replies of the compute routes (`/api/calc/…`). They hold no dates, so the
 * route's value and the page's reading are one type.
 */
import type { StressProfilePoint } from '#shared/geotech/stress'
import type { TrendCandidate, TrendFit } from '#shared/geotech/trends'

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
