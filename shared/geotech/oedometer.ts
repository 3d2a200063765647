/**
 * Interpretation of one-dimensional compression (oedometer) curves: the
 * preconsolidation stress σ'p by several published constructions side by side,
 * the compression and recompression indices, and the specimen quality.
 *
 * Stresses are vertical effective stresses in kPa; void ratios are dimensionless.
 * Every construction is returned as drawable geometry so a chart can show how the
 * number was obtained; lines in (σ', e) space are straight on a log10 σ' axis.
 */
import { GeotechError } from './errors'

/** One reading of the compression curve at the end of a load stage. */
export interface OedometerPoint {
  /** Vertical effective stress σ' (kPa). */
  stress: number
  /** Void ratio e at the end of the stage. */
  voidRatio: number
}

export const OEDOMETER_METHODS = ['casagrande', 'pachecoSilva', 'work', 'bilinear'] as const
export type OedometerMethod = (typeof OEDOMETER_METHODS)[number]

export interface OedometerInput {
  /** Readings in test order: loading, optionally unload–reload loops, then further loading. */
  points: OedometerPoint[]
  /** Initial void ratio of the specimen before loading; defaults to the first reading. */
  e0?: number
  /** In-situ vertical effective stress σ'v0 (kPa) of the sample, for sample quality and OCR. */
  insituStress?: number
  /** Methods to run; all four when omitted. */
  methods?: readonly OedometerMethod[]
}

/** A straight segment between two points of a chart. */
export interface Segment<P> {
  from: P
  to: P
}

/** A point of the work–stress chart: σ' (kPa) and cumulative work per unit volume W (kJ/m³). */
export interface WorkPoint {
  stress: number
  work: number
}

/** A point of the bilinear chart: σ' (kPa) and 1 + e, both drawn on log axes. */
export interface OnePlusEPoint {
  stress: number
  onePlusE: number
}

/** Casagrande (1936) construction, all in (σ', e) with σ' on a log axis. */
export interface CasagrandeConstruction {
  /** Point of maximum curvature of the smoothed curve. */
  maxCurvature: OedometerPoint
  /** Horizontal line through the point of maximum curvature. */
  horizontal: Segment<OedometerPoint>
  /** Tangent to the smoothed curve at the point of maximum curvature. */
  tangent: Segment<OedometerPoint>
  /** Bisector of the angle between horizontal and tangent, ending on the virgin line. */
  bisector: Segment<OedometerPoint>
  /** Virgin compression line, back-extended to the bisector. */
  virginLine: Segment<OedometerPoint>
  /** Samples of the smoothed curve (natural cubic spline in e–log10 σ'). */
  smoothedCurve: OedometerPoint[]
}

/** Pacheco Silva (1970) construction in (σ', e) with σ' on a log axis. */
export interface PachecoSilvaConstruction {
  /** Horizontal at e0 from the first reading to the virgin line. */
  e0Line: Segment<OedometerPoint>
  /** Vertical from that intersection down to the curve. */
  vertical: Segment<OedometerPoint>
  /** Horizontal from the curve back to the virgin line; ends at σ'p. */
  horizontal: Segment<OedometerPoint>
  /** Virgin compression line over the span of the construction. */
  virginLine: Segment<OedometerPoint>
}

/** Work method (Becker et al. 1987) construction in natural (σ', W) scales. */
export interface WorkConstruction {
  /** Cumulative work at every loading-branch reading. */
  points: WorkPoint[]
  /** Straight-line fit through the readings before yield. */
  preYieldLine: Segment<WorkPoint>
  /** Straight-line fit through the readings after yield. */
  postYieldLine: Segment<WorkPoint>
  /** Intersection of the two lines: σ'p. */
  intersection: WorkPoint
  /** Number of loading-branch readings in the pre-yield fit (the rest are post-yield). */
  splitAfter: number
}

/** Bilinear log(1+e)–log σ' construction (Butterfield 1979; Onitsuka et al. 1995). */
export interface BilinearConstruction {
  points: OnePlusEPoint[]
  lowerLine: Segment<OnePlusEPoint>
  upperLine: Segment<OnePlusEPoint>
  intersection: OnePlusEPoint
  splitAfter: number
}

export type OedometerResult =
  | { method: 'casagrande', preconsolidation: number, construction: CasagrandeConstruction }
  | { method: 'pachecoSilva', preconsolidation: number, construction: PachecoSilvaConstruction }
  | { method: 'work', preconsolidation: number, construction: WorkConstruction }
  | { method: 'bilinear', preconsolidation: number, construction: BilinearConstruction }

export const SAMPLE_QUALITY_CLASSES = ['very-good-to-excellent', 'good-to-fair', 'poor', 'very-poor'] as const
export type SampleQualityClass = (typeof SAMPLE_QUALITY_CLASSES)[number]

export interface SampleQuality {
  /** e0 − e at reconsolidation to σ'v0. */
  deltaE: number
  deltaEOverE0: number
  /** OCR used to pick the band, σ'p / σ'v0. */
  ocr: number
  /** Method whose σ'p gave the OCR. */
  ocrBasis: OedometerMethod
  /** OCR band of the table that was applied. */
  ocrBand: '1-2' | '2-4'
  class: SampleQualityClass
}

/** An unload–reload loop as read from the test. */
export interface OedometerLoop {
  /** From the reading where unloading began down to the lowest stress. */
  unloading: OedometerPoint[]
  /** From the lowest stress back up while still below the previous maximum. */
  reloading: OedometerPoint[]
}

export interface OedometerInterpretation {
  results: OedometerResult[]
  /** Compression index, −Δe/Δlog10 σ' of the virgin line. */
  cc: number
  /** Recompression index (see `recompressionBasis`). */
  cr: number
  recompressionBasis: 'unload-reload-loop' | 'unloading' | 'early-loading'
  /** Virgin compression line e = intercept + slope·log10 σ' and the readings it was fitted to. */
  virginLine: { slope: number, intercept: number, points: OedometerPoint[] }
  /** Loading branch (monotone envelope) the methods worked on. */
  loading: OedometerPoint[]
  loops: OedometerLoop[]
  e0: number
  sampleQuality?: SampleQuality
  warnings: string[]
}

/** Fewest loading-branch readings any of the constructions can use. */
export const MIN_LOADING_POINTS = 5
/**
 * No-yield criterion (a product choice, common practice in spirit): the virgin slope must be at least this
 * many times the slope of the readings before it, otherwise the curve shows no distinct yield.
 */
export const YIELD_SLOPE_RATIO = 2
/** A chord belongs to the virgin line while its slope is at least this fraction of the line's slope. */
const VIRGIN_CHORD_FRACTION = 0.8
/** Early-recompression readings for Cr are those below σ'p divided by this factor. */
const EARLY_RECOMPRESSION_FACTOR = 1.5

/**
 * Runs the chosen σ'p constructions on one oedometer curve and derives Cc, Cr and sample quality.
 * Throws `GeotechError` for curves that are physically impossible or show no yield.
 */
export function interpretOedometer(input: OedometerInput): OedometerInterpretation {
  const warnings: string[] = []
  const { loading, loops } = splitCurve(input.points)
  if (loading.length < MIN_LOADING_POINTS) {
    throw new GeotechError(
      'too-few-points',
      `The loading branch has ${loading.length} readings; at least ${MIN_LOADING_POINTS} are needed to locate yield.`,
      { detail: { loadingPoints: loading.length, minimum: MIN_LOADING_POINTS } },
    )
  }
  const e0 = input.e0 ?? loading[0]!.voidRatio
  if (!Number.isFinite(e0) || e0 <= 0) {
    throw new GeotechError('void-ratio-not-positive', `The initial void ratio e0 must be a positive number (got ${e0}).`)
  }
  if (input.e0 !== undefined && e0 < loading[0]!.voidRatio) {
    warnings.push(`e0 = ${fmt(e0)} is below the first reading's void ratio ${fmt(loading[0]!.voidRatio)}; check the initial specimen measurements.`)
  }

  const x = loading.map(p => Math.log10(p.stress))
  const e = loading.map(p => p.voidRatio)
  const virgin = findVirginLine(x, e)
  if (virgin.first < 2) {
    if (virgin.first === 0) {
      throw new GeotechError('no-yield', 'The whole loading branch lies on one straight line in e–log σ\': the curve shows no yield, so σ\'p cannot be found.')
    }
    throw new GeotechError(
      'yield-not-bracketed',
      'Only the first reading lies before the virgin compression line: σ\'p is at or below the second load stage. A test starting at a lower stress is needed.',
    )
  }
  const pre = fitLine(x, e, 0, virgin.first)
  const initialSlope = -pre.slope
  const cc = -virgin.line.slope
  if (cc <= 0 || cc < YIELD_SLOPE_RATIO * Math.max(initialSlope, 0)) {
    throw new GeotechError(
      'no-yield',
      `The steepest part of the curve (slope ${fmt(cc)}) is less than ${YIELD_SLOPE_RATIO} times the slope before it (${fmt(initialSlope)}): the curve shows no distinct yield, so σ'p cannot be found.`,
      { detail: { virginSlope: cc, initialSlope, requiredRatio: YIELD_SLOPE_RATIO } },
    )
  }
  const virginCount = loading.length - virgin.first
  if (virginCount < 3) {
    warnings.push('The virgin compression line rests on only the last two readings; σ\'p and Cc are less certain. Load further if the test allows.')
  }

  const methods = input.methods ?? OEDOMETER_METHODS
  const results: OedometerResult[] = []
  for (const method of methods) {
    const result = runMethod(method, loading, x, e, e0, virgin, warnings)
    if (result) results.push(result)
  }
  if (results.length === 0) {
    throw new GeotechError('no-yield', 'None of the chosen methods could locate σ\'p on this curve.', { detail: { methods: [...methods] } })
  }

  const adopted = results.find(r => r.method === 'casagrande') ?? results[0]!
  const recompression = recompressionIndex(loops, loading, x, e, adopted.preconsolidation, warnings)

  let sampleQuality: SampleQuality | undefined
  if (input.insituStress !== undefined) {
    sampleQuality = assessSampleQuality(loading, x, e0, input.insituStress, adopted, input.e0 === undefined, warnings)
  }

  return {
    results,
    cc,
    cr: recompression.cr,
    recompressionBasis: recompression.basis,
    virginLine: { slope: virgin.line.slope, intercept: virgin.line.intercept, points: loading.slice(virgin.first) },
    loading,
    loops,
    e0,
    sampleQuality,
    warnings,
  }
}

/**
 * Class of Δe/e0 for the OCR band, after Lunne, Berre & Strandvik (1997), table values (memory):
 * OCR 1–2: < 0.04, 0.04–0.07, 0.07–0.14, > 0.14; OCR 2–4: < 0.03, 0.03–0.05, 0.05–0.10, > 0.10.
 * A value on a boundary takes the poorer class (common practice). OCR < 1 uses the 1–2 band and
 * OCR > 4 the 2–4 band, outside the table's range.
 */
export function classifySampleQuality(deltaEOverE0: number, ocr: number): { class: SampleQualityClass, ocrBand: '1-2' | '2-4' } {
  if (!Number.isFinite(deltaEOverE0)) {
    throw new GeotechError('sample-quality-not-finite', 'Δe/e0 must be a finite number.')
  }
  if (!Number.isFinite(ocr) || ocr <= 0) {
    throw new GeotechError('ocr-not-positive', `OCR must be a positive number (got ${ocr}).`)
  }
  const ocrBand = ocr < 2 ? '1-2' : '2-4'
  const limits = ocrBand === '1-2' ? LUNNE_LIMITS_OCR_1_2 : LUNNE_LIMITS_OCR_2_4
  const index = limits.findIndex(limit => deltaEOverE0 < limit)
  return { class: SAMPLE_QUALITY_CLASSES[index === -1 ? 3 : index]!, ocrBand }
}

/** Upper limits of the first three classes, Lunne, Berre & Strandvik (1997), OCR 1–2 (memory). */
export const LUNNE_LIMITS_OCR_1_2 = [0.04, 0.07, 0.14] as const
/** Upper limits of the first three classes, Lunne, Berre & Strandvik (1997), OCR 2–4 (memory). */
export const LUNNE_LIMITS_OCR_2_4 = [0.03, 0.05, 0.10] as const

// ---------------------------------------------------------------------------
// Reading the test: loading envelope and loops
// ---------------------------------------------------------------------------

/** Separates the monotone loading envelope from unload–reload loops, validating each reading. */
function splitCurve(points: OedometerPoint[]): { loading: OedometerPoint[], loops: OedometerLoop[] } {
  if (!Array.isArray(points) || points.length === 0) {
    throw new GeotechError('too-few-points', 'The compression curve has no readings.')
  }
  points.forEach((p, i) => {
    if (!Number.isFinite(p.stress) || p.stress <= 0) {
      throw new GeotechError('stress-not-positive', `Reading ${i + 1}: the effective stress must be a positive number (got ${p.stress} kPa).`, { detail: { index: i } })
    }
    if (!Number.isFinite(p.voidRatio) || p.voidRatio <= 0) {
      throw new GeotechError('void-ratio-not-positive', `Reading ${i + 1}: the void ratio must be a positive number (got ${p.voidRatio}).`, { detail: { index: i } })
    }
  })

  const loading: OedometerPoint[] = [points[0]!]
  const loops: OedometerLoop[] = []
  let loop: OedometerLoop | undefined
  let peak = points[0]!.stress
  for (let i = 1; i < points.length; i++) {
    const p = points[i]!
    const prev = points[i - 1]!
    if (p.stress === prev.stress) {
      throw new GeotechError(
        'stress-not-increasing',
        `Readings ${i} and ${i + 1} are at the same stress (${p.stress} kPa); each load stage must change the stress.`,
        { detail: { index: i } },
      )
    }
    if (p.stress > peak) {
      const last = loading[loading.length - 1]!
      if (p.voidRatio > last.voidRatio + 1e-12) {
        throw new GeotechError(
          'void-ratio-increasing',
          `Reading ${i + 1}: the void ratio rises from ${fmt(last.voidRatio)} to ${fmt(p.voidRatio)} while the load increases from ${last.stress} to ${p.stress} kPa; under loading it must not increase.`,
          { detail: { index: i } },
        )
      }
      loop = undefined
      loading.push(p)
      peak = p.stress
    }
    else if (p.stress < prev.stress) {
      if (!loop || loop.reloading.length > 0) {
        loop = { unloading: [prev], reloading: [] }
        loops.push(loop)
      }
      loop.unloading.push(p)
    }
    else {
      // Rising again but not beyond the previous maximum: reloading inside the loop.
      if (loop && loop.reloading.length === 0) loop.reloading.push(prev)
      loop?.reloading.push(p)
    }
  }
  return { loading, loops }
}

// ---------------------------------------------------------------------------
// Virgin line
// ---------------------------------------------------------------------------

interface Line {
  slope: number
  intercept: number
  sse: number
}

interface VirginLine {
  /** Index of the first loading reading on the virgin line. */
  first: number
  line: Line
}

/**
 * Virgin compression line: starting from the last two readings, earlier readings join while the chord
 * leading into the set is at least 80 % as steep as the fitted line (a product choice that keeps
 * the rounded yield zone out of the line).
 */
function findVirginLine(x: number[], e: number[]): VirginLine {
  const n = x.length
  let first = n - 2
  let line = fitLine(x, e, first, n)
  while (first > 0) {
    const j = first - 1
    const chord = -(e[j + 1]! - e[j]!) / (x[j + 1]! - x[j]!)
    if (chord >= VIRGIN_CHORD_FRACTION * -line.slope) {
      first = j
      line = fitLine(x, e, first, n)
    }
    else break
  }
  return { first, line }
}

/** Least-squares straight line through x[from..to), y[from..to). */
function fitLine(x: readonly number[], y: readonly number[], from: number, to: number): Line {
  const n = to - from
  let mx = 0
  let my = 0
  for (let i = from; i < to; i++) {
    mx += x[i]!
    my += y[i]!
  }
  mx /= n
  my /= n
  let sxx = 0
  let sxy = 0
  for (let i = from; i < to; i++) {
    sxx += (x[i]! - mx) ** 2
    sxy += (x[i]! - mx) * (y[i]! - my)
  }
  const slope = sxx > 0 ? sxy / sxx : 0
  const intercept = my - slope * mx
  let sse = 0
  for (let i = from; i < to; i++) sse += (y[i]! - intercept - slope * x[i]!) ** 2
  return { slope, intercept, sse }
}

/** Two straight lines over a split of the readings (each side ≥ 2), the split minimising total squared error. */
function bestTwoLineSplit(x: readonly number[], y: readonly number[]): { split: number, lower: Line, upper: Line } {
  const n = x.length
  let best: { split: number, lower: Line, upper: Line } | undefined
  for (let k = 2; k <= n - 2; k++) {
    const lower = fitLine(x, y, 0, k)
    const upper = fitLine(x, y, k, n)
    if (!best || lower.sse + upper.sse < best.lower.sse + best.upper.sse - 1e-15) best = { split: k, lower, upper }
  }
  return best!
}

// ---------------------------------------------------------------------------
// Methods
// ---------------------------------------------------------------------------

function runMethod(
  method: OedometerMethod,
  loading: OedometerPoint[],
  x: number[],
  e: number[],
  e0: number,
  virgin: VirginLine,
  warnings: string[],
): OedometerResult | undefined {
  switch (method) {
    case 'casagrande': return casagrande(x, e, virgin, warnings)
    case 'pachecoSilva': return pachecoSilva(x, e, e0, virgin, warnings)
    case 'work': return workMethod(loading, e0, warnings)
    case 'bilinear': return bilinearMethod(loading, warnings)
    default: {
      const unknown: never = method
      throw new GeotechError('unknown-method', `Unknown interpretation method "${String(unknown)}".`)
    }
  }
}

/**
 * Casagrande (1936). The curve is smoothed with a natural cubic spline in e–log10 σ'; curvature is taken
 * as it would appear on a square chart spanning the data (both axes scaled to unit length), since the
 * graphical construction depends on the chart's proportions. The search runs from the first reading to
 * the start of the virgin line.
 */
function casagrande(x: number[], e: number[], virgin: VirginLine, warnings: string[]): OedometerResult | undefined {
  const spline = naturalCubicSpline(x, e)
  const n = x.length
  const spanX = x[n - 1]! - x[0]!
  const spanE = Math.max(...e) - Math.min(...e)
  const scale = spanX / spanE // converts de/dx into the square chart's slope
  const samplesPerInterval = 64
  let bestX = x[0]!
  let bestK = -Infinity
  for (let i = 0; i < virgin.first; i++) {
    for (let s = 0; s <= samplesPerInterval; s++) {
      const xi = x[i]! + (x[i + 1]! - x[i]!) * (s / samplesPerInterval)
      const d1 = spline.d1(xi) * scale
      const d2 = spline.d2(xi) * scale * spanX
      const kappa = -d2 / (1 + d1 * d1) ** 1.5
      if (kappa > bestK) {
        bestK = kappa
        bestX = xi
      }
    }
  }
  if (!(bestK > 0)) {
    warnings.push('Casagrande: the smoothed curve never bends toward the virgin line before it starts; no point of maximum curvature.')
    return undefined
  }
  const eM = spline.value(bestX)
  const tangentSlope = spline.d1(bestX)
  const bisectorSlope = Math.tan(Math.atan(tangentSlope * scale) / 2) / scale
  const { slope: sv, intercept: av } = virgin.line
  const xStar = (eM - bisectorSlope * bestX - av) / (sv - bisectorSlope)
  if (!Number.isFinite(xStar) || xStar < x[0]! || xStar > x[n - 1]!) {
    warnings.push('Casagrande: the bisector meets the virgin line outside the tested stress range; result withheld.')
    return undefined
  }
  if (bestX <= x[0]! + 1e-12) {
    warnings.push('Casagrande: maximum curvature falls on the first reading; the test may have started too close to σ\'p.')
  }
  const sigmaP = 10 ** xStar
  const at = (xx: number, ee: number): OedometerPoint => ({ stress: 10 ** xx, voidRatio: ee })
  const half = 0.15 * spanX
  const smoothedCurve: OedometerPoint[] = []
  const curveSamples = 120
  for (let s = 0; s <= curveSamples; s++) {
    const xi = x[0]! + spanX * (s / curveSamples)
    smoothedCurve.push(at(xi, spline.value(xi)))
  }
  const eStar = av + sv * xStar
  const virginFrom = Math.min(xStar, x[virgin.first]!)
  return {
    method: 'casagrande',
    preconsolidation: sigmaP,
    construction: {
      maxCurvature: at(bestX, eM),
      horizontal: { from: at(bestX, eM), to: at(Math.max(x[n - 1]!, xStar), eM) },
      tangent: { from: at(bestX - half, eM - tangentSlope * half), to: at(bestX + half, eM + tangentSlope * half) },
      bisector: { from: at(bestX, eM), to: at(xStar, eStar) },
      virginLine: { from: at(virginFrom, av + sv * virginFrom), to: at(x[n - 1]!, av + sv * x[n - 1]!) },
      smoothedCurve,
    },
  }
}

/**
 * Pacheco Silva (1970): horizontal at e0 to the virgin line, vertically down to the curve, horizontally
 * back to the virgin line. The curve between readings is a monotone cubic in e–log10 σ' (Fritsch & Carlson 1980).
 */
function pachecoSilva(x: number[], e: number[], e0: number, virgin: VirginLine, warnings: string[]): OedometerResult | undefined {
  const { slope: sv, intercept: av } = virgin.line
  const x1 = (e0 - av) / sv
  let eCurve: number
  if (x1 < x[0]!) {
    eCurve = e[0]!
    warnings.push('Pacheco Silva: the e0 line meets the virgin line below the first load stage; the curve there is taken at the first reading.')
  }
  else if (x1 > x[x.length - 1]!) {
    warnings.push('Pacheco Silva: the e0 line meets the virgin line beyond the last reading; result withheld.')
    return undefined
  }
  else {
    eCurve = monotoneCubic(x, e)(x1)
  }
  const x2 = (eCurve - av) / sv
  const at = (xx: number, ee: number): OedometerPoint => ({ stress: 10 ** xx, voidRatio: ee })
  const last = x[x.length - 1]!
  return {
    method: 'pachecoSilva',
    preconsolidation: 10 ** x2,
    construction: {
      e0Line: { from: at(Math.min(x[0]!, x1), e0), to: at(x1, e0) },
      vertical: { from: at(x1, e0), to: at(x1, eCurve) },
      horizontal: { from: at(x1, eCurve), to: at(x2, eCurve) },
      virginLine: { from: at(x1, e0), to: at(last, av + sv * last) },
    },
  }
}

/**
 * Work method (Becker et al. 1987): W accumulates σ'·Δε by the trapezoidal rule with ε = (e0 − e)/(1 + e0),
 * starting from zero work at e0. Two straight lines in natural (σ', W) scales, split where total squared
 * error is least; σ'p at their intersection.
 */
function workMethod(loading: OedometerPoint[], e0: number, warnings: string[]): OedometerResult | undefined {
  const stress = loading.map(p => p.stress)
  const work: number[] = []
  let w = 0
  let prevStress = 0
  let prevStrain = 0
  for (const p of loading) {
    const strain = (e0 - p.voidRatio) / (1 + e0)
    w += 0.5 * (prevStress + p.stress) * (strain - prevStrain)
    work.push(w)
    prevStress = p.stress
    prevStrain = strain
  }
  const { split, lower, upper } = bestTwoLineSplit(stress, work)
  const sigmaP = (upper.intercept - lower.intercept) / (lower.slope - upper.slope)
  if (!Number.isFinite(sigmaP) || sigmaP < stress[0]! || sigmaP > stress[stress.length - 1]!) {
    warnings.push('Work method: the pre- and post-yield lines do not meet inside the tested stress range; result withheld.')
    return undefined
  }
  const wAt = (line: Line, s: number): WorkPoint => ({ stress: s, work: line.intercept + line.slope * s })
  const last = stress[stress.length - 1]!
  return {
    method: 'work',
    preconsolidation: sigmaP,
    construction: {
      points: loading.map((p, i) => ({ stress: p.stress, work: work[i]! })),
      preYieldLine: { from: wAt(lower, 0), to: wAt(lower, sigmaP) },
      postYieldLine: { from: wAt(upper, sigmaP), to: wAt(upper, last) },
      intersection: wAt(lower, sigmaP),
      splitAfter: split,
    },
  }
}

/**
 * Bilinear log(1+e)–log σ' (Butterfield 1979; Onitsuka et al. 1995): two straight lines in
 * log10(1+e)–log10 σ', split where total squared error is least; σ'p at their intersection.
 */
function bilinearMethod(loading: OedometerPoint[], warnings: string[]): OedometerResult | undefined {
  const lx = loading.map(p => Math.log10(p.stress))
  const ly = loading.map(p => Math.log10(1 + p.voidRatio))
  const { split, lower, upper } = bestTwoLineSplit(lx, ly)
  const xStar = (upper.intercept - lower.intercept) / (lower.slope - upper.slope)
  if (!Number.isFinite(xStar) || xStar < lx[0]! || xStar > lx[lx.length - 1]!) {
    warnings.push('Bilinear log(1+e): the two lines do not meet inside the tested stress range; result withheld.')
    return undefined
  }
  const at = (line: Line, xx: number): OnePlusEPoint => ({ stress: 10 ** xx, onePlusE: 10 ** (line.intercept + line.slope * xx) })
  return {
    method: 'bilinear',
    preconsolidation: 10 ** xStar,
    construction: {
      points: loading.map(p => ({ stress: p.stress, onePlusE: 1 + p.voidRatio })),
      lowerLine: { from: at(lower, lx[0]!), to: at(lower, xStar) },
      upperLine: { from: at(upper, xStar), to: at(upper, lx[lx.length - 1]!) },
      intersection: at(lower, xStar),
      splitAfter: split,
    },
  }
}

// ---------------------------------------------------------------------------
// Cr and sample quality
// ---------------------------------------------------------------------------

/**
 * Cr from the first unload–reload loop: mean of the unloading chord (start of unloading to lowest stress)
 * and the reloading chord (lowest stress to the top of the reload), each −Δe/Δlog10 σ'. Without a reload,
 * the unloading chord alone; without any loop, the least-squares slope of the loading readings below
 * σ'p/1.5 (at least the first two). Choices of this product, common practice.
 */
function recompressionIndex(
  loops: OedometerLoop[],
  loading: OedometerPoint[],
  x: number[],
  e: number[],
  sigmaP: number,
  warnings: string[],
): { cr: number, basis: OedometerInterpretation['recompressionBasis'] } {
  const chord = (a: OedometerPoint, b: OedometerPoint): number => Math.abs(b.voidRatio - a.voidRatio) / Math.abs(Math.log10(b.stress / a.stress))
  const loop = loops[0]
  if (loop) {
    if (loops.length > 1) warnings.push(`The test has ${loops.length} unload–reload loops; Cr is taken from the first.`)
    const start = loop.unloading[0]!
    const bottom = loop.unloading[loop.unloading.length - 1]!
    if (bottom.voidRatio < start.voidRatio) {
      warnings.push('The void ratio fell during unloading; the unload–reload loop looks wrong.')
    }
    const unloadSlope = chord(start, bottom)
    if (loop.reloading.length >= 2) {
      const top = loop.reloading[loop.reloading.length - 1]!
      return { cr: 0.5 * (unloadSlope + chord(bottom, top)), basis: 'unload-reload-loop' }
    }
    return { cr: unloadSlope, basis: 'unloading' }
  }
  let count = 0
  while (count < loading.length && loading[count]!.stress <= sigmaP / EARLY_RECOMPRESSION_FACTOR) count++
  count = Math.max(count, 2)
  return { cr: -fitLine(x, e, 0, count).slope, basis: 'early-loading' }
}

/**
 * Δe/e0 at reconsolidation to σ'v0 (Lunne, Berre & Strandvik 1997), e at σ'v0 interpolated linearly in
 * log10 σ' along the loading branch; classed by the OCR band from the adopted σ'p.
 */
function assessSampleQuality(
  loading: OedometerPoint[],
  x: number[],
  e0: number,
  insituStress: number,
  adopted: OedometerResult,
  e0Assumed: boolean,
  warnings: string[],
): SampleQuality | undefined {
  if (!Number.isFinite(insituStress) || insituStress <= 0) {
    throw new GeotechError('effective-stress-not-positive', `The in-situ effective stress must be a positive number (got ${insituStress} kPa).`)
  }
  const xv = Math.log10(insituStress)
  if (xv < x[0]! || xv > x[x.length - 1]!) {
    warnings.push(`Sample quality: σ'v0 = ${fmt(insituStress)} kPa is outside the loaded range (${fmt(loading[0]!.stress)}–${fmt(loading[loading.length - 1]!.stress)} kPa); Δe/e0 not assessed.`)
    return undefined
  }
  if (e0Assumed) warnings.push('Sample quality: e0 was not given, so the first reading stands in for it and Δe/e0 is understated.')
  let i = 0
  while (i < x.length - 2 && x[i + 1]! < xv) i++
  const t = (xv - x[i]!) / (x[i + 1]! - x[i]!)
  const eV = loading[i]!.voidRatio + t * (loading[i + 1]!.voidRatio - loading[i]!.voidRatio)
  const deltaE = e0 - eV
  const deltaEOverE0 = deltaE / e0
  if (deltaE < 0) warnings.push('Sample quality: the void ratio at σ\'v0 is above e0 (the specimen swelled); check e0.')
  const ocr = adopted.preconsolidation / insituStress
  if (ocr < 1) warnings.push(`Sample quality: OCR = ${fmt(ocr)} is below 1, outside the table; the OCR 1–2 limits are applied.`)
  if (ocr > 4) warnings.push(`Sample quality: OCR = ${fmt(ocr)} is above 4, outside the table; the OCR 2–4 limits are applied.`)
  const classed = classifySampleQuality(deltaEOverE0, ocr)
  return { deltaE, deltaEOverE0, ocr, ocrBasis: adopted.method, ocrBand: classed.ocrBand, class: classed.class }
}

// ---------------------------------------------------------------------------
// Interpolants
// ---------------------------------------------------------------------------

interface Spline {
  value: (x: number) => number
  d1: (x: number) => number
  d2: (x: number) => number
}

/** Natural cubic spline (zero end curvature) through strictly increasing x; C2-continuous so curvature is defined everywhere. */
function naturalCubicSpline(x: readonly number[], y: readonly number[]): Spline {
  const n = x.length
  const m = new Float64Array(n) // second derivatives
  const c = new Float64Array(n)
  const d = new Float64Array(n)
  // Thomas algorithm for the tridiagonal system of interior second derivatives.
  for (let i = 1; i < n - 1; i++) {
    const h0 = x[i]! - x[i - 1]!
    const h1 = x[i + 1]! - x[i]!
    const a = h0 / 6
    const b = (h0 + h1) / 3
    const cc = h1 / 6
    const rhs = (y[i + 1]! - y[i]!) / h1 - (y[i]! - y[i - 1]!) / h0
    const denom = b - a * c[i - 1]!
    c[i] = cc / denom
    d[i] = (rhs - a * d[i - 1]!) / denom
  }
  for (let i = n - 2; i >= 1; i--) m[i] = d[i]! - c[i]! * m[i + 1]!
  const locate = (xx: number): number => {
    let lo = 0
    let hi = n - 2
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1
      if (x[mid]! <= xx) lo = mid
      else hi = mid - 1
    }
    return lo
  }
  return {
    value(xx) {
      const i = locate(xx)
      const h = x[i + 1]! - x[i]!
      const a = (x[i + 1]! - xx) / h
      const b = (xx - x[i]!) / h
      return a * y[i]! + b * y[i + 1]! + ((a ** 3 - a) * m[i]! + (b ** 3 - b) * m[i + 1]!) * (h * h) / 6
    },
    d1(xx) {
      const i = locate(xx)
      const h = x[i + 1]! - x[i]!
      const a = (x[i + 1]! - xx) / h
      const b = (xx - x[i]!) / h
      return (y[i + 1]! - y[i]!) / h - ((3 * a * a - 1) * m[i]! - (3 * b * b - 1) * m[i + 1]!) * h / 6
    },
    d2(xx) {
      const i = locate(xx)
      const h = x[i + 1]! - x[i]!
      const a = (x[i + 1]! - xx) / h
      return a * m[i]! + (1 - a) * m[i + 1]!
    },
  }
}

/** Monotone piecewise cubic Hermite interpolant (Fritsch & Carlson 1980) through increasing x: never invents a rise between falling readings. */
export function monotoneCubic(x: readonly number[], y: readonly number[]): (xx: number) => number {
  const n = x.length
  const delta = new Float64Array(n - 1)
  for (let i = 0; i < n - 1; i++) delta[i] = (y[i + 1]! - y[i]!) / (x[i + 1]! - x[i]!)
  const slope = new Float64Array(n)
  slope[0] = delta[0]!
  slope[n - 1] = delta[n - 2]!
  for (let i = 1; i < n - 1; i++) {
    const d0 = delta[i - 1]!
    const d1 = delta[i]!
    if (d0 * d1 <= 0) slope[i] = 0
    else {
      const h0 = x[i]! - x[i - 1]!
      const h1 = x[i + 1]! - x[i]!
      const w1 = 2 * h1 + h0
      const w2 = h1 + 2 * h0
      slope[i] = (w1 + w2) / (w1 / d0 + w2 / d1)
    }
  }
  return (xx) => {
    let i = 0
    while (i < n - 2 && x[i + 1]! < xx) i++
    const h = x[i + 1]! - x[i]!
    const t = (xx - x[i]!) / h
    const t2 = t * t
    const t3 = t2 * t
    return (2 * t3 - 3 * t2 + 1) * y[i]! + (t3 - 2 * t2 + t) * h * slope[i]! + (-2 * t3 + 3 * t2) * y[i + 1]! + (t3 - t2) * h * slope[i + 1]!
  }
}

function fmt(value: number): string {
  return Number.isFinite(value) ? Number(value.toPrecision(4)).toString() : String(value)
}
