import { GeotechError } from '../geotech/errors'
import { buildStressModel } from '../geotech/stress'
import { computeSettlement, voidRatioChange, type PreconsolidationModel, type SettlementInput } from '../geotech/settlement'
import { consolidationUnits, degreeOfConsolidation, timeFactorForDegree } from '../geotech/consolidation'
import { evaluateTrend, type TrendFit } from '../geotech/trend-model'
import { cholesky, localAverageCovariance, lowerTimes } from './field'
import { lognormalSigma, normalCorrelationForLognormals, normalStream } from './random'
import { exceedanceProbability, histogramOfSorted, midranks, pearson, sortedFinite, summariseSorted, type Histogram, type Quantiles } from './summary'

// Local bindings of the engine's functions: the hot loops call them directly, not through a module namespace.
const lawOfSublayer = voidRatioChange
const degreeAt = degreeOfConsolidation

/**
 * Monte Carlo primary settlement (domain §3) with scattered soil parameters. Per stratum, each of
 * Cc, Cr, e0, cv and σ'p is lognormal with the adopted value as its mean and a coefficient of
 * variation (common practice for positive soil parameters, e.g. Phoon & Kulhawy 1999); Cc and e0
 * are correlated through a Gaussian copula; σ'p may instead follow a fitted trend whose parameters
 * are drawn from the fit's covariance, so a realisation is a whole trend line. A parameter is one
 * value per realisation (fully correlated with depth) or, with a correlation length, a 1-D random
 * field averaged over each sublayer (Vanmarcke 1977, see field.ts). Strata are independent.
 *
 * The stresses (σ'v0, Δσ, the sublayers) do not vary: they are taken once from the settlement
 * engine itself (`computeSettlement`), and every realisation applies the engine's own law
 * (`voidRatioChange`, Δh = Δe/(1 + e0)·h, σ'p below σ'v0 raised to σ'v0), summed in the engine's
 * order, so with every COV zero a realisation equals the deterministic result to the last bit.
 *
 * With vertical drains (`options.drains`, per stratum: De, μ, ch/cv) a drained unit's degree is
 * Carrillo's (1942) U = 1 − (1 − Uv)(1 − Uh) with Uh = 1 − exp(−8·ch·t/(μ·De²)) (Hansbo 1981; Barron
 * 1948). ch is taken as the deterministic path takes it, ch = (ch/cv)·cv, from the realisation's cv,
 * times its own lognormal factor (mean 1, the stratum's ch COV): with cv varying ch follows it, and
 * the scatter of ch/cv adds on top (a choice: ch is rarely tested on its own).
 */

export const PROBABILISTIC_VARIABLES = ['cc', 'cr', 'e0', 'cv', 'preconsolidation', 'ch'] as const
export type ProbabilisticVariable = (typeof PROBABILISTIC_VARIABLES)[number]

/** Cc–e0 correlation when none is given (common practice). */
export const DEFAULT_CC_E0_CORRELATION = 0.5
/** Realisations drawn from one set of streams; chunks make a split across workers give the same numbers. */
export const MONTE_CARLO_CHUNK = 1000
export const MONTE_CARLO_LIMITS = { realizations: [1, 100_000], fieldSublayers: 400 } as const

/** A lognormal parameter: COV about the adopted value (its mean), optionally a random field along depth. */
export interface LognormalVariation {
  cov: number
  /** Scale of fluctuation θ (m) of a 1-D random field with exponential autocorrelation; absent: one value per realisation. */
  correlationLength?: number
}

/** σ'p from a fitted trend, its parameters drawn from `trend.covariance`. */
export interface TrendVariation {
  trend: TrendFit
}

export interface StratumVariation {
  cc?: LognormalVariation
  cr?: LognormalVariation
  e0?: LognormalVariation
  cv?: LognormalVariation
  preconsolidation?: LognormalVariation | TrendVariation
  /** Factor on ch = (ch/cv)·cv of a drained stratum (one value per realisation); ignored without drains. */
  ch?: LognormalVariation
}

/** Vertical drains through a stratum, as the deterministic path sets them (treatment.ts). */
export interface StratumDrains {
  /** De (m), the diameter of the soil cylinder one drain serves. */
  influenceDiameter: number
  /** Hansbo's (1981) μ, smear and well resistance included. */
  mu: number
  /** ch/cv: a unit's ch is this times its cv. */
  chRatio: number
}

export interface MonteCarloOptions {
  realizations: number
  seed: number | string
  /** Variation per stratum, keyed as `keyBy` says; strata not named do not vary. */
  strata: Record<string, StratumVariation>
  /** How a layer finds its entry: by its name (default; same-named layers share draws) or its drainage group. */
  keyBy?: 'name' | 'drainageGroup'
  /** Correlation of Cc and e0 within a stratum (default 0.5). */
  ccE0Correlation?: number
  /** Settlement limit (m) whose exceedance probability is reported. */
  limit?: number
  /** Histogram bins (default by the Rice rule). */
  bins?: number
  /** Drains per stratum, keyed as `strata` (t90 by Carrillo's combination in those strata's units). */
  drains?: Record<string, StratumDrains>
}

export interface Distribution {
  mean: number
  sd: number
  quantiles: Quantiles
}

export interface SensitivityEntry {
  stratum: string
  variable: ProbabilisticVariable
  /** Spearman's rank correlation of the variable's draw with the settlement. */
  rankCorrelation: number
}

export interface MonteCarloResult extends Distribution {
  realizations: number
  /** Settlement at the adopted values (m). */
  deterministic: number
  histogram: Histogram
  exceedance?: { limit: number, probability: number }
  /** Years to 90 % of primary settlement, when every compressible layer has cv. */
  t90?: Distribution
  /** Random variables by |rank correlation|, largest first. */
  sensitivity: SensitivityEntry[]
  warnings: string[]
}

/** The raw draws of a range of chunks: what a worker sends back. */
export interface MonteCarloSamples {
  /** First realisation of the range. */
  start: number
  settlement: Float64Array
  /** NaN where t90 is undefined (no settlement); null without cv. */
  t90: Float64Array | null
  /** One column per random variable (the plan's order): the draw's normal score, its sublayer mean for a field. */
  draws: Float64Array[]
  /** Realisations in which a drawn σ'p trend fell below σ'v0 somewhere (raised there). */
  raised: number
}

interface FieldPlan {
  /** Sublayer indices the field covers (all the stratum's sublayers). */
  sublayers: Int32Array
  factor: Float64Array
  /** Thickness weights for the column summary (sum 1). */
  weights: Float64Array
}

interface VariablePlan {
  stratum: string
  variable: ProbabilisticVariable
  sigma: number
  field: FieldPlan | null
  /** Cholesky factor of the trend's covariance, and the fit. */
  trend: { fit: TrendFit, factor: Float64Array, p: number } | null
}

interface StratumPlan {
  key: string
  /** Compressible layers (positions in `layers` of the plan). */
  layers: number[]
  /** Sublayers of those layers, in order. */
  sublayers: Int32Array
  vars: Partial<Record<ProbabilisticVariable, number>>
  /** Normal correlation of Cc and e0 (0 when not both vary). */
  rho: number
}

interface LayerPlan {
  name: string
  start: number
  end: number
  cc: number
  cr: number
  e0: number
  cv?: number
  /** Layer thickness (m), as the consolidation units count it. */
  height: number
  stratum: number
  drains?: StratumDrains
}

/** What every chunk needs, built once from the inputs. */
export interface MonteCarloPlan {
  realizations: number
  seed: number | string
  deterministic: number
  count: number
  depth: Float64Array
  thickness: Float64Array
  effectiveStress: Float64Array
  finalEffectiveStress: Float64Array
  /** σ'p of the layer's model before raising to σ'v0. */
  preconsolidation: Float64Array
  layers: LayerPlan[]
  strata: StratumPlan[]
  variables: VariablePlan[]
  units: { members: number[], hdr: number, thickness: number, drains: StratumDrains | null }[] | null
  tv90: number
  warnings: string[]
  options: MonteCarloOptions
}

function fail(code: string, message: string): never {
  throw new GeotechError(code, message)
}

/** σ'p(z) = c0 + c1·σ'v0 + c2·(z − top), the engine's form of each preconsolidation model. */
function preconsolidationCoefficients(pc: PreconsolidationModel, top: number, bottom: number): [number, number, number] {
  switch (pc.type) {
    case 'ocr': return [0, pc.value, 0]
    case 'pop': return [pc.value, 1, 0]
    case 'constant': return [pc.value, 0, 0]
    case 'linear': return [pc.top, 0, (pc.bottom - pc.top) / (bottom - top)]
  }
}

function isTrend(v: LognormalVariation | TrendVariation): v is TrendVariation {
  return 'trend' in v
}

/**
 * Checks the inputs and prepares the draws. Throws GeotechError for a stratum that names no
 * compressible layer, a COV out of range, too many sublayers for a random field, or what the
 * settlement engine itself refuses.
 */
export function planMonteCarlo(input: SettlementInput, options: MonteCarloOptions): MonteCarloPlan {
  const n = options.realizations
  const [minN, maxN] = MONTE_CARLO_LIMITS.realizations
  if (!Number.isInteger(n) || n < minN || n > maxN) fail('realizations-out-of-range', `The number of realisations must be a whole number from ${minN} to ${maxN} (got ${String(n)}).`)
  const ccE0 = options.ccE0Correlation ?? DEFAULT_CC_E0_CORRELATION
  if (!(ccE0 >= -1 && ccE0 <= 1)) fail('correlation-out-of-range', `The Cc–e0 correlation must be between −1 and 1 (got ${String(ccE0)}).`)
  const det = computeSettlement({ ...input, time: undefined, designLife: undefined }, { convergence: false })
  const warnings: string[] = []
  const rows = det.sublayers
  const count = rows.length
  const model = buildStressModel(input)
  const plan: MonteCarloPlan = {
    realizations: n,
    seed: options.seed,
    deterministic: det.settlement,
    count,
    depth: new Float64Array(count),
    thickness: new Float64Array(count),
    effectiveStress: new Float64Array(count),
    finalEffectiveStress: new Float64Array(count),
    preconsolidation: new Float64Array(count),
    layers: [],
    strata: [],
    variables: [],
    units: null,
    tv90: timeFactorForDegree(0.9),
    warnings,
    options,
  }
  const keyOf = (i: number): string | undefined => (options.keyBy === 'drainageGroup' ? input.layers[i]!.drainageGroup : input.layers[i]!.name)
  const strataByKey = new Map<string, StratumPlan>()
  const sublayersOf = new Map<string, number[]>()
  // Rows come in the compressible layers' order: a row belongs to the layer whose bottom lies below its mid-depth.
  let row = 0
  input.layers.forEach((layer, index) => {
    if (!layer.compressible) return
    const top = model.boundaries[index]!
    const bottom = model.boundaries[index + 1]!
    const [c0, c1, c2] = preconsolidationCoefficients(layer.preconsolidation!, top, bottom)
    const start = row
    while (row < count && rows[row]!.depth < bottom) {
      const r = rows[row]!
      plan.depth[row] = r.depth
      plan.thickness[row] = r.thickness
      plan.effectiveStress[row] = r.effectiveStress
      plan.finalEffectiveStress[row] = r.finalEffectiveStress
      plan.preconsolidation[row] = c0 + c1 * r.effectiveStress + c2 * (r.depth - top)
      row++
    }
    const key = keyOf(index)
    let stratum = -1
    if (key !== undefined && options.strata[key] !== undefined) {
      let s = strataByKey.get(key)
      if (!s) {
        s = { key, layers: [], sublayers: new Int32Array(0), vars: {}, rho: 0 }
        strataByKey.set(key, s)
        sublayersOf.set(key, [])
        plan.strata.push(s)
      }
      s.layers.push(plan.layers.length)
      for (let i = start; i < row; i++) sublayersOf.get(key)!.push(i)
      stratum = plan.strata.indexOf(s)
    }
    const drains = key !== undefined ? options.drains?.[key] : undefined
    plan.layers.push({ name: layer.name, start, end: row, cc: layer.cc!, cr: layer.cr!, e0: layer.e0!, cv: layer.cv, height: bottom - top, stratum, ...(drains ? { drains } : {}) })
  })
  if (row !== count) fail('sublayers-mismatch', 'The sublayers could not be matched to their layers.')
  for (const [key, d] of Object.entries(options.drains ?? {})) {
    if (!plan.layers.some(l => l.drains === d)) fail('stratum-unknown', `"${key}" names no compressible layer, so drains cannot pass through it.`)
    for (const [what, value] of [['De', d.influenceDiameter], ['μ', d.mu], ['ch/cv', d.chRatio]] as const) {
      if (!(Number.isFinite(value) && value > 0)) fail('drains-invalid', `Drains in "${key}": ${what} is ${String(value)}; it must be a positive number.`)
    }
  }

  for (const key of Object.keys(options.strata)) {
    if (strataByKey.has(key)) continue
    const named = input.layers.some((_, i) => keyOf(i) === key)
    fail('stratum-unknown', named
      ? `"${key}" names no compressible layer, so its parameters cannot vary.`
      : `"${key}" names no layer of the profile.`)
  }

  const timed = plan.layers.length > 0 && plan.layers.every(l => l.cv !== undefined)
  for (const s of plan.strata) {
    s.sublayers = Int32Array.from(sublayersOf.get(s.key)!)
    const spec = options.strata[s.key]!
    for (const variable of PROBABILISTIC_VARIABLES) {
      const v = spec[variable]
      if (v === undefined) continue
      if (variable === 'preconsolidation' && isTrend(v)) {
        const cov = v.trend.covariance
        if (!cov) fail('trend-covariance-missing', `Stratum "${s.key}": the σ'p trend carries no parameter covariance to draw from.`)
        const p = cov.names.length
        const a = new Float64Array(p * p)
        for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) a[j * p + k] = cov.matrix[j]![k]!
        s.vars.preconsolidation = plan.variables.length
        plan.variables.push({ stratum: s.key, variable, sigma: 0, field: null, trend: { fit: v.trend, factor: cholesky(a, p), p } })
        continue
      }
      const lv = v as LognormalVariation
      const sigma = lognormalSigma(lv.cov)
      if (lv.cov > 2) fail('cov-out-of-range', `Stratum "${s.key}": the COV of ${variable} is ${lv.cov}; it must be at most 2.`)
      if (sigma === 0) continue
      if (variable === 'cv' && !timed) {
        warnings.push(`Stratum "${s.key}": cv varies, but not every compressible layer has cv, so t90 is not computed.`)
        continue
      }
      if (variable === 'ch' && !(timed && s.layers.some(j => plan.layers[j]!.drains !== undefined))) {
        warnings.push(`Stratum "${s.key}": ch varies, but ${timed ? 'no drains pass through it' : 'not every compressible layer has cv, so t90 is not computed'}; ch is not varied.`)
        continue
      }
      let field: FieldPlan | null = null
      if (lv.correlationLength !== undefined) {
        if (variable === 'cv' || variable === 'ch') fail('field-not-supported', `Stratum "${s.key}": ${variable} takes one value per stratum; it cannot be a random field.`)
        const m = s.sublayers.length
        if (m > MONTE_CARLO_LIMITS.fieldSublayers) fail('field-too-large', `Stratum "${s.key}": a random field over ${m} sublayers is too large (at most ${MONTE_CARLO_LIMITS.fieldSublayers}); use thicker sublayers.`)
        const tops = new Float64Array(m)
        const bottoms = new Float64Array(m)
        const weights = new Float64Array(m)
        let total = 0
        s.sublayers.forEach((i, k) => {
          tops[k] = plan.depth[i]! - plan.thickness[i]! / 2
          bottoms[k] = plan.depth[i]! + plan.thickness[i]! / 2
          weights[k] = plan.thickness[i]!
          total += plan.thickness[i]!
        })
        for (let k = 0; k < m; k++) weights[k] = weights[k]! / total
        field = { sublayers: s.sublayers, factor: cholesky(localAverageCovariance(tops, bottoms, lv.correlationLength), m), weights }
      }
      s.vars[variable] = plan.variables.length
      plan.variables.push({ stratum: s.key, variable, sigma, field, trend: null })
    }
    const ic = s.vars.cc
    const ie = s.vars.e0
    if (ic !== undefined && ie !== undefined && ccE0 !== 0) {
      const vc = plan.variables[ic]!
      const ve = plan.variables[ie]!
      if ((vc.field === null) !== (ve.field === null)) {
        warnings.push(`Stratum "${s.key}": Cc and e0 are not both random fields or both single values, so their correlation is not applied.`)
      }
      else {
        const c = normalCorrelationForLognormals(ccE0, spec.cc!.cov, (spec.e0 as LognormalVariation).cov)
        if (c.clamped) warnings.push(`Stratum "${s.key}": a Cc–e0 correlation of ${ccE0} cannot be reached with these COVs; ${c.rho} is used between their logarithms.`)
        s.rho = c.rho
      }
    }
  }

  if (timed) {
    // The engine's consolidation units: consecutive compressible layers of one drainage group are one layer.
    let run = 0
    const compressible = input.layers.map((l, i) => ({ l, i })).filter(x => x.l.compressible)
    const units = consolidationUnits(compressible.map(({ l, i }, j) => {
      if (j > 0 && compressible[j - 1]!.i + 1 !== i) run++
      return { thickness: model.boundaries[i + 1]! - model.boundaries[i]!, cv: l.cv, drainage: l.drainage, drainageGroup: l.drainageGroup === undefined ? undefined : `${run}\u0000${l.drainageGroup}` }
    }))
    // A unit drains radially as its first layer's stratum does (as treatment.ts takes a unit's stratum).
    plan.units = units.map(u => ({ members: u.members, hdr: u.hdr, thickness: u.thickness, drains: plan.layers[u.members[0]!]!.drains ?? null }))
  }
  return plan
}

/**
 * Draws realisations [chunkStart·CHUNK, min(chunkEnd·CHUNK, N)) of a plan. Each chunk has its own
 * streams, so any split of the chunks (across workers) gives the same numbers as one pass.
 */
export function simulateChunks(plan: MonteCarloPlan, chunkStart: number, chunkEnd: number): MonteCarloSamples {
  const start = Math.min(chunkStart * MONTE_CARLO_CHUNK, plan.realizations)
  const end = Math.min(chunkEnd * MONTE_CARLO_CHUNK, plan.realizations)
  const size = end - start
  const { count, thickness, effectiveStress, finalEffectiveStress, preconsolidation, layers, strata, variables } = plan
  const samples: MonteCarloSamples = {
    start,
    settlement: new Float64Array(size),
    t90: plan.units ? new Float64Array(size) : null,
    draws: variables.map(() => new Float64Array(size)),
    raised: 0,
  }
  const cvOf = new Float64Array(layers.length)
  const chOf = new Float64Array(layers.length)
  const layerSum = new Float64Array(layers.length)
  const white = new Float64Array(MONTE_CARLO_LIMITS.fieldSublayers)
  const ccWhite = new Float64Array(MONTE_CARLO_LIMITS.fieldSublayers)
  const values = new Float64Array(MONTE_CARLO_LIMITS.fieldSublayers)
  const z = new Float64Array(8)
  // Per-sublayer factor of each variable this realisation (1 where it does not vary).
  const factor: Record<'cc' | 'cr' | 'e0' | 'preconsolidation', Float64Array> = {
    cc: new Float64Array(count), cr: new Float64Array(count), e0: new Float64Array(count), preconsolidation: new Float64Array(count),
  }
  const factors = [factor.cc, factor.cr, factor.e0, factor.preconsolidation]
  const trendValue = new Float64Array(count)
  const useTrend = new Uint8Array(count)
  const scratch = plan.units ? { settlement: new Float64Array(plan.units.length), cv: new Float64Array(plan.units.length), rate: new Float64Array(plan.units.length) } : null

  for (let chunk = chunkStart; chunk < chunkEnd; chunk++) {
    const first = chunk * MONTE_CARLO_CHUNK
    if (first >= plan.realizations) break
    const last = Math.min(first + MONTE_CARLO_CHUNK, plan.realizations)
    const streams = variables.map(v => normalStream(plan.seed, `${chunk}\u0000${v.stratum}\u0000${v.variable}`))
    for (let r = first; r < last; r++) {
      const out = r - start
      for (const f of factors) f.fill(1)
      useTrend.fill(0)
      for (let j = 0; j < layers.length; j++) cvOf[j] = layers[j]!.cv ?? 0
      chOf.fill(1)
      let raisedHere = false
      for (const s of strata) {
        // Cc first: e0 leans on its normal draws through the copula.
        for (const variable of PROBABILISTIC_VARIABLES) {
          const vi = s.vars[variable]
          if (vi === undefined) continue
          const v = variables[vi]!
          const next = streams[vi]!
          if (v.trend) {
            const { fit, factor: lt, p } = v.trend
            for (let k = 0; k < p; k++) z[k] = next()
            const cov = fit.covariance!
            const realised: Record<string, number> = { ...fit.parameters }
            let level = 0
            for (let j = 0; j < p; j++) {
              let d = 0
              for (let k = 0; k <= j; k++) d += lt[j * p + k]! * z[k]!
              const name = cov.names[j]!
              realised[name] = cov.logScale ? fit.parameters[name]! * Math.exp(d) : fit.parameters[name]! + d
            }
            if (fit.model === 'crust') {
              realised.valueAtBreakpoint = evaluateTrend({ ...fit, model: fit.crustBelow ?? 'constant', parameters: realised }, realised.breakpointDepth!, realised.effectiveStressAtBreakpoint)
            }
            const drawn = { ...fit, parameters: realised }
            let weight = 0
            for (const i of s.sublayers) {
              const value = evaluateTrend(drawn, plan.depth[i]!, effectiveStress[i])
              const mean = evaluateTrend(fit, plan.depth[i]!, effectiveStress[i])
              trendValue[i] = value
              useTrend[i] = 1
              if (value > 0 && mean > 0) {
                level += Math.log(value / mean) * thickness[i]!
                weight += thickness[i]!
              }
            }
            samples.draws[vi]![out] = weight > 0 ? level / weight : 0
            continue
          }
          const sigma = v.sigma
          const shift = -0.5 * sigma * sigma
          if (v.field) {
            const m = v.field.sublayers.length
            for (let k = 0; k < m; k++) white[k] = next()
            if (variable === 'cc') ccWhite.set(white.subarray(0, m))
            if (variable === 'e0' && s.rho !== 0) {
              const c = Math.sqrt(1 - s.rho * s.rho)
              for (let k = 0; k < m; k++) white[k] = s.rho * ccWhite[k]! + c * white[k]!
            }
            lowerTimes(v.field.factor, m, white, values)
            let mean = 0
            for (let k = 0; k < m; k++) {
              mean += values[k]! * v.field.weights[k]!
              if (variable !== 'cv' && variable !== 'ch') factor[variable][v.field.sublayers[k]!] = Math.exp(sigma * values[k]! + shift)
            }
            samples.draws[vi]![out] = mean
            continue
          }
          let zz = next()
          if (variable === 'cc') ccWhite[0] = zz
          if (variable === 'e0' && s.rho !== 0) zz = s.rho * ccWhite[0]! + Math.sqrt(1 - s.rho * s.rho) * zz
          samples.draws[vi]![out] = zz
          const f = Math.exp(sigma * zz + shift)
          if (variable === 'cv') {
            for (const j of s.layers) cvOf[j] = layers[j]!.cv! * f
          }
          else if (variable === 'ch') {
            for (const j of s.layers) chOf[j] = f
          }
          else {
            const col = factor[variable]
            for (const i of s.sublayers) col[i] = f
          }
        }
      }
      let total = 0
      for (let j = 0; j < layers.length; j++) {
        const layer = layers[j]!
        let sum = 0
        for (let i = layer.start; i < layer.end; i++) {
          const s0 = effectiveStress[i]!
          let p = useTrend[i] === 1 ? trendValue[i]! : preconsolidation[i]! * factor.preconsolidation[i]!
          if (p < s0 || !(p === p)) {
            if (useTrend[i] === 1) raisedHere = true
            p = s0
          }
          const de = lawOfSublayer(layer.cc * factor.cc[i]!, layer.cr * factor.cr[i]!, s0, p, finalEffectiveStress[i]!)
          sum += (de / (1 + layer.e0 * factor.e0[i]!)) * thickness[i]!
        }
        layerSum[j] = sum
        total += sum
      }
      samples.settlement[out] = total
      if (raisedHere) samples.raised++
      if (samples.t90) samples.t90[out] = t90Of(plan, layerSum, cvOf, chOf, total, scratch!)
    }
  }
  return samples
}

/**
 * Years to 90 % of primary settlement: Σ Sₖ·U(cvₖt/Hₖ²) = 0.9·S over the consolidation units (Terzaghi 1925),
 * with the engine's degree of consolidation. The root lies between the units' own t90 when none rebounds;
 * it is found by regula falsi with the Illinois step (Dowell & Jarratt 1971), to 1e-12 of t. A drained
 * unit's degree is 1 − (1 − Uv)·exp(−8·ch·t/(μ·De²)) (Carrillo 1942; Hansbo 1981), ch = (ch/cv)·cv·(ch
 * factor); its own t90 is then below both the vertical and the radial one, so the search runs from 0.
 */
function t90Of(plan: MonteCarloPlan, layerSum: Float64Array, cvOf: Float64Array, chOf: Float64Array, total: number, scratch: { settlement: Float64Array, cv: Float64Array, rate: Float64Array }): number {
  const units = plan.units!
  if (!(total > 0)) return Number.NaN
  const k = units.length
  const us = scratch.settlement
  const ucv = scratch.cv
  const rate = scratch.rate
  let lo = Infinity
  let hi = 0
  let monotone = true
  let drained = false
  for (let u = 0; u < k; u++) {
    const unit = units[u]!
    let s = 0
    let resistance = 0
    for (const j of unit.members) {
      s += layerSum[j]!
      resistance += plan.layers[j]!.height / cvOf[j]!
    }
    us[u] = s
    ucv[u] = unit.members.length === 1 ? cvOf[unit.members[0]!]! : unit.thickness / resistance
    if (s < 0) monotone = false
    const d = unit.drains
    rate[u] = 0
    if (d) {
      // Uh = 1 − exp(−rate·t), rate = 8·ch/(μ·De²) (Hansbo 1981).
      rate[u] = (8 * d.chRatio * ucv[u]! * chOf[unit.members[0]!]!) / (d.mu * d.influenceDiameter * d.influenceDiameter)
      drained = true
    }
    if (s > 0) {
      let t = (plan.tv90 * unit.hdr * unit.hdr) / ucv[u]!
      if (d) t = Math.min(t, Math.LN10 / rate[u]!)
      if (t < lo) lo = t
      if (t > hi) hi = t
    }
  }
  if (drained) lo = 0
  else if (k === 1 || (monotone && lo === hi)) return lo
  if (!monotone) {
    // Rebound in some unit: search the whole span, as the engine does.
    lo = 0
    for (let u = 0; u < k; u++) hi = Math.max(hi, (timeFactorForDegree(0.9999) * units[u]!.hdr * units[u]!.hdr) / ucv[u]!)
  }
  const f = (t: number): number => {
    let s = 0
    if (drained) {
      for (let u = 0; u < k; u++) {
        const uv = degreeAt((ucv[u]! * t) / (units[u]!.hdr * units[u]!.hdr))
        s += us[u]! * (rate[u]! > 0 ? 1 - (1 - uv) * Math.exp(-rate[u]! * t) : uv)
      }
    }
    else {
      for (let u = 0; u < k; u++) s += us[u]! * degreeAt((ucv[u]! * t) / (units[u]!.hdr * units[u]!.hdr))
    }
    return s / total - 0.9
  }
  let flo = f(lo)
  let fhi = f(hi)
  // Not bracketed (rounding at the ends): the end nearer the root.
  if (!(flo < 0 && fhi >= 0)) return Math.abs(flo) < Math.abs(fhi) ? lo : hi
  let side = 0
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    let t = (lo * fhi - hi * flo) / (fhi - flo)
    if (!(t > lo && t < hi)) t = 0.5 * (lo + hi)
    const ft = f(t)
    if (ft === 0) return t
    if (ft < 0) {
      lo = t
      flo = ft
      if (side === -1) fhi /= 2
      side = -1
    }
    else {
      hi = t
      fhi = ft
      if (side === 1) flo /= 2
      side = 1
    }
    if (Math.abs(ft) < 1e-15) break
  }
  return Math.abs(flo) < Math.abs(fhi) ? lo : hi
}

/** Joins the samples of all chunks (in any order) into one set. */
export function joinSamples(plan: MonteCarloPlan, parts: MonteCarloSamples[]): MonteCarloSamples {
  const n = plan.realizations
  const all: MonteCarloSamples = {
    start: 0,
    settlement: new Float64Array(n),
    t90: plan.units ? new Float64Array(n) : null,
    draws: plan.variables.map(() => new Float64Array(n)),
    raised: 0,
  }
  for (const p of parts) {
    all.settlement.set(p.settlement, p.start)
    if (all.t90 && p.t90) all.t90.set(p.t90, p.start)
    p.draws.forEach((d, k) => all.draws[k]!.set(d, p.start))
    all.raised += p.raised
  }
  return all
}

/** Mean, sd, quantiles, histogram, exceedance, t90 and sensitivity of all the realisations. */
export function summariseMonteCarlo(plan: MonteCarloPlan, samples: MonteCarloSamples): MonteCarloResult {
  const sorted = sortedFinite(samples.settlement)
  const summary = summariseSorted(sorted)
  const warnings = [...plan.warnings]
  if (samples.raised > 0) {
    warnings.push(`In ${samples.raised} of ${plan.realizations} realisations the drawn σ'p trend fell below σ'v0 in places; σ'p was raised to σ'v0 there.`)
  }
  const result: MonteCarloResult = {
    realizations: plan.realizations,
    deterministic: plan.deterministic,
    ...summary,
    histogram: histogramOfSorted(sorted, plan.options.bins),
    sensitivity: [],
    warnings,
  }
  if (plan.options.limit !== undefined) {
    result.exceedance = { limit: plan.options.limit, probability: exceedanceProbability(samples.settlement, plan.options.limit) }
  }
  if (samples.t90) {
    const t = sortedFinite(samples.t90)
    if (t.length > 0) result.t90 = summariseSorted(t)
  }
  const settlementRanks = plan.variables.length > 0 ? midranks(samples.settlement) : new Float64Array(0)
  plan.variables.forEach((v, k) => {
    // Spearman's ρ: Pearson's correlation of the midranks (Spearman 1904), the settlement's ranked once.
    const rho = pearson(midranks(samples.draws[k]!), settlementRanks)
    if (Number.isFinite(rho)) result.sensitivity.push({ stratum: v.stratum, variable: v.variable, rankCorrelation: rho })
  })
  result.sensitivity.sort((a, b) => Math.abs(b.rankCorrelation) - Math.abs(a.rankCorrelation))
  return result
}

/**
 * The whole Monte Carlo in this thread: plan, every chunk, summary. `onProgress(done, total)` is
 * called after each chunk of 1000 realisations.
 */
export function runMonteCarlo(input: SettlementInput, options: MonteCarloOptions, onProgress?: (done: number, total: number) => void): MonteCarloResult {
  const plan = planMonteCarlo(input, options)
  const chunks = Math.ceil(plan.realizations / MONTE_CARLO_CHUNK)
  const parts: MonteCarloSamples[] = []
  for (let c = 0; c < chunks; c++) {
    parts.push(simulateChunks(plan, c, c + 1))
    onProgress?.(Math.min((c + 1) * MONTE_CARLO_CHUNK, plan.realizations), plan.realizations)
  }
  return summariseMonteCarlo(plan, parts.length === 1 ? parts[0]! : joinSamples(plan, parts))
}
