import type { SettlementInput } from '../geotech/settlement'
import { planStressIncrease } from '../geotech/plan-loads'
import { createStressEvaluator } from '../geotech/stress'
import type { TrendCovariance, TrendFit } from '../geotech/trend-model'
import {
  planMonteCarlo,
  simulateChunks,
  MONTE_CARLO_CHUNK,
  type MonteCarloOptions,
  type MonteCarloResult,
  type MonteCarloSamples,
  type StratumDrains,
  type StratumVariation,
} from '../probabilistic/monte-carlo'
import { quantileOfSorted, sampleMean, sampleSd, sortedFinite } from '../probabilistic/summary'
import {
  RUN_PROBABILISTIC_LIMITS,
  RUN_PROBABILISTIC_WORK,
  RUN_SCATTER_DEFAULT_COV,
  RUN_SCATTER_MIN_TESTS,
  RUN_SCATTER_VARIABLES,
  type RunScatterVariable,
} from '../schemas/settlement-run-limits'
import type { RunLoad, RunProbabilistic } from '../schemas/settlement-runs'
import { eligibleTests, type TestCompressibility } from '../site-model/compressibility'
import type { SiteModelDefinition } from '../site-model/definition'
import { toSettlementLayers, toStressInput } from '../site-model/convert'
import type { RunPointProbabilistic, RunStratumScatter, RunVariableScatter } from '../types/settlement-runs'
import { buildSettlementKernel, resolveLoads, runProfile, type RunComputeInput } from './compute'
import { isTreated, permanentLoads, treatmentProfile } from './treatment'

/**
 * Probabilistic settlement runs (`options.probabilistic`): the COVs "from the data" of a model
 * version's compressible strata, the set-up a run uses (entered values win over the data, the data
 * over nothing), and the Monte Carlo inputs at a named point or a grid node. Pure: the service
 * gathers the tests and the σ'p fits, the worker threads draw the realisations.
 */

/** The scatter the data give, as stored on a run when it is made: per stratum, and the σ'p fits' covariances. */
export interface RunScatterData {
  strata: RunStratumScatter[]
  /** Stratum code → covariance of its fitted σ'p trend's parameters (refitted to the version's points). */
  trends: Record<string, TrendCovariance>
}

/**
 * Sample coefficient of variation s/x̄ (n − 1 in s) of positive values; null for fewer than two
 * values or a mean that is not positive.
 */
export function sampleCov(values: readonly number[]): number | null {
  if (values.length < 2) return null
  const mean = sampleMean(values)
  if (!(mean > 0)) return null
  return sampleSd(values, mean) / mean
}

const TEST_VARIABLES = ['cc', 'cr', 'e0', 'cv'] as const

/** Strata that drains pass through (ch scatters only there). */
function drainedStrata(drains: { strata: readonly string[] } | null | undefined): Set<string> {
  return new Set(drains?.strata ?? [])
}

/**
 * The COVs "from the data" of each compressible stratum of a definition: Cc, Cr, e0 and cv from
 * the stratum's eligible oedometer tests (very poor samples and reviewer exclusions left out —
 * the tests the adopted mean is taken from, `eligibleTests`), sample sd / mean with n shown;
 * fewer than `RUN_SCATTER_MIN_TESTS` → the stated default (`source: 'default'`). σ'p: whole
 * trend lines where `trends` has the stratum's fit covariance, else the default COV; ch (where
 * drains pass) has no test here, so its default.
 */
export function scatterFromTests(
  def: Pick<SiteModelDefinition, 'strata'>,
  tests: readonly TestCompressibility[],
  excluded: ReadonlySet<string>,
  trends: Readonly<Record<string, TrendCovariance>> = {},
  drains?: { strata: readonly string[] } | null,
): RunStratumScatter[] {
  const drained = drainedStrata(drains)
  const cap = RUN_PROBABILISTIC_LIMITS.cov
  return def.strata.filter(s => s.compressible).map((s) => {
    const use = eligibleTests(tests, s.code, excluded)
    const variables: RunVariableScatter[] = TEST_VARIABLES.map((variable) => {
      const values = use.map(t => t[variable]).filter((v): v is number => v !== null && Number.isFinite(v) && (variable !== 'cv' || v > 0))
      const cov = values.length >= RUN_SCATTER_MIN_TESTS ? sampleCov(values) : null
      return cov === null
        ? { variable, cov: RUN_SCATTER_DEFAULT_COV[variable], source: 'default' as const, n: values.length }
        : { variable, cov: Math.min(cap, cov), source: 'data' as const, n: values.length }
    })
    if (drained.has(s.code)) variables.push({ variable: 'ch', cov: RUN_SCATTER_DEFAULT_COV.ch, source: 'default', n: 0 })
    const fit = trends[s.code]
    variables.push(fit && s.trend && !s.trend.manual
      ? { variable: 'preconsolidation', cov: 0, source: 'data', n: s.trend.n, trend: true }
      : { variable: 'preconsolidation', cov: RUN_SCATTER_DEFAULT_COV.preconsolidation, source: 'default', n: 0 })
    return { code: s.code, name: s.name, variables }
  })
}

/** Codes in `layers` that are not a compressible stratum of the definition, each with the plain reason. */
export function unknownScatterStrata(def: Pick<SiteModelDefinition, 'strata'>, p: Pick<RunProbabilistic, 'layers'>): { code: string, message: string }[] {
  const out: { code: string, message: string }[] = []
  for (const code of Object.keys(p.layers)) {
    const s = def.strata.find(x => x.code === code)
    if (!s) out.push({ code, message: `options.probabilistic.layers names stratum ${code}, which is not in the run's model version. Strata there: ${def.strata.map(x => x.code).join(', ')}.` })
    else if (!s.compressible) out.push({ code, message: `options.probabilistic.layers names stratum ${code} (${s.name}), which is not compressible: its parameters do not enter the settlement.` })
  }
  return out
}

/** The set-up a run uses: its strata with the source of every COV, the engine's variation per stratum code, warnings. */
export interface ResolvedScatter {
  strata: RunStratumScatter[]
  variation: Record<string, StratumVariation>
  warnings: string[]
}

/**
 * What scatters in a run: per compressible stratum and variable, the entered value, else (with
 * `fromData`) the data's, else nothing. σ'p from the data with a fit covariance is drawn as whole
 * trend lines (the version's trend as the mean line). ch is drawn in the strata of `drainedCodes`
 * (the strata whose drains the Monte Carlo takes, `runMonteCarloDrains`); elsewhere it is recorded
 * but not drawn, and t90 is by vertical drainage.
 */
export function resolveScatter(def: Pick<SiteModelDefinition, 'strata'>, p: RunProbabilistic, data: RunScatterData | null, drainedCodes: ReadonlySet<string> = new Set()): ResolvedScatter {
  const strata: RunStratumScatter[] = []
  const variation: Record<string, StratumVariation> = {}
  const warnings: string[] = []
  for (const s of def.strata) {
    if (!s.compressible) continue
    const entered = p.layers[s.code] ?? {}
    const fromData = p.fromData ? data?.strata.find(x => x.code === s.code) : undefined
    const variables: RunVariableScatter[] = []
    const v: StratumVariation = {}
    for (const variable of RUN_SCATTER_VARIABLES) {
      const e = entered[variable]
      const d = fromData?.variables.find(x => x.variable === variable)
      let used: RunVariableScatter | null = null
      if (e) used = { variable, cov: e.cov, source: 'entered', n: 0, ...(e.correlationLength !== undefined ? { correlationLength: e.correlationLength } : {}) }
      else if (d) used = { ...d }
      if (!used) continue
      variables.push(used)
      if (variable === 'ch' && !drainedCodes.has(s.code)) {
        if (used.cov > 0) warnings.push(`Stratum ${s.code}: ch is recorded but not varied; the spread is of final primary settlement and of t90 by vertical drainage.`)
        continue
      }
      if (variable === 'preconsolidation' && used.trend) {
        const cov = data?.trends[s.code]
        if (cov && s.trend) {
          const fit: TrendFit = {
            model: s.trend.model,
            ...(s.trend.crustBelow ? { crustBelow: s.trend.crustBelow } : {}),
            logSpace: s.trend.logSpace,
            parameters: { ...s.trend.parameters },
            n: s.trend.n,
            k: cov.names.length + 1,
            r2: s.trend.r2 ?? 0,
            rmse: s.trend.rmse ?? 0,
            aic: s.trend.aic ?? 0,
            aicc: s.trend.aicc ?? 0,
            band: [],
            covariance: cov,
            depthRange: { top: 0, bottom: 0 },
          }
          v.preconsolidation = { trend: fit }
          continue
        }
        used.trend = false
        used.cov = RUN_SCATTER_DEFAULT_COV.preconsolidation
        used.source = 'default'
      }
      if (used.cov > 0) v[variable] = { cov: used.cov, ...(used.correlationLength !== undefined ? { correlationLength: used.correlationLength } : {}) }
    }
    const assumed = variables.filter(x => x.source === 'default')
    if (assumed.length > 0) {
      warnings.push(`Stratum ${s.code}: fewer than ${RUN_SCATTER_MIN_TESTS} usable tests for ${assumed.map(x => VARIABLE_WORDS[x.variable]).join(', ')}; assumed COVs used (${assumed.map(x => `${VARIABLE_WORDS[x.variable]} ${x.cov}`).join(', ')}).`)
    }
    if (variables.length > 0) strata.push({ code: s.code, name: s.name, variables })
    if (Object.keys(v).length > 0) variation[s.code] = v
  }
  if (Object.keys(variation).length === 0) warnings.push('No parameter varies: every realisation equals the deterministic settlement.')
  return { strata, variation, warnings }
}

/** How the set-up names each variable in words. */
export const VARIABLE_WORDS: Record<RunScatterVariable, string> = {
  cc: 'Cc', cr: 'Cr', e0: 'e0', cv: 'cv', ch: 'ch', preconsolidation: 'σ\'p',
}

/** The engine's options of a run's Monte Carlo (strata keyed by code: each layer's drainage group), with its drains if any. */
export function runMonteCarloOptions(p: RunProbabilistic, variation: Record<string, StratumVariation>, realizations = p.realizations, drains?: Record<string, StratumDrains>): MonteCarloOptions {
  return {
    realizations,
    seed: p.seed,
    strata: variation,
    keyBy: 'drainageGroup',
    ccE0Correlation: p.ccE0Correlation,
    ...(p.limit !== undefined ? { limit: p.limit } : {}),
    ...(drains && Object.keys(drains).length > 0 ? { drains } : {}),
  }
}

/** Whether every load of a run is placed at once and stays (no construction schedule, no removal). */
export function loadsPlacedAtOnce(loads: readonly RunLoad[]): boolean {
  return loads.every(l => !(l.stages !== undefined && l.stages.length > 0) && l.removeAt === undefined)
}

/**
 * The drains the Monte Carlo takes, by stratum code: De, μ and ch/cv of each drained stratum's
 * unit exactly as the deterministic path sets them (`treatmentProfile`: Barron's 1948 De, Hansbo's
 * 1981 μ with smear and, with qw, well resistance). Only for a run whose loads are placed at once
 * (a schedule or a surcharge taken off is not drawn); undefined without drains.
 */
export function runMonteCarloDrains(input: RunComputeInput): Record<string, StratumDrains> | undefined {
  const drains = input.options.drains
  if (!drains || !loadsPlacedAtOnce(input.loads)) return undefined
  const profile = runProfile(input)
  const t = treatmentProfile(input.definition, profile.layers, profile.stratumOf, buildSettlementKernel(profile.base), drains)
  const out: Record<string, StratumDrains> = {}
  t.units.forEach((u, k) => {
    if (!u.drains) return
    out[input.definition.strata[t.unitStratum[k]!]!.code] = { influenceDiameter: u.drains.influenceDiameter, mu: u.drains.mu, chRatio: drains.chRatio }
  })
  return Object.keys(out).length > 0 ? out : undefined
}

/**
 * The settlement input at a plan point of a run, with cv so t90 can be drawn: the same profile as
 * the run's named points, under the loads in place at the end (as the grid takes them: a treated
 * run's surcharge removed).
 */
export function runSettlementInputAt(input: RunComputeInput, x: number, y: number): SettlementInput {
  const def = input.definition
  const stressInput = toStressInput(def)
  const evaluate = createStressEvaluator(stressInput)
  const layers = toSettlementLayers(def, z => evaluate(z).effectiveStress, { maxThickness: input.options.maxSublayerThickness })
  const loads = resolveLoads(input.loads)
  return {
    ...stressInput,
    layers,
    sublayers: { maxThickness: input.options.maxSublayerThickness },
    load: { type: 'uniform', pressure: 0 },
    stressIncrease: planStressIncrease(isTreated(input.loads, input.options.drains) ? permanentLoads(input.loads, loads) : loads, x, y),
  }
}

/** The realisations a grid node gets: at most a chunk, at most the run's, within the grid budget; 0 when even the minimum is too much. */
export function gridNodeRealizations(realizations: number, nodes: number, sublayers: number): number {
  if (nodes === 0) return 0
  const w = RUN_PROBABILISTIC_WORK
  const fit = Math.floor(w.grid / (nodes * Math.max(1, sublayers)) / 100) * 100
  const n = Math.min(realizations, w.gridNodeRealizations, fit)
  return n >= w.gridNodeMinimum ? n : 0
}

/** P50 and P95 of final primary settlement at each grid node (one chunk of draws each: seeded, so any split gives the same). */
export function gridNodeQuantiles(input: RunComputeInput, options: MonteCarloOptions, nodes: readonly (readonly [number, number])[]): { p50: number[], p95: number[] } {
  const p50: number[] = []
  const p95: number[] = []
  for (const [x, y] of nodes) {
    const plan = planMonteCarlo(runSettlementInputAt(input, x, y), options)
    const s = sortedFinite(simulateChunks(plan, 0, Math.ceil(options.realizations / MONTE_CARLO_CHUNK)).settlement)
    p50.push(quantileOfSorted(s, 0.5))
    p95.push(quantileOfSorted(s, 0.95))
  }
  return { p50, p95 }
}

/** The draws of chunks [chunkStart, chunkEnd) at a named point of a run. */
export function pointChunks(input: RunComputeInput, options: MonteCarloOptions, x: number, y: number, chunkStart: number, chunkEnd: number): MonteCarloSamples {
  return simulateChunks(planMonteCarlo(runSettlementInputAt(input, x, y), options), chunkStart, chunkEnd)
}

/** P(settlement > s) at `steps` settlements evenly spread from the least to the greatest realisation. */
export function exceedanceCurve(settlement: ArrayLike<number>, steps = 41): { settlement: number[], probability: number[] } {
  const sorted = sortedFinite(settlement)
  const n = sorted.length
  if (n === 0) return { settlement: [], probability: [] }
  const lo = sorted[0]!
  const hi = sorted[n - 1]!
  const k = hi > lo ? steps : 1
  const out = { settlement: [] as number[], probability: [] as number[] }
  let j = 0
  for (let i = 0; i < k; i++) {
    const s = k === 1 ? lo : lo + ((hi - lo) * i) / (k - 1)
    while (j < n && sorted[j]! <= s) j++
    out.settlement.push(s)
    out.probability.push((n - j) / n)
  }
  return out
}

/** A point's block of the run results from the engine's summary and its settlement draws. */
export function pointProbabilistic(mc: MonteCarloResult, settlement: ArrayLike<number>): RunPointProbabilistic {
  return {
    realizations: mc.realizations,
    mean: mc.mean,
    sd: mc.sd,
    quantiles: mc.quantiles,
    deterministic: mc.deterministic,
    histogram: mc.histogram,
    exceedanceCurve: exceedanceCurve(settlement),
    ...(mc.exceedance ? { exceedance: mc.exceedance } : {}),
    ...(mc.t90 ? { t90: mc.t90 } : {}),
    sensitivity: mc.sensitivity.map(e => ({ stratum: e.stratum, variable: e.variable, rankCorrelation: e.rankCorrelation })),
    warnings: mc.warnings,
  }
}
