/**
 * Time–compression readings of one oedometer load stage: the coefficient of consolidation cv by
 * Taylor's square-root-of-time method (Taylor 1948, Fundamentals of Soil Mechanics), and the
 * secondary compression index Cα from the slope of the readings after the end of primary
 * consolidation.
 *
 * Units: time in minutes and gauge readings in mm as the laboratory records them; cv is returned
 * in m²/year (the product's internal unit), the drainage path is given in mm.
 */
import { GeotechError } from '../geotech/errors'
import { monotoneCubic } from '../geotech/oedometer'
import type { TimeReading } from './stages'

/** Time factor at 90 % average consolidation, Terzaghi's theory (Tv90 ≈ 0.848; any consolidation text). */
export const TV90 = 0.848
/** Taylor (1948): the second line's abscissas are 1.15 times those of the initial straight line. */
export const TAYLOR_FACTOR = 1.15
/**
 * Readings used for the initial straight line: those up to this share of the stage's observed
 * compression. Terzaghi's U = √(4Tv/π) holds to within 1 % up to U ≈ 0.6 (any consolidation
 * text), so 40 % of the observed compression stays on the straight part even when secondary
 * compression adds to it (a product choice).
 */
export const INITIAL_LINE_SHARE = 0.4
/** Fewest readings after the load is applied for the method to be tried. */
export const MIN_TIME_READINGS = 5

const MINUTES_PER_YEAR = 365.25 * 24 * 60

export interface TaylorResult {
  /** Corrected zero reading (intercept of the initial line at t = 0), mm. */
  correctedZero: number
  /** Slope of the initial line, mm per √min. */
  initialSlope: number
  /** Readings (with t > 0) in the initial line fit. */
  initialCount: number
  /** Where the 1.15 line meets the curve. */
  t90: number
  d90: number
  /** Reading at 100 % primary, d0 + (d90 − d0)/0.9, and when the curve reaches it (null if within the readings it does not). */
  d100: number
  t100: number | null
  /** cv = Tv90·Hdr²/t90 in m²/year. */
  cv: number
  /** Drainage path used, mm. */
  drainagePath: number
}

export interface SecondaryResult {
  /** Cα = −Δe/Δlog10 t after the end of primary. */
  calpha: number
  /** Readings in the fit (t ≥ t100). */
  count: number
  /** Slope of the gauge readings, mm per log10 cycle of time. */
  slope: number
}

export type TimeCurveOutcome =
  | { ok: true, taylor: TaylorResult, secondary: SecondaryResult | null, notes: string[] }
  | { ok: false, reason: string }

interface Line { slope: number, intercept: number }

function fitLine(x: readonly number[], y: readonly number[]): Line {
  const n = x.length
  let sx = 0
  let sy = 0
  for (let i = 0; i < n; i++) {
    sx += x[i]!
    sy += y[i]!
  }
  const mx = sx / n
  const my = sy / n
  let sxx = 0
  let sxy = 0
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - mx) ** 2
    sxy += (x[i]! - mx) * (y[i]! - my)
  }
  const slope = sxx > 0 ? sxy / sxx : Number.NaN
  return { slope, intercept: my - slope * mx }
}

function checkReadings(readings: readonly TimeReading[]): void {
  readings.forEach((r, i) => {
    if (!Number.isFinite(r.minutes) || r.minutes < 0 || !Number.isFinite(r.dial)) {
      throw new GeotechError('time-reading-invalid', `Reading ${i + 1}: time and gauge reading must be numbers, the time 0 min or later.`)
    }
    if (i > 0 && !(r.minutes > readings[i - 1]!.minutes)) {
      throw new GeotechError('time-not-increasing', `Reading ${i + 1}: the time ${r.minutes} min does not increase on the reading before it.`)
    }
  })
}

/**
 * Taylor's (1948) √t construction on one stage's readings, done numerically:
 * 1. a straight line d = d0 + m·√t through the early readings (up to 40 % of the stage's observed
 *    compression); its intercept d0 is the corrected zero;
 * 2. a second line from d0 with abscissas 1.15 times larger, d = d0 + (m/1.15)·√t;
 * 3. where that line first meets the curve (linear between readings in √t) is √t90;
 * 4. cv = Tv90·Hdr²/t90 with Tv90 = 0.848, Hdr the drainage path.
 * d100 = d0 + (d90 − d0)/0.9 marks the end of primary consolidation.
 */
export function taylorSqrtTime(readings: readonly TimeReading[], drainagePathMm: number): TaylorResult {
  checkReadings(readings)
  if (!Number.isFinite(drainagePathMm) || drainagePathMm <= 0) {
    throw new GeotechError('drainage-path-not-positive', `The drainage path must be a positive number of millimetres (got ${drainagePathMm}).`)
  }
  const timed = readings.filter(r => r.minutes > 0)
  if (timed.length < MIN_TIME_READINGS) {
    throw new GeotechError('too-few-time-readings', `Taylor's method needs at least ${MIN_TIME_READINGS} readings after the load is applied (got ${timed.length}).`)
  }
  const first = readings[0]!.dial
  const total = readings[readings.length - 1]!.dial - first
  if (!(total > 0)) {
    throw new GeotechError('no-compression', 'The gauge readings do not increase over the stage: there is no compression to analyse (an unloading stage, or readings entered the wrong way round).')
  }
  let count = 0
  while (count < timed.length && timed[count]!.dial - first <= INITIAL_LINE_SHARE * total) count++
  count = Math.max(count, 2)
  const s = timed.map(r => Math.sqrt(r.minutes))
  const d = timed.map(r => r.dial)
  const line = fitLine(s.slice(0, count), d.slice(0, count))
  if (!(line.slope > 0)) {
    throw new GeotechError('no-initial-line', 'The early readings do not rise with √t, so Taylor\'s initial straight line cannot be drawn.')
  }
  const d0 = line.intercept
  const slow = line.slope / TAYLOR_FACTOR
  const gap = (i: number): number => d[i]! - (d0 + slow * s[i]!)
  // The curve runs along the steep line first (above the 1.15 line); t90 is where it first drops below it.
  let start = count - 1
  while (start < timed.length && !(gap(start) > 0)) start++
  const curve = monotoneCubic(s, d)
  let s90 = Number.NaN
  for (let i = start + 1; i < timed.length; i++) {
    if (gap(i - 1) > 0 && gap(i) <= 0) {
      // Between the two readings, the curve as a monotone cubic in √t (Fritsch & Carlson 1980); bisection on the gap.
      let lo = s[i - 1]!
      let hi = s[i]!
      for (let k = 0; k < 60; k++) {
        const mid = 0.5 * (lo + hi)
        if (curve(mid) - (d0 + slow * mid) > 0) lo = mid
        else hi = mid
      }
      s90 = 0.5 * (lo + hi)
      break
    }
  }
  if (!Number.isFinite(s90)) {
    throw new GeotechError('t90-not-reached', 'The readings never meet Taylor\'s 1.15 line: the stage ended before 90 % consolidation, so cv cannot be found.')
  }
  const t90 = s90 * s90
  const d90 = d0 + slow * s90
  const d100 = d0 + (d90 - d0) / 0.9
  let t100: number | null = null
  for (let i = 1; i < timed.length; i++) {
    if (d[i - 1]! < d100 && d[i]! >= d100) {
      const f = (d100 - d[i - 1]!) / (d[i]! - d[i - 1]!)
      // Between readings, linear in log t (the curve is close to straight there on a log scale).
      t100 = 10 ** (Math.log10(timed[i - 1]!.minutes) + f * (Math.log10(timed[i]!.minutes) - Math.log10(timed[i - 1]!.minutes)))
      break
    }
  }
  const hdr = drainagePathMm / 1000
  const cv = (TV90 * hdr * hdr) / (t90 / MINUTES_PER_YEAR)
  return { correctedZero: d0, initialSlope: line.slope, initialCount: count, t90, d90, d100, t100, cv, drainagePath: drainagePathMm }
}

/**
 * Cα = Δe per log10 cycle of time from the readings at or after t100 (least squares of d on
 * log10 t), converted from gauge readings by Δe = (1 + e0)·Δd/H0 (common practice). Needs at least
 * three readings after the end of primary; returns null otherwise.
 */
export function secondaryCompressionIndex(readings: readonly TimeReading[], t100: number, basis: { e0: number, specimenHeight: number }): SecondaryResult | null {
  checkReadings(readings)
  const after = readings.filter(r => r.minutes > 0 && r.minutes >= t100 * (1 - 1e-9))
  if (after.length < 3) return null
  const line = fitLine(after.map(r => Math.log10(r.minutes)), after.map(r => r.dial))
  const calpha = (line.slope * (1 + basis.e0)) / basis.specimenHeight
  return { calpha, count: after.length, slope: line.slope }
}

/**
 * One stage's time analysis: Taylor's cv and, when primary ends within the readings, Cα. An
 * unusable stage gives the reason instead of throwing, so one stage never hides the others.
 */
export function analyseTimeCurve(readings: readonly TimeReading[], drainagePathMm: number, basis: { e0: number, specimenHeight: number }): TimeCurveOutcome {
  try {
    const taylor = taylorSqrtTime(readings, drainagePathMm)
    const notes: string[] = []
    if (taylor.initialCount < 3) notes.push('The initial straight line rests on two readings; read earlier times if the test allows.')
    let secondary: SecondaryResult | null = null
    if (taylor.t100 === null) notes.push('The readings do not reach 100 % primary consolidation (Taylor\'s d100), so Cα is not given.')
    else {
      secondary = secondaryCompressionIndex(readings, taylor.t100, basis)
      if (!secondary) notes.push('Fewer than three readings after the end of primary consolidation: Cα is not given.')
    }
    return { ok: true, taylor, secondary, notes }
  }
  catch (err) {
    if (err instanceof GeotechError) return { ok: false, reason: err.message }
    throw err
  }
}

