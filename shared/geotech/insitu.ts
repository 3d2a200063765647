/**
 * Preconsolidation stress from in-situ tests — piezocone (CPTu) and field vane — and the liquid-limit
 * check on the compression index. All stresses and cone readings are in kPa.
 */
import { GeotechError } from './errors'

// ---------------------------------------------------------------------------
// CPTu, single readings
// ---------------------------------------------------------------------------

/**
 * Corrected cone resistance qt = qc + u2·(1 − a): pore pressure acting behind the cone on the
 * unequal end areas (Campanella, Gillespie & Robertson 1982; Lunne, Robertson & Powell 1997 — memory).
 */
export function correctCone(input: { qc: number, u2: number, areaRatio: number }): number {
  const { qc, u2, areaRatio } = input
  requireFinite(qc, 'cone resistance qc')
  requireFinite(u2, 'pore pressure u2')
  checkAreaRatio(areaRatio)
  if (qc < 0) throw new GeotechError('cone-resistance-negative', `The cone resistance qc cannot be negative (got ${qc} kPa).`)
  return qc + u2 * (1 - areaRatio)
}

/** Net cone resistance qnet = qt − σv0 (total stress), the part of the resistance mobilised by the soil's strength. */
export function netConeResistance(qt: number, totalStress: number): number {
  requireFinite(qt, 'corrected cone resistance qt')
  requireFinite(totalStress, 'total vertical stress σv0')
  const qnet = qt - totalStress
  if (qnet <= 0) {
    throw new GeotechError(
      'net-cone-resistance-not-positive',
      `The corrected cone resistance (${qt} kPa) does not exceed the total overburden stress (${totalStress} kPa); the reading is unusable for stress history.`,
    )
  }
  return qnet
}

/** Friction ratio Rf = fs/qt·100 (%), used with qt for soil behaviour charts (common practice). */
export function frictionRatio(fs: number, qt: number): number {
  requireFinite(fs, 'sleeve friction fs')
  requireFinite(qt, 'corrected cone resistance qt')
  if (fs < 0) throw new GeotechError('sleeve-friction-negative', `The sleeve friction cannot be negative (got ${fs} kPa).`)
  if (qt <= 0) throw new GeotechError('cone-resistance-not-positive', `The friction ratio needs a positive qt (got ${qt} kPa).`)
  return (fs / qt) * 100
}

/** Pore pressure ratio Bq = (u2 − u0)/(qt − σv0) (Senneset & Janbu 1985 — memory): excess pore pressure over net resistance. */
export function porePressureRatio(input: { u2: number, u0: number, qt: number, totalStress: number }): number {
  requireFinite(input.u2, 'pore pressure u2')
  requireFinite(input.u0, 'in-situ pore pressure u0')
  return (input.u2 - input.u0) / netConeResistance(input.qt, input.totalStress)
}

/** Default cone factor for clays, σ'p ≈ 0.33·qnet (Mayne 1995; Kulhawy & Mayne 1990 — memory). */
export const DEFAULT_CONE_FACTOR = 0.33

/** σ'p = k·qnet (Mayne 1995; Kulhawy & Mayne 1990 — memory); k is adjustable per stratum. */
export function cptPreconsolidation(qnet: number, k: number = DEFAULT_CONE_FACTOR): number {
  requireFinite(qnet, 'net cone resistance qnet')
  checkConeFactor(k)
  if (qnet <= 0) {
    throw new GeotechError('net-cone-resistance-not-positive', `σ'p needs a positive net cone resistance (got ${qnet} kPa).`)
  }
  return k * qnet
}

// ---------------------------------------------------------------------------
// CPTu, whole sounding
// ---------------------------------------------------------------------------

/** Row status codes of a processed sounding; `ok` rows carry every derived value. */
export const CPT_ROW_STATUS = {
  ok: 0,
  /** qt ≤ σv0: σ'p, OCR and Bq are NaN. */
  netResistanceNotPositive: 1,
  /** σ'v0 ≤ 0 from the stress model: OCR is NaN; σ'p from qnet is still given. */
  effectiveStressNotPositive: 2,
  /** A reading is missing or not a number: every derived value is NaN. */
  readingNotFinite: 3,
} as const

/** In-situ stresses at a depth, as given by the ground model. */
export interface InsituStress {
  /** Total vertical stress σv0 (kPa). */
  totalStress: number
  /** Pore water pressure u0 (kPa). */
  porePressure: number
}

export interface CptProfileInput {
  /** Depths (m), strictly increasing. */
  depth: ArrayLike<number>
  /** Measured cone resistance qc (kPa). */
  qc: ArrayLike<number>
  /** Sleeve friction fs (kPa). */
  fs: ArrayLike<number>
  /** Pore pressure behind the cone u2 (kPa). */
  u2: ArrayLike<number>
  /** Net area ratio a of the cone. */
  areaRatio: number
  /** Stresses of the ground model at a depth. */
  stressAt: (depth: number) => InsituStress
  /** Cone factor k: a constant or a function of depth (per stratum). Defaults to 0.33. */
  k?: number | ((depth: number) => number)
}

export interface CptProfile {
  depth: Float64Array
  qt: Float64Array
  qnet: Float64Array
  totalStress: Float64Array
  porePressure: Float64Array
  effectiveStress: Float64Array
  frictionRatio: Float64Array
  porePressureRatio: Float64Array
  preconsolidation: Float64Array
  ocr: Float64Array
  /** One of `CPT_ROW_STATUS` per row. */
  status: Uint8Array
  /** Number of rows whose status is not `ok`. */
  flaggedRows: number
}

/**
 * Processes a whole sounding in one pass into typed arrays (a sounding has thousands of rows).
 * Noisy rows do not abort the profile: they are flagged in `status` and their derived values are NaN.
 */
export function cptProfile(input: CptProfileInput): CptProfile {
  const { depth, qc, fs, u2, areaRatio, stressAt } = input
  const n = depth.length
  if (qc.length !== n || fs.length !== n || u2.length !== n) {
    throw new GeotechError(
      'array-length-mismatch',
      `Depth, qc, fs and u2 must have the same number of rows (got ${n}, ${qc.length}, ${fs.length}, ${u2.length}).`,
    )
  }
  checkAreaRatio(areaRatio)
  const kInput = input.k ?? DEFAULT_CONE_FACTOR
  if (typeof kInput === 'number') checkConeFactor(kInput)

  const out: CptProfile = {
    depth: new Float64Array(n),
    qt: new Float64Array(n),
    qnet: new Float64Array(n),
    totalStress: new Float64Array(n),
    porePressure: new Float64Array(n),
    effectiveStress: new Float64Array(n),
    frictionRatio: new Float64Array(n),
    porePressureRatio: new Float64Array(n),
    preconsolidation: new Float64Array(n),
    ocr: new Float64Array(n),
    status: new Uint8Array(n),
    flaggedRows: 0,
  }
  const factor = 1 - areaRatio
  let previousDepth = -Infinity
  for (let i = 0; i < n; i++) {
    const z = depth[i]!
    if (!Number.isFinite(z)) throw new GeotechError('depth-not-finite', `Row ${i + 1}: the depth is not a number.`)
    if (z <= previousDepth) {
      throw new GeotechError('depth-not-increasing', `Row ${i + 1}: depth ${z} m does not increase on the row above (${previousDepth} m).`, { depth: z })
    }
    previousDepth = z
    out.depth[i] = z
    const q = qc[i]!
    const f = fs[i]!
    const u = u2[i]!
    const stress = stressAt(z)
    const sv = stress.totalStress
    const u0 = stress.porePressure
    out.totalStress[i] = sv
    out.porePressure[i] = u0
    out.effectiveStress[i] = sv - u0
    if (!Number.isFinite(q) || !Number.isFinite(f) || !Number.isFinite(u) || !Number.isFinite(sv) || !Number.isFinite(u0)) {
      out.qt[i] = out.qnet[i] = out.frictionRatio[i] = out.porePressureRatio[i] = out.preconsolidation[i] = out.ocr[i] = Number.NaN
      out.status[i] = CPT_ROW_STATUS.readingNotFinite
      out.flaggedRows++
      continue
    }
    const qt = q + u * factor
    const qnet = qt - sv
    out.qt[i] = qt
    out.qnet[i] = qnet
    out.frictionRatio[i] = qt > 0 ? (f / qt) * 100 : Number.NaN
    if (qnet <= 0) {
      out.porePressureRatio[i] = out.preconsolidation[i] = out.ocr[i] = Number.NaN
      out.status[i] = CPT_ROW_STATUS.netResistanceNotPositive
      out.flaggedRows++
      continue
    }
    const k = typeof kInput === 'number' ? kInput : kInput(z)
    if (typeof kInput !== 'number') checkConeFactor(k, z)
    const sigmaP = k * qnet
    out.porePressureRatio[i] = (u - u0) / qnet
    out.preconsolidation[i] = sigmaP
    const effective = sv - u0
    if (effective > 0) {
      out.ocr[i] = sigmaP / effective
    }
    else {
      out.ocr[i] = Number.NaN
      out.status[i] = CPT_ROW_STATUS.effectiveStressNotPositive
      out.flaggedRows++
    }
  }
  return out
}

export interface ResampleOptions {
  /** Window height (m). */
  spacing: number
  /** Statistic within a window; `median` (default) resists spikes from shells and gravel. */
  statistic?: 'median' | 'mean'
  /** Top of the first window (m); defaults to the first depth rounded down to a multiple of `spacing`. */
  start?: number
}

export interface ResampledPoint {
  /** Mean depth of the rows that contributed (m): honest when a window is only partly filled. */
  depth: number
  preconsolidation: number
  /** Rows that contributed. */
  count: number
}

/**
 * Thins a σ'p profile to one value per depth window [start + i·s, start + (i+1)·s), skipping NaN rows and
 * dropping empty windows — so a trend fit sees points of comparable weight rather than thousands of rows.
 */
export function resamplePreconsolidation(depth: ArrayLike<number>, preconsolidation: ArrayLike<number>, options: ResampleOptions): ResampledPoint[] {
  const n = depth.length
  if (preconsolidation.length !== n) {
    throw new GeotechError('array-length-mismatch', `Depth and σ'p must have the same number of rows (got ${n} and ${preconsolidation.length}).`)
  }
  const { spacing } = options
  if (!Number.isFinite(spacing) || spacing <= 0) {
    throw new GeotechError('spacing-not-positive', `The resampling spacing must be a positive number of metres (got ${spacing}).`)
  }
  const statistic = options.statistic ?? 'median'
  if (n === 0) return []
  const start = options.start ?? Math.floor(depth[0]! / spacing + 1e-9) * spacing
  const scratch = new Float64Array(n)
  const result: ResampledPoint[] = []
  let window = Number.NaN
  let m = 0
  let depthSum = 0
  const flush = (): void => {
    if (m === 0) return
    const values = scratch.subarray(0, m)
    let value: number
    if (statistic === 'mean') {
      let sum = 0
      for (let j = 0; j < m; j++) sum += values[j]!
      value = sum / m
    }
    else {
      values.sort()
      const mid = m >> 1
      value = m % 2 === 1 ? values[mid]! : 0.5 * (values[mid - 1]! + values[mid]!)
    }
    result.push({ depth: depthSum / m, preconsolidation: value, count: m })
  }
  let previousDepth = -Infinity
  for (let i = 0; i < n; i++) {
    const z = depth[i]!
    if (!Number.isFinite(z)) throw new GeotechError('depth-not-finite', `Row ${i + 1}: the depth is not a number.`)
    if (z < previousDepth) {
      throw new GeotechError('depth-not-increasing', `Row ${i + 1}: depth ${z} m is above the row before it.`, { depth: z })
    }
    previousDepth = z
    if (z < start) continue
    // The small allowance keeps a depth such as 0.3 m in the window [0.3, 0.4) despite binary rounding.
    const w = Math.floor((z - start) / spacing + 1e-9)
    if (w !== window) {
      flush()
      window = w
      m = 0
      depthSum = 0
    }
    const v = preconsolidation[i]!
    if (Number.isFinite(v)) {
      scratch[m++] = v
      depthSum += z
    }
  }
  flush()
  return result
}

// ---------------------------------------------------------------------------
// Field vane
// ---------------------------------------------------------------------------

/** Plasticity index range over which Bjerrum's (1972) correction curve was drawn, roughly (memory). */
export const VANE_CORRECTION_PI_RANGE = [5, 100] as const

/**
 * Bjerrum's (1972) field vane correction μ from the plasticity index, in the closed form
 * μ = 1.7 − 0.54·log10(PI) fitted to Bjerrum's curve by Azzouz, Baligh & Ladd (1983) (memory).
 */
export function vaneCorrectionFactor(plasticityIndex: number): number {
  requireFinite(plasticityIndex, 'plasticity index')
  if (plasticityIndex <= 0) {
    throw new GeotechError('plasticity-index-not-positive', `The vane correction needs a positive plasticity index (got ${plasticityIndex}); it does not apply to non-plastic soils.`)
  }
  return 1.7 - 0.54 * Math.log10(plasticityIndex)
}

export interface VanePreconsolidation {
  preconsolidation: number
  /** Correction factor applied. */
  mu: number
  /** Corrected strength μ·su,FV (kPa). */
  correctedStrength: number
  warnings: string[]
}

/** Mesri's (1975) ratio of mobilised strength to σ'p, su/σ'p ≈ 0.22 (memory). */
export const MESRI_STRENGTH_RATIO = 0.22

/**
 * σ'p = μ·su,FV / 0.22 (Bjerrum 1972 correction, Mesri 1975 ratio — memory). A measured or
 * site-specific μ overrides the plasticity-index estimate.
 */
export function vanePreconsolidation(suFV: number, options: { pi: number, mu?: number, ratio?: number }): VanePreconsolidation {
  requireFinite(suFV, 'vane strength su,FV')
  if (suFV <= 0) throw new GeotechError('vane-strength-not-positive', `The field vane strength must be positive (got ${suFV} kPa).`)
  const ratio = options.ratio ?? MESRI_STRENGTH_RATIO
  if (!Number.isFinite(ratio) || ratio <= 0) {
    throw new GeotechError('strength-ratio-not-positive', `The strength ratio su/σ'p must be positive (got ${ratio}).`)
  }
  const warnings: string[] = []
  let mu: number
  if (options.mu !== undefined) {
    requireFinite(options.mu, 'vane correction factor μ')
    if (options.mu <= 0) throw new GeotechError('vane-correction-not-positive', `The vane correction factor μ must be positive (got ${options.mu}).`)
    mu = options.mu
  }
  else {
    mu = vaneCorrectionFactor(options.pi)
    const [lo, hi] = VANE_CORRECTION_PI_RANGE
    if (options.pi < lo || options.pi > hi) {
      warnings.push(`PI = ${options.pi} is outside the range of Bjerrum's correction curve (about ${lo}–${hi}); μ = ${mu.toFixed(2)} is an extrapolation.`)
    }
  }
  const correctedStrength = mu * suFV
  return { preconsolidation: correctedStrength / ratio, mu, correctedStrength, warnings }
}

// ---------------------------------------------------------------------------
// Index correlation
// ---------------------------------------------------------------------------

/** Cc ≈ 0.009·(LL − 10) for normally consolidated clays of low to medium sensitivity (Terzaghi & Peck 1967, after Skempton 1944). */
export function ccFromLiquidLimit(liquidLimit: number): number {
  requireFinite(liquidLimit, 'liquid limit')
  if (liquidLimit <= 10) {
    throw new GeotechError('liquid-limit-out-of-range', `The Cc–LL correlation needs a liquid limit above 10 % (got ${liquidLimit}).`)
  }
  return 0.009 * (liquidLimit - 10)
}

export interface CompressionIndexCheck {
  estimate: number
  /** measured / estimate. */
  ratio: number
  /** True when measured and estimate differ by more than a factor of two either way. */
  flagged: boolean
  message: string
}

/** Sanity check of a measured Cc against the liquid-limit estimate: a factor of two either way is flagged (common practice). */
export function checkCompressionIndex(measuredCc: number, liquidLimit: number): CompressionIndexCheck {
  requireFinite(measuredCc, 'compression index Cc')
  if (measuredCc <= 0) throw new GeotechError('compression-index-not-positive', `The compression index must be positive (got ${measuredCc}).`)
  const estimate = ccFromLiquidLimit(liquidLimit)
  const ratio = measuredCc / estimate
  // The small allowance keeps a ratio of exactly 2 (or ½) unflagged despite binary rounding.
  const flagged = ratio > 2 * (1 + 1e-12) || ratio < 0.5 * (1 - 1e-12)
  const message = flagged
    ? `Measured Cc = ${measuredCc.toFixed(3)} is ${ratio > 1 ? `${ratio.toFixed(1)} times` : `${(1 / ratio).toFixed(1)} times less than`} the estimate 0.009(LL − 10) = ${estimate.toFixed(3)}; check the test, the sample's sensitivity or its organic content.`
    : `Measured Cc = ${measuredCc.toFixed(3)} is within a factor of two of the estimate 0.009(LL − 10) = ${estimate.toFixed(3)}.`
  return { estimate, ratio, flagged, message }
}

// ---------------------------------------------------------------------------

function requireFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new GeotechError('value-not-finite', `The ${what} must be a finite number (got ${value}).`)
}

function checkAreaRatio(a: number): void {
  if (!Number.isFinite(a) || a <= 0 || a > 1) {
    throw new GeotechError('area-ratio-out-of-range', `The cone area ratio must be greater than 0 and at most 1 (got ${a}).`)
  }
}

function checkConeFactor(k: number, depth?: number): void {
  if (!Number.isFinite(k) || k <= 0) {
    throw new GeotechError('cone-factor-not-positive', `The cone factor k in σ'p = k·qnet must be positive (got ${k}${depth === undefined ? '' : ` at ${depth} m`}).`, { depth })
  }
}
