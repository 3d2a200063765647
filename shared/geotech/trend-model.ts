/**
 * The shape of a fitted σ'p trend and its evaluation at a depth: all a view needs to draw a trend
 * (the fitting itself, with its numeric libraries, is in trends.ts). Depth z in m, stresses in kPa.
 */
import { GeotechError } from './errors'

export const TREND_MODELS = ['constant', 'linear', 'pop', 'ocr', 'crust'] as const
export type TrendModel = (typeof TREND_MODELS)[number]
/** Models that can sit below the crust's breakpoint. */
export type CrustBelowModel = Exclude<TrendModel, 'crust'>

/** One σ'p value at a depth, from any source (oedometer, CPTu, vane). */
export interface TrendPoint {
  depth: number
  preconsolidation: number
  /** σ'v0 at the same depth (kPa); needed by the POP, OCR and crust-over-POP/OCR models. */
  effectiveStress?: number
  /** Relative weight (default 1); 0 leaves the point out of the fit. */
  weight?: number
}

export interface TrendOptions {
  model: TrendModel | 'auto'
  /**
   * Fit on ln σ'p, for scatter that grows with σ'p. The model keeps its form; residuals are ln σ'p − ln f(z).
   * `fitted` values and parameters are then the median response (exp of the fitted ln value), not the mean.
   */
  logSpace?: boolean
  /** Model below the crust breakpoint; constant POP when every point has σ'v0, else constant σ'p. */
  crustBelow?: CrustBelowModel
  /** Number of evenly spaced depths in the band (default 50). */
  bandPoints?: number
  /** Two-sided confidence level of the band (default 0.95). */
  confidence?: number
  /**
   * σ'v0 at any depth, from the stress model. Needed by POP/OCR-type models at the band depths and at the
   * crust breakpoint; without it σ'v0 is interpolated linearly between the points' own values.
   */
  effectiveStressAt?: (depth: number) => number
}

export interface TrendBandPoint {
  depth: number
  fitted: number
  lower: number
  upper: number
}

export type TrendCandidate =
  | { model: TrendModel, aic: number, aicc: number, r2: number, rmse: number, parameters: Record<string, number> }
  | { model: TrendModel, skipped: string }

export interface TrendFit {
  model: TrendModel
  /** Model below the breakpoint, for the crust model. */
  crustBelow?: CrustBelowModel
  logSpace: boolean
  /**
   * constant: preconsolidation · linear: intercept, gradient (σ'p = intercept + gradient·z) · pop: pop ·
   * ocr: ocr · crust: breakpointDepth, crustGradient, valueAtBreakpoint (σ'p = value + gradient·(z − zb) above zb),
   * effectiveStressAtBreakpoint (POP/OCR below) and the parameters of the model below.
   */
  parameters: Record<string, number>
  /** Points fitted (weight > 0). */
  n: number
  /** Parameters counted by AIC: the trend's own (breakpoint included) plus the residual variance. */
  k: number
  /** 1 − RSS/TSS on the fitting scale, TSS about the weighted mean (0 by definition for `constant`). */
  r2: number
  /** Weighted root-mean-square residual on the fitting scale (kPa, or ln units in log space). */
  rmse: number
  /** n·ln(RSS/n) + 2k (Akaike 1974), weights normalised to mean 1. */
  aic: number
  /** AIC + 2k(k+1)/(n − k − 1) (Hurvich & Tsai 1989); Infinity when n ≤ k + 1. */
  aicc: number
  /** Confidence band of the mean response over the fitted depth range (breakpoint held fixed for `crust`). */
  band: TrendBandPoint[]
  /**
   * Covariance of the fitted parameters, s²·(XᵀWX)⁻¹ with s² = RSS/(n − m): the matrix the band is drawn
   * from (in log space the linearised s²·(JᵀWJ)⁻¹; Seber & Wild 1989, §2.1). `names` are keys of `parameters`
   * in the matrix's order; the crust's breakpoint is held fixed and its `valueAtBreakpoint` follows from the
   * model below. `logScale`: the matrix is of ln of the named parameters (a constant fitted on ln σ'p).
   */
  covariance?: TrendCovariance
  depthRange: { top: number, bottom: number }
  /** For `auto`: why this model was chosen, in words. */
  reason?: string
  /** For `auto`: every model tried. */
  candidates?: TrendCandidate[]
}

/** Parameter covariance of a fit (see `TrendFit.covariance`). */
export interface TrendCovariance {
  names: string[]
  matrix: number[][]
  logScale: boolean
}

export const MODEL_NAMES: Record<TrendModel, string> = {
  constant: 'constant σ\'p',
  linear: 'σ\'p linear in depth',
  pop: 'constant POP',
  ocr: 'constant OCR',
  crust: 'crust',
}

/** σ'p of a fitted trend at a depth; POP/OCR-type models need σ'v0 there. */
export function evaluateTrend(fit: TrendFit, depth: number, effectiveStress?: number): number {
  const p = fit.parameters
  const needStress = (): number => {
    if (effectiveStress === undefined) {
      throw new GeotechError('effective-stress-missing', `The ${MODEL_NAMES[fit.model]} trend needs σ'v0 at ${depth} m.`, { depth })
    }
    if (!Number.isFinite(effectiveStress) || effectiveStress <= 0) {
      throw new GeotechError('effective-stress-not-positive', `σ'v0 must be positive (got ${effectiveStress} kPa at ${depth} m).`, { depth })
    }
    return effectiveStress
  }
  const below = (model: CrustBelowModel): number => {
    switch (model) {
      case 'constant': return p.preconsolidation!
      case 'linear': return p.intercept! + p.gradient! * depth
      case 'pop': return needStress() + p.pop!
      case 'ocr': return p.ocr! * needStress()
    }
  }
  if (fit.model === 'crust') {
    if (depth < p.breakpointDepth!) return p.valueAtBreakpoint! + p.crustGradient! * (depth - p.breakpointDepth!)
    return below(fit.crustBelow ?? 'constant')
  }
  return below(fit.model)
}
