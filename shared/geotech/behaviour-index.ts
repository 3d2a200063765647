/**
 * The CPT soil behaviour type index Ic (Robertson 2009, "Interpretation of cone penetration tests — a
 * unified approach", Can. Geotech. J. 46): where the cone behaves like a sand and where like a clay.
 *
 *   Qtn = ((qt − σv0)/pa)·(pa/σ'v0)^n
 *   Fr  = fs/(qt − σv0)·100 %
 *   Ic  = √((3.47 − log10 Qtn)² + (log10 Fr + 1.22)²)
 *   n   = 0.381·Ic + 0.05·(σ'v0/pa) − 0.15, at most 1.0
 *
 * n depends on Ic, so the three are iterated from n = 1 until n settles. Ic describes behaviour, not
 * grading: it supports, not replaces, the logged description.
 */

import { GeotechError } from './errors'

/** Atmospheric pressure pa, kPa (the standard atmosphere, 101.325 kPa). */
export const ATMOSPHERIC_PRESSURE = 101.325

/** Robertson's (2009) cap on the stress exponent. */
export const MAX_STRESS_EXPONENT = 1

/** The Ic boundaries between behaviour bands (Robertson 1990 chart as Ic ranges, used again in Robertson 2009). */
export const IC_BOUNDARIES = [1.31, 2.05, 2.6, 2.95, 3.6] as const

export interface BehaviourInput {
  /** Corrected cone resistance qt, kPa. */
  qt: number
  /** Sleeve friction fs, kPa. */
  fs: number
  /** Total vertical stress σv0, kPa. */
  totalStress: number
  /** Effective vertical stress σ'v0, kPa. */
  effectiveStress: number
}

export interface BehaviourOptions {
  /** pa, kPa (default 101.325). */
  pa?: number
  /** Stop when n changes by less than this (default 1e-6). */
  tolerance?: number
  /** At most this many rounds (default 100). */
  maxIterations?: number
}

export interface SoilBehaviour {
  ic: number
  /** Normalised cone resistance Qtn with the final n. */
  qtn: number
  /** Normalised friction ratio Fr, %. */
  fr: number
  /** Stress exponent n at convergence. */
  n: number
  iterations: number
  /** False when `maxIterations` ran out before n settled (the last values are returned). */
  converged: boolean
}

const icOf = (qtn: number, fr: number) => Math.sqrt((3.47 - Math.log10(qtn)) ** 2 + (Math.log10(fr) + 1.22) ** 2)

/** Ic, Qtn, Fr and n at one reading (Robertson 2009); impossible input is a `GeotechError`. */
export function soilBehaviourIndex(input: BehaviourInput, options: BehaviourOptions = {}): SoilBehaviour {
  const { qt, fs, totalStress, effectiveStress } = input
  const pa = options.pa ?? ATMOSPHERIC_PRESSURE
  const tolerance = options.tolerance ?? 1e-6
  const maxIterations = options.maxIterations ?? 100
  for (const [name, v] of [['qt', qt], ['fs', fs], ['σv0', totalStress], ['σ\'v0', effectiveStress]] as const) {
    if (!Number.isFinite(v)) throw new GeotechError('behaviour-input-not-finite', `${name} must be a number (got ${v}).`)
  }
  if (!(pa > 0)) throw new GeotechError('atmospheric-pressure-not-positive', `pa must be above 0 kPa (got ${pa}).`)
  const net = qt - totalStress
  if (!(net > 0)) throw new GeotechError('net-resistance-not-positive', `qt (${qt} kPa) must exceed σv0 (${totalStress} kPa) for Ic.`)
  if (!(effectiveStress > 0)) throw new GeotechError('effective-stress-not-positive', `σ'v0 must be above 0 kPa for Ic (got ${effectiveStress}).`)
  if (!(fs > 0)) throw new GeotechError('sleeve-friction-not-positive', `fs must be above 0 kPa for Ic (got ${fs}).`)

  const fr = (fs / net) * 100
  const stressRatio = pa / effectiveStress
  let n = MAX_STRESS_EXPONENT
  let qtn = (net / pa) * stressRatio ** n
  let ic = icOf(qtn, fr)
  for (let i = 1; i <= maxIterations; i++) {
    const next = Math.min(MAX_STRESS_EXPONENT, 0.381 * ic + 0.05 * (effectiveStress / pa) - 0.15)
    const settled = Math.abs(next - n) < tolerance
    n = next
    qtn = (net / pa) * stressRatio ** n
    ic = icOf(qtn, fr)
    if (settled) return { ic, qtn, fr, n, iterations: i, converged: true }
  }
  return { ic, qtn, fr, n, iterations: maxIterations, converged: false }
}

/**
 * Ic for every row of a sounding (NaN where it is undefined: qt not above σv0, σ'v0 or fs not above 0,
 * a missing reading). Arrays of equal length.
 */
export function behaviourIndexProfile(rows: { qt: ArrayLike<number>, fs: ArrayLike<number>, totalStress: ArrayLike<number>, effectiveStress: ArrayLike<number> }, options: BehaviourOptions = {}): Float64Array {
  const n = rows.qt.length
  if (rows.fs.length !== n || rows.totalStress.length !== n || rows.effectiveStress.length !== n) {
    throw new GeotechError('array-length-mismatch', `qt, fs, σv0 and σ'v0 must have the same number of rows (got ${n}, ${rows.fs.length}, ${rows.totalStress.length}, ${rows.effectiveStress.length}).`)
  }
  const out = new Float64Array(n)
  const pa = options.pa ?? ATMOSPHERIC_PRESSURE
  for (let i = 0; i < n; i++) {
    const qt = rows.qt[i] ?? Number.NaN
    const fs = rows.fs[i] ?? Number.NaN
    const sv = rows.totalStress[i] ?? Number.NaN
    const se = rows.effectiveStress[i] ?? Number.NaN
    // The conditions `soilBehaviourIndex` refuses, checked here so a sounding's odd rows stay gaps.
    out[i] = Number.isFinite(qt) && Number.isFinite(fs) && Number.isFinite(sv) && Number.isFinite(se) && qt - sv > 0 && se > 0 && fs > 0
      ? soilBehaviourIndex({ qt, fs, totalStress: sv, effectiveStress: se }, { ...options, pa }).ic
      : Number.NaN
  }
  return out
}

/** The band of an Ic value: 0 below 1.31 … 5 above 3.60 (a boundary value belongs to the band above it); −1 for NaN. */
export function behaviourBand(ic: number): number {
  if (!Number.isFinite(ic)) return -1
  let band = 0
  for (const b of IC_BOUNDARIES) if (ic >= b) band++
  return band
}
