import { GeotechError } from './errors'

/**
 * Time rate of 1-D primary consolidation (Terzaghi 1925) and secondary
 * compression after it. Units: cv in m²/year, t in years, lengths in m.
 */

/** Which faces of a layer drain: both, or only the top or the bottom. */
export type Drainage = 'double' | 'top' | 'bottom'

/** Terms smaller than this end the series (U is then exact to ~1e-12). */
const SERIES_TOLERANCE = 1e-12

/**
 * Below this Tv the series needs hundreds of terms; the short-time solution
 * U = √(4Tv/π) is used instead. Its error is of order exp(−1/Tv), i.e. nil
 * at Tv = 1e-4 (Terzaghi 1925; any consolidation text).
 */
const SMALL_TV = 1e-4

function requireFinite(value: number, code: string, what: string): void {
  if (!Number.isFinite(value)) {
    throw new GeotechError(code, `${what} must be a finite number (got ${String(value)}).`)
  }
}

/**
 * Average degree of consolidation U(Tv) for a uniform initial excess pore
 * pressure (Terzaghi 1925): U = 1 − Σ 2/M² · exp(−M²Tv), M = π(2m + 1)/2,
 * summed until a term is below 1e-12; √(4Tv/π) below Tv = 1e-4; U(0) = 0.
 */
export function degreeOfConsolidation(tv: number): number {
  requireFinite(tv, 'time-factor-invalid', 'The time factor Tv')
  if (tv < 0) throw new GeotechError('time-factor-negative', `The time factor Tv is ${tv}; it must be ≥ 0.`)
  if (tv === 0) return 0
  if (tv < SMALL_TV) return Math.sqrt((4 * tv) / Math.PI)
  let sum = 0
  for (let m = 0; ; m++) {
    const M = (Math.PI * (2 * m + 1)) / 2
    const M2 = M * M
    const term = (2 / M2) * Math.exp(-M2 * tv)
    sum += term
    if (term < SERIES_TOLERANCE) break
  }
  return 1 - sum
}

/**
 * Tv for a given average degree U (0 ≤ U < 1): the inverse of
 * `degreeOfConsolidation`, by bisection (U is strictly increasing in Tv).
 * U = 1 needs infinite time and throws.
 */
export function timeFactorForDegree(u: number): number {
  requireFinite(u, 'degree-invalid', 'The degree of consolidation U')
  if (u < 0 || u >= 1) {
    throw new GeotechError('degree-out-of-range', `The degree of consolidation U is ${u}; it must be in [0, 1).`)
  }
  if (u === 0) return 0
  if (u <= degreeOfConsolidation(SMALL_TV)) return (Math.PI * u * u) / 4
  let lo = SMALL_TV
  let hi = 1
  while (degreeOfConsolidation(hi) < u) {
    lo = hi
    hi *= 2
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (degreeOfConsolidation(mid) < u) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

/** Tv = cv·t/Hdr² (Terzaghi 1925). cv in m²/yr, t in years, Hdr in m. */
export function timeFactor(cv: number, t: number, hdr: number): number {
  requireFinite(cv, 'cv-invalid', 'The coefficient of consolidation cv')
  requireFinite(t, 'time-invalid', 'The time')
  requireFinite(hdr, 'drainage-path-invalid', 'The drainage path')
  if (cv <= 0) throw new GeotechError('cv-not-positive', `The coefficient of consolidation cv is ${cv} m²/yr; it must be positive.`)
  if (t < 0) throw new GeotechError('time-negative', `The time ${t} years is negative.`)
  if (hdr <= 0) throw new GeotechError('drainage-path-not-positive', `The drainage path is ${hdr} m; it must be positive.`)
  return (cv * t) / (hdr * hdr)
}

/** Longest drainage path: half the thickness when both faces drain, the whole thickness when one does. */
export function drainagePath(thickness: number, drainage: Drainage = 'double'): number {
  requireFinite(thickness, 'layer-thickness-invalid', 'The layer thickness')
  if (thickness <= 0) throw new GeotechError('layer-thickness-not-positive', `The layer thickness is ${thickness} m; it must be positive.`)
  if (drainage === 'double') return thickness / 2
  if (drainage === 'top' || drainage === 'bottom') return thickness
  throw new GeotechError('drainage-invalid', `Unknown drainage "${String(drainage)}"; use double, top or bottom.`)
}

/** Time (years) to reach average degree U: t = Tv(U)·Hdr²/cv. */
export function timeForDegree(u: number, cv: number, hdr: number): number {
  const tv = timeFactorForDegree(u)
  timeFactor(cv, 0, hdr)
  return (tv * hdr * hdr) / cv
}

export interface SecondaryCompressionInput {
  /** Secondary compression index Cα (Δe per log10 cycle of time), ≥ 0. */
  calpha: number
  /** Void ratio at the end of primary consolidation, > 0. */
  ep: number
  /** Layer thickness, m. */
  thickness: number
  /** Time at the end of primary consolidation, years (> 0). */
  tp: number
  /** Time of interest, years. */
  t: number
}

/**
 * Secondary compression after primary: Δh = Cα/(1 + ep) · h · log10(t/tp)
 * (Mesri 1973, common practice); 0 for t ≤ tp, since it starts after primary.
 */
export function secondaryCompression(input: SecondaryCompressionInput): number {
  const { calpha, ep, thickness, tp, t } = input
  requireFinite(calpha, 'calpha-invalid', 'Cα')
  requireFinite(ep, 'void-ratio-invalid', 'The void ratio ep')
  requireFinite(thickness, 'layer-thickness-invalid', 'The layer thickness')
  requireFinite(tp, 'time-invalid', 'The end-of-primary time tp')
  requireFinite(t, 'time-invalid', 'The time t')
  if (calpha < 0) throw new GeotechError('calpha-negative', `Cα is ${calpha}; it must be ≥ 0.`)
  if (ep <= 0) throw new GeotechError('void-ratio-not-positive', `The void ratio at the end of primary is ${ep}; it must be positive.`)
  if (thickness <= 0) throw new GeotechError('layer-thickness-not-positive', `The layer thickness is ${thickness} m; it must be positive.`)
  if (tp <= 0) throw new GeotechError('time-not-positive', `The end-of-primary time is ${tp} years; it must be positive.`)
  if (t < 0) throw new GeotechError('time-negative', `The time ${t} years is negative.`)
  if (t <= tp) return 0
  return (calpha / (1 + ep)) * thickness * Math.log10(t / tp)
}
