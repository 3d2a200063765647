/**
 * Trends of preconsolidation stress σ'p with depth inside one stratum: constant σ'p, linear in depth,
 * constant POP, constant OCR and a crust model, fitted by weighted least squares (optionally on ln σ'p),
 * compared by AICc, with a confidence band of the mean response. Depth z in m (positive down), stresses in kPa.
 */
import { inv, lup, lusolve, type LUDecomposition } from 'mathjs'
import tQuantile from '@stdlib/stats-base-dists-t-quantile'
import { GeotechError } from './errors'
import { startSentence } from '../sentence'
import { bracketIndex } from './stress'
import { evaluateTrend, MODEL_NAMES, type CrustBelowModel, type TrendBandPoint, type TrendCandidate, type TrendCovariance, type TrendFit, type TrendModel, type TrendOptions, type TrendPoint } from './trend-model'

export * from './trend-model'

/** Largest number of breakpoint depths tried before refinement, so large point sets stay fast. */
const MAX_BREAKPOINT_CANDIDATES = 120

/**
 * Fits one trend model (or picks among them with `auto`) to the σ'p points of one stratum.
 * Throws `GeotechError` when the points cannot support the model.
 */
export function fitTrend(points: readonly TrendPoint[], options: TrendOptions): TrendFit {
  if (options.model === 'auto') return fitAuto(points, options)
  return fitModel(points, options.model, options)
}

export interface StressPoint {
  depth: number
  effectiveStress: number
}

/** OCR(z) = σ'p(z)/σ'v0(z) from a fitted trend at the given stress points. */
export function ocrProfile(fit: TrendFit, stressPoints: readonly StressPoint[]): Array<StressPoint & { preconsolidation: number, ocr: number }> {
  return stressPoints.map((s) => {
    checkStress(s)
    const preconsolidation = evaluateTrend(fit, s.depth, s.effectiveStress)
    return { depth: s.depth, effectiveStress: s.effectiveStress, preconsolidation, ocr: preconsolidation / s.effectiveStress }
  })
}

/** POP(z) = σ'p(z) − σ'v0(z) from a fitted trend at the given stress points. */
export function popProfile(fit: TrendFit, stressPoints: readonly StressPoint[]): Array<StressPoint & { preconsolidation: number, pop: number }> {
  return stressPoints.map((s) => {
    checkStress(s)
    const preconsolidation = evaluateTrend(fit, s.depth, s.effectiveStress)
    return { depth: s.depth, effectiveStress: s.effectiveStress, preconsolidation, pop: preconsolidation - s.effectiveStress }
  })
}

// ---------------------------------------------------------------------------
// Student t quantile
// ---------------------------------------------------------------------------

/** Quantile of Student's t distribution with `dof` degrees of freedom (stdlib's inverse of the t CDF). */
export function studentTQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1)) throw new GeotechError('probability-out-of-range', `A quantile needs 0 < p < 1 (got ${p}).`)
  if (!(dof > 0) || !Number.isFinite(dof)) throw new GeotechError('degrees-of-freedom-not-positive', `Degrees of freedom must be positive (got ${dof}).`)
  if (p === 0.5) return 0
  if (p < 0.5) return -tQuantile(1 - p, dof)
  return tQuantile(p, dof)
}

// ---------------------------------------------------------------------------
// Auto selection
// ---------------------------------------------------------------------------

/** Failures that rule out one model but not the others. */
const SKIPPABLE = new Set(['too-few-points', 'trend-not-identifiable', 'depths-coincide', 'log-fit-failed', 'no-crust'])

/** Fits every model the points allow and keeps the lowest AICc (Burnham & Anderson 2002 — memory). */
function fitAuto(points: readonly TrendPoint[], options: TrendOptions): TrendFit {
  const haveStress = points.length > 0 && points.every(p => p.effectiveStress !== undefined)
  const models: TrendModel[] = haveStress ? ['constant', 'linear', 'pop', 'ocr', 'crust'] : ['constant', 'linear', 'crust']
  const fits: TrendFit[] = []
  const candidates: TrendCandidate[] = []
  for (const model of models) {
    try {
      const fit = fitModel(points, model, options)
      fits.push(fit)
      candidates.push({ model, aic: fit.aic, aicc: fit.aicc, r2: fit.r2, rmse: fit.rmse, parameters: fit.parameters })
    }
    catch (error) {
      if (!(error instanceof GeotechError) || !SKIPPABLE.has(error.code)) throw error
      candidates.push({ model, skipped: error.message })
    }
  }
  if (fits.length === 0) {
    throw new GeotechError('too-few-points', 'Too few points to fit any σ\'p trend; at least two are needed.', { detail: { points: points.length } })
  }
  const useAicc = fits.some(f => Number.isFinite(f.aicc))
  const score = (f: TrendFit): number => (useAicc ? f.aicc : f.aic)
  const ranked = [...fits].sort((a, b) => score(a) - score(b))
  const best = ranked[0]!
  const label = useAicc ? 'AICc' : 'AIC'
  const name = (f: TrendFit): string => (f.model === 'crust' ? `crust over ${MODEL_NAMES[f.crustBelow ?? 'constant']}` : MODEL_NAMES[f.model])
  const others = ranked.slice(1).map(f => `${name(f)} ${fmtScore(score(f))}`)
  let reason = `${startSentence(name(best))} fits best, with the lowest ${label} (${fmtScore(score(best))})`
  reason += others.length > 0 ? `; the others: ${others.join(', ')}.` : '.'
  const second = ranked[1]
  if (second) {
    const gap = score(second) - score(best)
    reason += gap < 2
      ? ` ${startSentence(name(second))} is within 2 ${label} units (${fmtScore(gap)}), so the data hardly separate the two; choose on geology.`
      : ` The next best, ${name(second)}, is ${fmtScore(gap)} ${label} units higher.`
  }
  if (!useAicc) reason += ' Too few points for the small-sample correction, so plain AIC was compared.'
  const skipped = candidates.filter((c): c is Extract<TrendCandidate, { skipped: string }> => 'skipped' in c)
  if (skipped.length > 0) reason += ` Not fitted: ${skipped.map(c => `${MODEL_NAMES[c.model]} (${c.skipped})`).join('; ')}`
  return { ...best, reason, candidates }
}

// ---------------------------------------------------------------------------
// Single model
// ---------------------------------------------------------------------------

interface Prepared {
  n: number
  sumW: number
  top: number
  bottom: number
  meanAbsY: number
  stressAt: (depth: number) => number
}

function fitModel(points: readonly TrendPoint[], model: TrendModel, options: TrendOptions): TrendFit {
  const logSpace = options.logSpace ?? false
  const confidence = options.confidence ?? 0.95
  if (!(confidence > 0 && confidence < 1)) {
    throw new GeotechError('confidence-out-of-range', `The confidence level must be between 0 and 1 (got ${confidence}).`)
  }
  const bandPoints = options.bandPoints ?? 50
  if (!Number.isInteger(bandPoints) || bandPoints < 2) {
    throw new GeotechError('band-points-out-of-range', `The band needs at least 2 depths (got ${bandPoints}).`)
  }
  if ((model === 'constant' || model === 'linear') && !logSpace) return fitStraight(points, model, confidence, bandPoints)
  if (model === 'constant') return fitStraight(points, model, confidence, bandPoints, true)
  const haveStress = points.length > 0 && points.every(p => p.effectiveStress !== undefined)
  const below: CrustBelowModel = options.crustBelow ?? (haveStress ? 'pop' : 'constant')
  const needStress = model === 'pop' || model === 'ocr' || (model === 'crust' && (below === 'pop' || below === 'ocr'))
  const prepared = prepare(points, needStress, logSpace, options.effectiveStressAt)
  if (model === 'crust') return fitCrust(points, prepared, below, logSpace, confidence, bandPoints)
  const design = designFor(model)
  const solved = solve(points, design, logSpace)
  return finish(model, undefined, solved, design, prepared, logSpace, confidence, bandPoints, namedParameters(model, solved.theta))
}

const SUM_N = 0
const SUM_W = 1
const SUM_MZ = 2
const SUM_MY = 3
const SUM_SZZ = 4
const SUM_SZY = 5
const SUM_SYY = 6
const SUM_ABS_Y = 7
const SUM_TOP = 8
const SUM_BOTTOM = 9
const SUM_SLOTS = 10

/**
 * The single pass over the points, kept in its own small function so the optimised loop is not thrown
 * away by code after it that has not run yet. Accumulates weighted sums shifted by the first point
 * (the shifted-data form, Chan, Golub & LeVeque 1983), so an offset of depth or σ'p costs no accuracy
 * for data like these, without a division per point; writes the means and centred sums into `out`.
 */
function accumulateStraight(points: readonly TrendPoint[], logConstant: boolean, out: Float64Array): void {
  let sw = 0
  let n = 0
  let swz = 0
  let swy = 0
  let swzz = 0
  let swzy = 0
  let swyy = 0
  let sumAbsY = 0
  let top = Infinity
  let bottom = -Infinity
  let z0 = Number.NaN
  let y0 = 0
  const count = points.length
  for (let i = 0; i < count; i++) {
    const p = points[i]!
    const w = p.weight ?? 1
    const z = p.depth
    let y = p.preconsolidation
    if (!(w >= 0 && w < Infinity)) throw badWeight(p, i)
    if (!(z > -Infinity && z < Infinity)) throw badDepth(i)
    if (!(y > 0 && y < Infinity)) throw badPreconsolidation(p, i, logConstant)
    if (w === 0) continue
    if (logConstant) y = Math.log(y)
    if (n === 0) {
      z0 = z
      y0 = y
    }
    n++
    const dz = z - z0
    const dy = y - y0
    const wdz = w * dz
    sw += w
    swz += wdz
    swy += w * dy
    swzz += wdz * dz
    swzy += wdz * dy
    swyy += w * dy * dy
    sumAbsY += y < 0 ? -y : y
    if (z < top) top = z
    if (z > bottom) bottom = z
  }
  const mz = n ? swz / sw : 0
  const my = n ? swy / sw : 0
  out[SUM_N] = n
  out[SUM_W] = sw
  out[SUM_MZ] = n ? z0 + mz : 0
  out[SUM_MY] = n ? y0 + my : 0
  out[SUM_SZZ] = n ? Math.max(swzz - swz * mz, 0) : 0
  out[SUM_SZY] = n ? swzy - swz * my : 0
  out[SUM_SYY] = n ? Math.max(swyy - swy * my, 0) : 0
  out[SUM_ABS_Y] = sumAbsY
  out[SUM_TOP] = top
  out[SUM_BOTTOM] = bottom
}

/**
 * Constant and linear fits in one pass with no per-point allocation: weighted sums shifted by the
 * first point keep them accurate for any offset of depth or σ'p. `logConstant` fits ln σ'p.
 */
function fitStraight(points: readonly TrendPoint[], model: 'constant' | 'linear', confidence: number, bandPoints: number, logConstant = false): TrendFit {
  const sums = new Float64Array(SUM_SLOTS)
  accumulateStraight(points, logConstant, sums)
  const n = sums[SUM_N]!
  const sumW = sums[SUM_W]!
  const mz = sums[SUM_MZ]!
  const my = sums[SUM_MY]!
  const szz = sums[SUM_SZZ]!
  const szy = sums[SUM_SZY]!
  const syy = sums[SUM_SYY]!
  const sumAbsY = sums[SUM_ABS_Y]!
  const top = sums[SUM_TOP]!
  const bottom = sums[SUM_BOTTOM]!
  const m = model === 'constant' ? 1 : 2
  requireEnough(n, m, model)
  let intercept = my
  let gradient = 0
  let rss = syy
  if (model === 'linear') {
    if (!(szz > 0)) {
      throw new GeotechError('depths-coincide', 'A linear trend needs points at two or more different depths.')
    }
    gradient = szy / szz
    intercept = my - gradient * mz
    rss = Math.max(syy - gradient * szy, 0)
  }
  const stats = statistics(rss, syy, n, sumW, m, sumAbsY / n, model === 'constant')
  const t = studentTQuantile(0.5 + confidence / 2, n - m)
  const s2 = rss / (n - m) // residual variance per unit weight
  const band: TrendBandPoint[] = []
  for (const depth of bandDepths(top, bottom, bandPoints)) {
    const dz = depth - mz
    const fitted = intercept + gradient * depth
    const se = Math.sqrt(s2 * (1 / sumW + (model === 'linear' ? (dz * dz) / szz : 0)))
    band.push(logConstant
      ? { depth, fitted: Math.exp(fitted), lower: Math.exp(fitted - t * se), upper: Math.exp(fitted + t * se) }
      : { depth, fitted, lower: fitted - t * se, upper: fitted + t * se })
  }
  const parameters: Record<string, number> = model === 'constant'
    ? { preconsolidation: logConstant ? Math.exp(intercept) : intercept }
    : { intercept, gradient }
  // s²·(XᵀWX)⁻¹ for X = [1] or [1, z], written with the centred sums (the band's own terms).
  const covariance: TrendCovariance = model === 'constant'
    ? { names: ['preconsolidation'], matrix: [[s2 / sumW]], logScale: logConstant }
    : {
        names: ['intercept', 'gradient'],
        matrix: [[s2 * (1 / sumW + (mz * mz) / szz), -s2 * mz / szz], [-s2 * mz / szz, s2 / szz]],
        logScale: false,
      }
  return { model, logSpace: logConstant, parameters, n, k: m + 1, ...stats, band, covariance, depthRange: { top, bottom } }
}

/** Validates the points once and builds σ'v0(z) for band depths and breakpoints. */
function prepare(points: readonly TrendPoint[], needStress: boolean, logSpace: boolean, effectiveStressAt?: (depth: number) => number): Prepared {
  let n = 0
  let sumW = 0
  let top = Infinity
  let bottom = -Infinity
  let sumAbsY = 0
  const table: Array<[number, number]> = []
  points.forEach((p, i) => {
    const w = p.weight ?? 1
    if (!(w >= 0) || !Number.isFinite(w)) throw badWeight(p, i)
    if (!Number.isFinite(p.depth)) throw badDepth(i)
    if (!(p.preconsolidation > 0) || !Number.isFinite(p.preconsolidation)) throw badPreconsolidation(p, i, logSpace)
    if (needStress) {
      if (p.effectiveStress === undefined) {
        throw new GeotechError('effective-stress-missing', `Point ${i + 1} at ${p.depth} m has no σ'v0; POP- and OCR-type trends need it at every point.`, { depth: p.depth })
      }
      if (!(p.effectiveStress > 0) || !Number.isFinite(p.effectiveStress)) {
        throw new GeotechError('effective-stress-not-positive', `Point ${i + 1}: σ'v0 must be positive (got ${p.effectiveStress} kPa at ${p.depth} m).`, { depth: p.depth })
      }
    }
    if (w === 0) return
    n++
    sumW += w
    sumAbsY += Math.abs(logSpace ? Math.log(p.preconsolidation) : p.preconsolidation)
    top = Math.min(top, p.depth)
    bottom = Math.max(bottom, p.depth)
    if (needStress) table.push([p.depth, p.effectiveStress!])
  })
  let stressAt: (depth: number) => number = () => Number.NaN
  if (needStress) stressAt = effectiveStressAt ?? interpolator(table)
  return { n, sumW, top, bottom, meanAbsY: n > 0 ? sumAbsY / n : 1, stressAt }
}

/** Linear interpolation of σ'v0 between the points' own values (averaged at equal depths), flat beyond the ends. */
function interpolator(table: Array<[number, number]>): (depth: number) => number {
  table.sort((a, b) => a[0] - b[0])
  const zs: number[] = []
  const ss: number[] = []
  for (let i = 0; i < table.length;) {
    let j = i
    let sum = 0
    while (j < table.length && table[j]![0] === table[i]![0]) sum += table[j++]![1]
    zs.push(table[i]![0])
    ss.push(sum / (j - i))
    i = j
  }
  return (depth) => {
    if (zs.length === 0) return Number.NaN
    if (depth <= zs[0]!) return ss[0]!
    if (depth >= zs[zs.length - 1]!) return ss[ss.length - 1]!
    // Strictly inside the ends, so zs[lo] ≤ depth < zs[lo + 1].
    const lo = bracketIndex(zs, depth)
    const hi = lo + 1
    const t = (depth - zs[lo]!) / (zs[hi]! - zs[lo]!)
    return ss[lo]! + t * (ss[hi]! - ss[lo]!)
  }
}

/**
 * A trend linear in its parameters with a known offset: f(z) = offset(z, σ'v0) + Σ θj·xj(z, σ'v0).
 * `fill` writes the regressors into `row` and returns the offset.
 */
interface Design {
  p: number
  fill: (depth: number, stress: number, row: Float64Array) => number
}

function designFor(model: CrustBelowModel): Design {
  switch (model) {
    case 'constant': return { p: 1, fill: (_z, _s, row) => { row[0] = 1; return 0 } }
    case 'linear': return { p: 2, fill: (z, _s, row) => { row[0] = 1; row[1] = z; return 0 } }
    case 'pop': return { p: 1, fill: (_z, s, row) => { row[0] = 1; return s } }
    case 'ocr': return { p: 1, fill: (_z, s, row) => { row[0] = s; return 0 } }
  }
}

/** Crust above zb: continuous with the model below at zb, with its own gradient; columns are the below model's plus min(z − zb, 0). */
function crustDesign(below: CrustBelowModel, zb: number, stressAtBreak: number): Design {
  const base = designFor(below)
  const p = base.p + 1
  return {
    p,
    fill: (z, s, row) => {
      const zz = Math.max(z, zb)
      const ss = z < zb ? stressAtBreak : s
      const offset = base.fill(zz, ss, row)
      row[p - 1] = Math.min(z - zb, 0)
      return offset
    },
  }
}

interface Solved {
  theta: Float64Array
  /** (XᵀWX)⁻¹, or (JᵀWJ)⁻¹ in log space. */
  covariance: Float64Array
  rss: number
  tss: number
}

/** Weighted least squares; in log space Levenberg–Marquardt on ln σ'p started from the natural-scale solution. */
function solve(points: readonly TrendPoint[], design: Design, logSpace: boolean): Solved {
  const p = design.p
  const row = new Float64Array(p)
  const a = new Float64Array(p * p)
  const g = new Float64Array(p)
  let meanY = 0
  let sumW = 0
  // Natural-scale normal equations (also the starting point in log space).
  for (const pt of points) {
    const w = pt.weight ?? 1
    if (w === 0) continue
    const offset = design.fill(pt.depth, pt.effectiveStress ?? Number.NaN, row)
    const y = pt.preconsolidation - offset
    for (let j = 0; j < p; j++) {
      g[j] = g[j]! + w * row[j]! * y
      for (let k = 0; k < p; k++) a[j * p + k] = a[j * p + k]! + w * row[j]! * row[k]!
    }
    const yy = logSpace ? Math.log(pt.preconsolidation) : pt.preconsolidation
    sumW += w
    meanY += (w / sumW) * (yy - meanY)
  }
  let theta = solveLinear(a, g, p)
  if (!theta) throw singular()
  let tss = 0
  for (const pt of points) {
    const w = pt.weight ?? 1
    if (w === 0) continue
    const yy = logSpace ? Math.log(pt.preconsolidation) : pt.preconsolidation
    tss += w * (yy - meanY) ** 2
  }
  if (!logSpace) {
    const covariance = invertMatrix(a, p)
    if (!covariance) throw singular()
    return { theta, covariance, rss: residualSum(points, design, theta, false, row), tss }
  }

  if (!Number.isFinite(residualSum(points, design, theta, true, row))) {
    // Relative-error weights (w/σ'p²) approximate the log-space problem and usually give a positive start.
    a.fill(0)
    g.fill(0)
    for (const pt of points) {
      const w0 = pt.weight ?? 1
      if (w0 === 0) continue
      const w = w0 / pt.preconsolidation ** 2
      const offset = design.fill(pt.depth, pt.effectiveStress ?? Number.NaN, row)
      const y = pt.preconsolidation - offset
      for (let j = 0; j < p; j++) {
        g[j] = g[j]! + w * row[j]! * y
        for (let k = 0; k < p; k++) a[j * p + k] = a[j * p + k]! + w * row[j]! * row[k]!
      }
    }
    theta = solveLinear(a, g, p)
    if (!theta || !Number.isFinite(residualSum(points, design, theta, true, row))) {
      throw new GeotechError('log-fit-failed', 'No trend of this form stays positive at every point, so it cannot be fitted on ln σ\'p.')
    }
  }
  let rss = residualSum(points, design, theta, true, row)
  let lambda = 1e-3
  const trial = new Float64Array(p)
  for (let iteration = 0; iteration < 200; iteration++) {
    normalLog(points, design, theta, row, a, g)
    let improved = false
    while (lambda < 1e12) {
      const damped = Float64Array.from(a)
      for (let j = 0; j < p; j++) damped[j * p + j] = a[j * p + j]! * (1 + lambda)
      const step = solveLinear(damped, g, p)
      if (step) {
        for (let j = 0; j < p; j++) trial[j] = theta[j]! + step[j]!
        const trialRss = residualSum(points, design, trial, true, row)
        if (Number.isFinite(trialRss) && trialRss <= rss) {
          const gain = rss - trialRss
          theta = Float64Array.from(trial)
          rss = trialRss
          lambda = Math.max(lambda / 10, 1e-12)
          improved = gain > 1e-15 * Math.max(rss, 1e-300)
          break
        }
      }
      lambda *= 10
    }
    if (!improved) break
  }
  normalLog(points, design, theta, row, a, g)
  const covariance = invertMatrix(a, p)
  if (!covariance) throw singular()
  return { theta, covariance, rss, tss }
}

/** JᵀWJ and JᵀW·r for r = ln y − ln f, J = ∂ ln f/∂θ = x/f. */
function normalLog(points: readonly TrendPoint[], design: Design, theta: Float64Array, row: Float64Array, a: Float64Array, g: Float64Array): void {
  const p = design.p
  a.fill(0)
  g.fill(0)
  for (const pt of points) {
    const w = pt.weight ?? 1
    if (w === 0) continue
    let f = design.fill(pt.depth, pt.effectiveStress ?? Number.NaN, row)
    for (let j = 0; j < p; j++) f += theta[j]! * row[j]!
    const r = Math.log(pt.preconsolidation) - Math.log(f)
    for (let j = 0; j < p; j++) {
      const jj = row[j]! / f
      g[j] = g[j]! + w * jj * r
      for (let k = 0; k < p; k++) a[j * p + k] = a[j * p + k]! + w * jj * (row[k]! / f)
    }
  }
}

/** Weighted residual sum of squares; NaN in log space if the trend is not positive at some point. */
function residualSum(points: readonly TrendPoint[], design: Design, theta: Float64Array, logSpace: boolean, row: Float64Array): number {
  let rss = 0
  for (const pt of points) {
    const w = pt.weight ?? 1
    if (w === 0) continue
    let f = design.fill(pt.depth, pt.effectiveStress ?? Number.NaN, row)
    for (let j = 0; j < design.p; j++) f += theta[j]! * row[j]!
    if (logSpace) {
      if (!(f > 0)) return Number.NaN
      rss += w * (Math.log(pt.preconsolidation) - Math.log(f)) ** 2
    }
    else rss += w * (pt.preconsolidation - f) ** 2
  }
  return rss
}

/**
 * Crust model: the breakpoint zb is searched over the points' depths and the midpoints between them
 * (thinned to at most 120, each leaving points at ≥ 2 depths above and enough below), then refined by
 * golden-section search between the neighbouring candidates; the other parameters are least squares for
 * each zb. A crust is σ'p falling with depth down to zb, so breakpoints whose fitted crust gradient is not
 * negative are ruled out — without this the search chases noise at the top of the stratum.
 */
function fitCrust(points: readonly TrendPoint[], prepared: Prepared, below: CrustBelowModel, logSpace: boolean, confidence: number, bandPoints: number): TrendFit {
  const pBelow = designFor(below).p
  const m = pBelow + 2
  requireEnough(prepared.n, m, 'crust')
  const active = points.filter(p => (p.weight ?? 1) > 0)
  const depths = [...new Set(active.map(p => p.depth))].sort((a, b) => a - b)
  const minBelow = Math.max(2, pBelow + 1)
  let candidates: number[] = []
  for (let i = 0; i < depths.length; i++) {
    candidates.push(depths[i]!)
    if (i + 1 < depths.length) candidates.push(0.5 * (depths[i]! + depths[i + 1]!))
  }
  candidates = candidates.filter((zb) => {
    const depthsAbove = depths.filter(z => z < zb).length
    const depthsBelow = depths.length - depthsAbove
    const pointsBelow = active.filter(p => p.depth >= zb).length
    return depthsAbove >= 2 && pointsBelow >= minBelow && depthsBelow >= pBelow
  })
  if (candidates.length === 0) {
    throw new GeotechError(
      'too-few-points',
      `The crust model needs points at 2 or more depths above the breakpoint and ${minBelow} or more below it; there are ${prepared.n} points at ${depths.length} depths.`,
      { detail: { points: prepared.n } },
    )
  }
  if (candidates.length > MAX_BREAKPOINT_CANDIDATES) {
    const step = (candidates.length - 1) / (MAX_BREAKPOINT_CANDIDATES - 1)
    candidates = Array.from({ length: MAX_BREAKPOINT_CANDIDATES }, (_, i) => candidates[Math.round(i * step)]!)
  }
  const objective = (zb: number): number => {
    try {
      const solved = solve(points, crustDesign(below, zb, prepared.stressAt(zb)), logSpace)
      return solved.theta[pBelow]! < 0 ? solved.rss : Infinity
    }
    catch (error) {
      if (error instanceof GeotechError) return Infinity
      throw error
    }
  }
  const scores = candidates.map(objective)
  let bestIndex = 0
  for (let i = 1; i < scores.length; i++) if (scores[i]! < scores[bestIndex]!) bestIndex = i
  if (!Number.isFinite(scores[bestIndex]!)) {
    throw new GeotechError('no-crust', 'No breakpoint gives σ\'p falling with depth above it: these points show no crust.')
  }
  let lo = candidates[Math.max(bestIndex - 1, 0)]!
  let hi = candidates[Math.min(bestIndex + 1, candidates.length - 1)]!
  let bestZ = candidates[bestIndex]!
  let bestScore = scores[bestIndex]!
  const golden = (Math.sqrt(5) - 1) / 2
  let c = hi - golden * (hi - lo)
  let d = lo + golden * (hi - lo)
  let fc = objective(c)
  let fd = objective(d)
  for (let i = 0; i < 60 && hi - lo > 1e-9 * Math.max(1, Math.abs(hi)); i++) {
    if (fc < fd) {
      hi = d
      d = c
      fd = fc
      c = hi - golden * (hi - lo)
      fc = objective(c)
    }
    else {
      lo = c
      c = d
      fc = fd
      d = lo + golden * (hi - lo)
      fd = objective(d)
    }
  }
  for (const [z, f] of [[c, fc], [d, fd]] as const) {
    if (f < bestScore) {
      bestScore = f
      bestZ = z
    }
  }
  const stressAtBreak = prepared.stressAt(bestZ)
  const design = crustDesign(below, bestZ, stressAtBreak)
  const solved = solve(points, design, logSpace)
  const theta = solved.theta
  const belowParameters = namedParameters(below, theta.subarray(0, pBelow))
  const row = new Float64Array(design.p)
  let valueAtBreakpoint = design.fill(bestZ, stressAtBreak, row)
  for (let j = 0; j < design.p; j++) valueAtBreakpoint += theta[j]! * row[j]!
  const parameters: Record<string, number> = {
    breakpointDepth: bestZ,
    crustGradient: theta[pBelow]!,
    valueAtBreakpoint,
    ...(below === 'pop' || below === 'ocr' ? { effectiveStressAtBreakpoint: stressAtBreak } : {}),
    ...belowParameters,
  }
  return finish('crust', below, solved, design, prepared, logSpace, confidence, bandPoints, parameters, bestZ)
}

function namedParameters(model: CrustBelowModel, theta: Float64Array): Record<string, number> {
  switch (model) {
    case 'constant': return { preconsolidation: theta[0]! }
    case 'linear': return { intercept: theta[0]!, gradient: theta[1]! }
    case 'pop': return { pop: theta[0]! }
    case 'ocr': return { ocr: theta[0]! }
  }
}

/** Statistics and band for the generic path; the crust counts its breakpoint as a parameter. */
function finish(
  model: TrendModel,
  below: CrustBelowModel | undefined,
  solved: Solved,
  design: Design,
  prepared: Prepared,
  logSpace: boolean,
  confidence: number,
  bandPoints: number,
  parameters: Record<string, number>,
  breakpoint?: number,
): TrendFit {
  const m = design.p + (breakpoint === undefined ? 0 : 1)
  requireEnough(prepared.n, m, model)
  const { n, sumW } = prepared
  const stats = statistics(solved.rss, solved.tss, n, sumW, m, prepared.meanAbsY, false)
  const t = studentTQuantile(0.5 + confidence / 2, n - m)
  const s2 = solved.rss / (n - m)
  const row = new Float64Array(design.p)
  const depths = bandDepths(prepared.top, prepared.bottom, bandPoints)
  if (breakpoint !== undefined && breakpoint > prepared.top && breakpoint < prepared.bottom && !depths.includes(breakpoint)) {
    depths.push(breakpoint)
    depths.sort((a, b) => a - b)
  }
  const band: TrendBandPoint[] = depths.map((depth) => {
    let fitted = design.fill(depth, prepared.stressAt(depth), row)
    for (let j = 0; j < design.p; j++) fitted += solved.theta[j]! * row[j]!
    if (logSpace) for (let j = 0; j < design.p; j++) row[j] = row[j]! / fitted
    let q = 0
    for (let j = 0; j < design.p; j++) for (let k = 0; k < design.p; k++) q += row[j]! * solved.covariance[j * design.p + k]! * row[k]!
    const se = Math.sqrt(s2 * Math.max(q, 0))
    return logSpace
      ? { depth, fitted, lower: fitted * Math.exp(-t * se), upper: fitted * Math.exp(t * se) }
      : { depth, fitted, lower: fitted - t * se, upper: fitted + t * se }
  })
  // θ's names: the model's (the model below for a crust) and, for a crust, its gradient last.
  const names = [...Object.keys(namedParameters(below ?? (model as CrustBelowModel), solved.theta)), ...(model === 'crust' ? ['crustGradient'] : [])]
  const covariance: TrendCovariance = {
    names,
    matrix: Array.from({ length: design.p }, (_, j) => Array.from({ length: design.p }, (_, k) => s2 * solved.covariance[j * design.p + k]!)),
    logScale: false,
  }
  return {
    model,
    ...(below ? { crustBelow: below } : {}),
    logSpace,
    parameters,
    n,
    k: m + 1,
    ...stats,
    band,
    covariance,
    depthRange: { top: prepared.top, bottom: prepared.bottom },
  }
}

/**
 * R², RMSE, AIC = n·ln(RSS/n) + 2k (Akaike 1974) and AICc = AIC + 2k(k+1)/(n − k − 1) (Hurvich & Tsai 1989),
 * with k = m + 1 (trend parameters plus the residual variance) and weights normalised to mean 1. RSS is
 * floored at n·(10⁻⁹·mean|y|)² so an exact fit keeps a finite AIC and ties go to the simpler model.
 */
function statistics(rss: number, tss: number, n: number, sumW: number, m: number, meanAbsY: number, interceptOnly: boolean): { r2: number, rmse: number, aic: number, aicc: number } {
  const k = m + 1
  const rssNormalised = (rss * n) / sumW
  const floor = n * (1e-9 * Math.max(meanAbsY, 1e-300)) ** 2
  const aic = n * Math.log(Math.max(rssNormalised, floor) / n) + 2 * k
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity
  const r2 = interceptOnly ? 0 : tss > 0 ? 1 - rss / tss : rss <= floor ? 1 : 0
  return { r2, rmse: Math.sqrt(rss / sumW), aic, aicc }
}

function bandDepths(top: number, bottom: number, count: number): number[] {
  if (bottom <= top) return [top]
  return Array.from({ length: count }, (_, i) => top + ((bottom - top) * i) / (count - 1))
}

// ---------------------------------------------------------------------------
// Small dense linear algebra (p ≤ 4), by mathjs
// ---------------------------------------------------------------------------

function rows(a: Float64Array, p: number): number[][] {
  return Array.from({ length: p }, (_, r) => Array.from(a.subarray(r * p, r * p + p)))
}

/**
 * LU decomposition with partial pivoting (mathjs `lup`); undefined when A is singular, that is when a
 * pivot is below 1e-13 of A's largest entry (a looser test than mathjs' exact zero, so near-singular
 * normal equations are reported rather than solved into noise).
 */
function decompose(a: Float64Array, p: number): LUDecomposition | undefined {
  let scale = 0
  for (let i = 0; i < p * p; i++) scale = Math.max(scale, Math.abs(a[i]!))
  const lu = lup(rows(a, p))
  const u = lu.U as number[][]
  for (let i = 0; i < p; i++) if (!(Math.abs(u[i]![i]!) > 1e-13 * scale)) return undefined
  return lu
}

/** Solves A·x = b (mathjs `lusolve` on the LU decomposition); undefined when A is singular. */
function solveLinear(a: Float64Array, b: Float64Array, p: number): Float64Array | undefined {
  const lu = decompose(a, p)
  if (!lu) return undefined
  const x = lusolve(lu, Array.from(b)).valueOf() as number[][]
  return Float64Array.from(x, r => r[0]!)
}

/** A⁻¹ (mathjs `inv`); undefined when A is singular. */
function invertMatrix(a: Float64Array, p: number): Float64Array | undefined {
  if (!decompose(a, p)) return undefined
  return Float64Array.from((inv(rows(a, p))).flat())
}

// ---------------------------------------------------------------------------
// Errors
// ---------------------------------------------------------------------------

function requireEnough(n: number, m: number, model: TrendModel): void {
  if (n <= m) {
    throw new GeotechError(
      'too-few-points',
      `The ${MODEL_NAMES[model]} trend has ${m} parameter${m > 1 ? 's' : ''} and needs more than ${m} points; there ${n === 1 ? 'is' : 'are'} ${n}.`,
      { detail: { points: n, parameters: m, model } },
    )
  }
}

function badWeight(p: TrendPoint, i: number): GeotechError {
  return new GeotechError('weight-not-valid', `Point ${i + 1} at ${p.depth} m: the weight must be zero or a positive number (got ${p.weight}).`, { depth: p.depth })
}

function badDepth(i: number): GeotechError {
  return new GeotechError('depth-not-finite', `Point ${i + 1}: the depth is not a number.`)
}

function badPreconsolidation(p: TrendPoint, i: number, logSpace: boolean): GeotechError {
  return new GeotechError(
    'preconsolidation-not-positive',
    `Point ${i + 1} at ${p.depth} m: σ'p must be a positive number (got ${p.preconsolidation} kPa)${logSpace ? '; a log-space fit cannot take its logarithm' : ''}.`,
    { depth: p.depth },
  )
}

function singular(): GeotechError {
  return new GeotechError('trend-not-identifiable', 'The points cannot determine this trend (for example all at one depth, or σ\'v0 proportional to depth for a crust fit).')
}

function checkStress(s: StressPoint): void {
  if (!Number.isFinite(s.effectiveStress) || s.effectiveStress <= 0) {
    throw new GeotechError('effective-stress-not-positive', `σ'v0 must be positive (got ${s.effectiveStress} kPa at ${s.depth} m).`, { depth: s.depth })
  }
}

function fmtScore(value: number): string {
  return Number.isFinite(value) ? value.toFixed(1) : '∞'
}

