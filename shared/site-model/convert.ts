import { DEFAULT_MAX_SUBLAYER_THICKNESS, type PreconsolidationModel, type SettlementLayer } from '../geotech/settlement'
import type { StressProfileInput } from '../geotech/stress'
import { evaluateTrend, type TrendFit } from '../geotech/trend-model'
import { compressibilityAt, hasDepthTrend } from './compressibility'
import { depthTrendProblems, stratumBounds } from './definition-plain'
import type { ModelStratum, SiteModelDefinition } from './definition'

/**
 * From a site model to the engine's inputs. The stress-profile input is the
 * strata and groundwater as they are; the settlement layers carry each
 * compressible stratum's adopted compressibility and its σ'p trend in one of the
 * settlement API's forms (a crust or hand-drawn trend is split into layers at its
 * breakpoint or knots, which leaves σv, u and σ'v0 unchanged).
 */
export function toStressInput(def: SiteModelDefinition): Omit<StressProfileInput, 'depths'> {
  return {
    surcharge: def.surcharge,
    gammaW: def.gammaW,
    layers: def.strata.map(s => ({ name: s.name, thickness: s.thickness, unitWeight: s.unitWeight, unitWeightSaturated: s.unitWeightSaturated })),
    groundwater: { waterTableDepth: def.groundwater.waterTableDepth, piezometers: def.groundwater.piezometers },
  }
}

/** The fitted trend as the engine's TrendFit (enough of it to evaluate). */
export function asTrendFit(s: ModelStratum): TrendFit | null {
  const t = s.trend
  if (!t || t.manual) return null
  return {
    model: t.model,
    crustBelow: t.crustBelow,
    logSpace: t.logSpace,
    parameters: t.parameters,
    n: t.n,
    k: 0,
    r2: t.r2 ?? 0,
    rmse: t.rmse ?? 0,
    aic: t.aic ?? 0,
    aicc: t.aicc ?? 0,
    band: [],
    depthRange: { top: 0, bottom: 0 },
  }
}

/** σ'p of a stratum's trend at a depth (σ'v0 needed by POP/OCR forms); null without a trend. */
export function trendPreconsolidation(s: ModelStratum, depth: number, effectiveStress: number): number | null {
  const t = s.trend
  if (!t) return null
  if (t.manual) return interpolateKnots(t.manual.knots, depth)
  const fit = asTrendFit(s)
  return fit ? evaluateTrend(fit, depth, effectiveStress) : null
}

function interpolateKnots(knots: { depth: number, preconsolidation: number }[], depth: number): number {
  const k = [...knots].sort((a, b) => a.depth - b.depth)
  if (depth <= k[0]!.depth) return k[0]!.preconsolidation
  for (let i = 1; i < k.length; i++) {
    if (depth <= k[i]!.depth) {
      const a = k[i - 1]!
      const b = k[i]!
      return a.preconsolidation + ((b.preconsolidation - a.preconsolidation) * (depth - a.depth)) / (b.depth - a.depth)
    }
  }
  return k[k.length - 1]!.preconsolidation
}

export class ModelIncompleteError extends Error {}

export interface SettlementLayerOptions {
  /**
   * Slice thickness (m) for strata whose compressibility follows a depth trend:
   * such a stratum is cut into equal slices no thicker than this, each carrying
   * the trend's values at its mid-depth (default 0.25 m, the settlement API's
   * default sublayer).
   */
  maxThickness?: number
}

/**
 * Settlement layers for the settlement API. A compressible stratum needs its
 * compressibility and a trend; σ'p forms map one to one (constant, pop, ocr;
 * linear in depth → linear top/bottom), crust and manual trends split the
 * stratum into sub-layers whose σ'p is linear between breakpoints. A stratum
 * with a compressibility depth trend is further cut into slices of at most
 * `maxThickness`, each with Cc, Cr, e0, cv and Cα at its mid-depth, so the
 * settlement engine's sublayers of the same thickness see the trend's values.
 * Every layer of a compressible stratum carries `drainageGroup` = the stratum's code, so
 * its slices consolidate as the one stratum they are (the whole stratum's drainage path).
 */
export function toSettlementLayers(def: SiteModelDefinition, effectiveStressAt: (depth: number) => number, opts: SettlementLayerOptions = {}): SettlementLayer[] {
  const bounds = stratumBounds(def)
  const maxThickness = opts.maxThickness ?? DEFAULT_MAX_SUBLAYER_THICKNESS
  const out: SettlementLayer[] = []
  def.strata.forEach((s, i) => {
    const { top, bottom } = bounds[i]!
    const base = { name: s.name, thickness: s.thickness, unitWeight: s.unitWeight, unitWeightSaturated: s.unitWeightSaturated }
    if (!s.compressible) {
      out.push({ ...base, compressible: false })
      return
    }
    const c = s.compressibility
    if (!c) throw new ModelIncompleteError(`Stratum "${s.name}" is compressible but has no adopted Cc, Cr and e0.`)
    if (!s.trend) throw new ModelIncompleteError(`Stratum "${s.name}" is compressible but has no σ'p trend.`)
    const problem = depthTrendProblems(s, { top, bottom })[0]
    if (problem) throw new ModelIncompleteError(`Stratum "${s.name}": ${problem.message}.`)
    const props = (z: number) => {
      const v = compressibilityAt(c, z)
      return { compressible: true, cc: v.cc, cr: v.cr, e0: v.e0, ...(v.cv !== undefined ? { cv: v.cv } : {}), ...(v.calpha !== undefined ? { calpha: v.calpha } : {}), drainage: c.drainage, drainageGroup: s.code }
    }
    // σ'p pieces. Piecewise: a crust splits at its breakpoint (linear above, the model below as it is);
    // a hand-drawn trend splits at its knots (linear between them).
    const pieces: { a: number, b: number, form: PreconsolidationModel }[] = []
    const linearPiece = (a: number, b: number) => ({
      a, b, form: { type: 'linear' as const, top: trendPreconsolidation(s, a + 1e-9, effectiveStressAt(a))!, bottom: trendPreconsolidation(s, b - 1e-9, effectiveStressAt(b))! },
    })
    const direct = directForm(s, top, bottom)
    if (direct) pieces.push({ a: top, b: bottom, form: direct })
    else if (s.trend.manual) {
      const cuts = [...new Set([top, bottom, ...s.trend.manual.knots.map(k => k.depth).filter(d => d > top && d < bottom)])].sort((x, y) => x - y)
      for (let j = 0; j + 1 < cuts.length; j++) pieces.push(linearPiece(cuts[j]!, cuts[j + 1]!))
    }
    else if (s.trend.model === 'crust' && !s.trend.logSpace) {
      const zb = Math.min(Math.max(s.trend.parameters.breakpointDepth ?? bottom, top), bottom)
      if (zb > top) pieces.push(linearPiece(top, zb))
      if (zb < bottom) pieces.push({ a: zb, b: bottom, form: belowForm(s.trend.crustBelow ?? 'constant', s.trend.parameters, zb, bottom) })
    }
    else {
      // A log-space fit: linear between the ends (a close, documented approximation over one stratum).
      pieces.push(linearPiece(top, bottom))
    }
    // Slices: one per piece, or with a compressibility depth trend as many as the sublayering cuts.
    const slices = hasDepthTrend(c) ? pieces.flatMap(p => slicePiece(p, maxThickness)) : pieces
    if (direct && slices.length === 1) {
      out.push({ ...base, ...props((top + bottom) / 2), preconsolidation: direct })
      return
    }
    slices.forEach((piece, j) => {
      out.push({ ...base, name: slices.length > 1 ? `${s.name} (${j + 1}/${slices.length})` : s.name, thickness: piece.b - piece.a, ...props((piece.a + piece.b) / 2), preconsolidation: piece.form })
    })
  })
  return out
}

/**
 * Equal slices of a σ'p piece, no thicker than `maxThickness` (the same count the
 * sublayer table and the settlement engine use); a linear σ'p is cut at the slice
 * ends, the other forms hold as they are.
 */
function slicePiece(p: { a: number, b: number, form: PreconsolidationModel }, maxThickness: number): { a: number, b: number, form: PreconsolidationModel }[] {
  const h = p.b - p.a
  const n = Math.max(1, Math.ceil(h / maxThickness - 1e-9))
  const out: { a: number, b: number, form: PreconsolidationModel }[] = []
  const at = (z: number) => (p.form.type === 'linear' ? p.form.top + ((p.form.bottom - p.form.top) * (z - p.a)) / h : 0)
  for (let k = 0; k < n; k++) {
    const a = p.a + (k * h) / n
    const b = k === n - 1 ? p.b : p.a + ((k + 1) * h) / n
    out.push({ a, b, form: p.form.type === 'linear' ? { type: 'linear', top: at(a), bottom: at(b) } : p.form })
  }
  return out
}

function belowForm(model: 'constant' | 'linear' | 'pop' | 'ocr', p: Record<string, number>, top: number, bottom: number): PreconsolidationModel {
  switch (model) {
    case 'constant': return { type: 'constant', value: p.preconsolidation! }
    case 'pop': return { type: 'pop', value: p.pop! }
    case 'ocr': return { type: 'ocr', value: p.ocr! }
    case 'linear': return { type: 'linear', top: p.intercept! + p.gradient! * top, bottom: p.intercept! + p.gradient! * bottom }
  }
}

function directForm(s: ModelStratum, top: number, bottom: number): PreconsolidationModel | null {
  const t = s.trend!
  if (t.manual || t.logSpace || t.model === 'crust') return null
  return belowForm(t.model, t.parameters, top, bottom)
}
