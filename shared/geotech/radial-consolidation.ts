import { degreeOfConsolidation, timeFactor } from './consolidation'
import { GeotechError } from './errors'

/**
 * Radial consolidation towards prefabricated vertical drains, and its combination with
 * vertical drainage. Units: spacing, diameters and lengths in m; ch, cv in m²/year; t in
 * years; kh in m/year; discharge capacity qw in m³/year.
 *
 * - Equal-strain radial consolidation with smear and well resistance: Hansbo (1981),
 *   Ur = 1 − exp(−8·Th/μ), Th = ch·t/De².
 * - The ideal drain (no smear, no well resistance): Barron (1948).
 * - Vertical and radial flow together: Carrillo (1942), U = 1 − (1 − Uv)(1 − Ur).
 */

export type DrainPatternKind = 'triangular' | 'square'

function requireFinite(value: number, code: string, what: string): void {
  if (!Number.isFinite(value)) {
    throw new GeotechError(code, `${what} must be a finite number (got ${String(value)}).`)
  }
}

function requirePositive(value: number, code: string, what: string, unit = ''): void {
  requireFinite(value, `${code}-invalid`, what)
  if (value <= 0) throw new GeotechError(`${code}-not-positive`, `${what} is ${value}${unit}; it must be positive.`)
}

/**
 * Diameter De of the soil cylinder one drain serves: 1.05·s in a triangular pattern,
 * 1.128·s in a square one (Barron 1948; Hansbo 1981: the circle of the same area as the
 * hexagon or square each drain drains).
 */
export function influenceDiameter(pattern: DrainPatternKind, spacing: number): number {
  requirePositive(spacing, 'drain-spacing', 'The drain spacing', ' m')
  if (pattern === 'triangular') return 1.05 * spacing
  if (pattern === 'square') return 1.128 * spacing
  throw new GeotechError('drain-pattern-invalid', `Unknown drain pattern "${String(pattern)}"; use triangular or square.`)
}

/** Th = ch·t/De² (Hansbo 1981). ch in m²/yr, t in years, De in m. */
export function radialTimeFactor(ch: number, t: number, de: number): number {
  requirePositive(ch, 'ch', 'The horizontal coefficient of consolidation ch', ' m²/yr')
  requireFinite(t, 'time-invalid', 'The time')
  if (t < 0) throw new GeotechError('time-negative', `The time ${t} years is negative.`)
  requirePositive(de, 'influence-diameter', 'The influence diameter', ' m')
  return (ch * t) / (de * de)
}

/**
 * Well resistance term of Hansbo (1981), averaged over the drain's length:
 * π·z·(2l − z)·kh/qw averaged over 0 ≤ z ≤ l is (2/3)·π·l²·kh/qw, where l is the length
 * of drain that discharges through one end (the whole drain when only its top drains).
 * The depth average is common practice for a single figure per layer.
 */
export function wellResistanceTerm(input: { kh: number, dischargeCapacity: number, drainLength: number }): number {
  requirePositive(input.kh, 'kh', 'The horizontal permeability kh', ' m/yr')
  requirePositive(input.dischargeCapacity, 'discharge-capacity', 'The discharge capacity qw', ' m³/yr')
  requirePositive(input.drainLength, 'drain-length', 'The drain length', ' m')
  const l = input.drainLength
  return (2 / 3) * Math.PI * l * l * input.kh / input.dischargeCapacity
}

export interface HansboMuInput {
  /** n = De/dw, > 1. */
  n: number
  /** s = ds/dw, ≥ 1 and < n (1 = no smear). */
  smearRatio: number
  /** kh/ks, ≥ 1 (1 = the smear zone as permeable as the undisturbed soil). */
  permeabilityRatio: number
  /** The well-resistance term (see `wellResistanceTerm`); 0 or left out for none. */
  wellResistance?: number
}

/**
 * μ = ln(n/s) + (kh/ks)·ln(s) − 0.75 + Fr (Hansbo 1981, the simplified form for n ≫ 1;
 * Fr the well resistance). With s = 1 and no well resistance it is ln(n) − 0.75, the
 * large-n limit of Barron's (1948) ideal drain.
 */
export function hansboMu(input: HansboMuInput): number {
  const { n, smearRatio: s, permeabilityRatio: kr } = input
  const fr = input.wellResistance ?? 0
  requireFinite(n, 'spacing-ratio-invalid', 'The spacing ratio n')
  requireFinite(s, 'smear-ratio-invalid', 'The smear ratio')
  requireFinite(kr, 'permeability-ratio-invalid', 'The permeability ratio')
  requireFinite(fr, 'well-resistance-invalid', 'The well resistance')
  if (!(n > 1)) throw new GeotechError('spacing-ratio-too-small', `The spacing ratio n = De/dw is ${n}; the drains must be further apart than their own diameter.`)
  if (s < 1) throw new GeotechError('smear-ratio-too-small', `The smear ratio ds/dw is ${s}; it must be at least 1.`)
  if (!(s < n)) throw new GeotechError('smear-zones-overlap', `The smear zone (ds/dw = ${s}) reaches beyond the drain's influence zone (De/dw = ${n}); space the drains further apart.`)
  if (kr < 1) throw new GeotechError('permeability-ratio-too-small', `The permeability ratio kh/ks is ${kr}; it must be at least 1.`)
  if (fr < 0) throw new GeotechError('well-resistance-negative', `The well resistance ${fr} is negative.`)
  return Math.log(n / s) + kr * Math.log(s) - 0.75 + fr
}

/**
 * Barron's (1948) ideal drain under equal strain: F(n) = n²/(n² − 1)·ln(n) − (3n² − 1)/(4n²).
 * For large n it tends to ln(n) − 0.75.
 */
export function barronIdealMu(n: number): number {
  requireFinite(n, 'spacing-ratio-invalid', 'The spacing ratio n')
  if (!(n > 1)) throw new GeotechError('spacing-ratio-too-small', `The spacing ratio n = De/dw is ${n}; it must be greater than 1.`)
  const n2 = n * n
  return (n2 / (n2 - 1)) * Math.log(n) - (3 * n2 - 1) / (4 * n2)
}

/** Ur = 1 − exp(−8·Th/μ) (Hansbo 1981; Barron 1948 with μ of the ideal drain). */
export function radialDegree(th: number, mu: number): number {
  requireFinite(th, 'time-factor-invalid', 'The radial time factor Th')
  if (th < 0) throw new GeotechError('time-factor-negative', `The radial time factor Th is ${th}; it must be ≥ 0.`)
  requirePositive(mu, 'drain-factor', 'The drain factor μ')
  return 1 - Math.exp((-8 * th) / mu)
}

function checkDegree(u: number, what: string): void {
  if (!(u >= 0 && u <= 1)) {
    requireFinite(u, 'degree-invalid', what)
    throw new GeotechError('degree-out-of-range', `${what} is ${u}; it must be in [0, 1].`)
  }
}

/** U = 1 − (1 − Uv)(1 − Ur) (Carrillo 1942). */
export function combinedDegree(uv: number, ur: number): number {
  checkDegree(uv, 'The vertical degree Uv')
  checkDegree(ur, 'The radial degree Ur')
  return 1 - (1 - uv) * (1 - ur)
}

/** The spacings the design aid searches, m (common practice for band drains). */
export const DRAIN_SPACING_SEARCH = { min: 0.5, max: 5, step: 0.05 } as const

export interface DrainSpacingInput {
  pattern: DrainPatternKind
  /** Target average degree, 0 < U < 1. */
  targetDegree: number
  /** Time the target is to be reached by, years. */
  years: number
  /** m²/yr. */
  ch: number
  /** m²/yr; with `drainagePath`, the vertical drainage counted alongside (Carrillo 1942). */
  cv: number
  /** Vertical drainage path Hdr, m. */
  drainagePath: number
  /** Equivalent drain diameter dw, m. */
  diameter: number
  smearRatio: number
  permeabilityRatio: number
  /** qw, m³/yr: well resistance is counted only when `drainLength` and `kh` are given too. */
  dischargeCapacity?: number
  /** m. */
  drainLength?: number
  /** Horizontal permeability, m/yr (for the well resistance). */
  kh?: number
}

/** The combined degree a spacing gives at `years`. */
export function degreeWithDrains(input: Omit<DrainSpacingInput, 'targetDegree'> & { spacing: number }): number {
  const de = influenceDiameter(input.pattern, input.spacing)
  const fr = input.dischargeCapacity !== undefined && input.drainLength !== undefined && input.kh !== undefined
    ? wellResistanceTerm({ kh: input.kh, dischargeCapacity: input.dischargeCapacity, drainLength: input.drainLength })
    : 0
  const mu = hansboMu({ n: de / input.diameter, smearRatio: input.smearRatio, permeabilityRatio: input.permeabilityRatio, wellResistance: fr })
  const ur = radialDegree(radialTimeFactor(input.ch, input.years, de), mu)
  const uv = degreeOfConsolidation(timeFactor(input.cv, input.years, input.drainagePath))
  return combinedDegree(uv, ur)
}

/**
 * The widest spacing (m) at which the drains reach `targetDegree` by `years`: bisection over
 * s in `DRAIN_SPACING_SEARCH` (U falls as s grows), rounded down to 0.05 m so that the figure
 * given still reaches the target. The search starts where the smear zone fits inside the
 * influence zone. `null` when even the closest spacing in the range falls short; the widest
 * spacing of the range when even it reaches the target.
 */
export function drainSpacingFor(input: DrainSpacingInput): number | null {
  requireFinite(input.targetDegree, 'degree-invalid', 'The target degree')
  if (!(input.targetDegree > 0 && input.targetDegree < 1)) {
    throw new GeotechError('degree-out-of-range', `The target degree is ${input.targetDegree}; it must be between 0 and 1.`)
  }
  requirePositive(input.years, 'time', 'The target time', ' years')
  requirePositive(input.diameter, 'drain-diameter', 'The drain diameter', ' m')
  const factor = input.pattern === 'square' ? 1.128 : 1.05
  // Smallest spacing whose influence zone still holds the smear zone (n > s), with a margin.
  const fits = (input.smearRatio * input.diameter * 1.01) / factor
  const step = DRAIN_SPACING_SEARCH.step
  let lo = Math.max(DRAIN_SPACING_SEARCH.min, Math.ceil(fits / step) * step)
  let hi: number = DRAIN_SPACING_SEARCH.max
  if (lo > hi) return null
  const reaches = (s: number) => degreeWithDrains({ ...input, spacing: s }) >= input.targetDegree
  if (!reaches(lo)) return null
  if (reaches(hi)) return hi
  for (let i = 0; i < 60 && hi - lo > 1e-6; i++) {
    const mid = 0.5 * (lo + hi)
    if (reaches(mid)) lo = mid
    else hi = mid
  }
  const rounded = Math.floor(lo / step + 1e-9) * step
  return Math.round(Math.max(rounded, DRAIN_SPACING_SEARCH.min) * 100) / 100
}
