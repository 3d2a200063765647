// Probabilistic settlement runs, the pure part: COVs from the tests (checked against simple-statistics),
// the set-up (entered over data over nothing), unknown strata, the grid's realisations per node,
// the exceedance curve, and the Monte Carlo at a run's point equal to the run's deterministic result.
import { mean, sampleStandardDeviation } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { RUN_PROBABILISTIC_WORK, RUN_SCATTER_DEFAULT_COV } from '../../shared/schemas/settlement-run-limits'
import { RunProbabilisticSchema, type RunOptions } from '../../shared/schemas/settlement-runs'
import { computeRun, type RunComputeInput } from '../../shared/settlement-run/compute'
import {
  exceedanceCurve,
  gridNodeQuantiles,
  gridNodeRealizations,
  pointChunks,
  loadsPlacedAtOnce,
  resolveScatter,
  runMonteCarloDrains,
  runMonteCarloOptions,
  sampleCov,
  scatterFromTests,
  unknownScatterStrata,
  type RunScatterData,
} from '../../shared/settlement-run/probabilistic'
import { planMonteCarlo, runMonteCarlo, simulateChunks } from '../../shared/probabilistic/monte-carlo'
import { runSettlementInputAt } from '../../shared/settlement-run/probabilistic'
import type { TestCompressibility } from '../../shared/site-model/compressibility'
import { scenarioDefinition } from '../helpers/scenario-definition'
import { hansboMu, influenceDiameter } from '../../shared/geotech/radial-consolidation'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.5, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 }

function test(id: string, stratumCode: string, cc: number, cr: number, e0: number, cv: number | null, qualityClass: string | null = 'good'): TestCompressibility {
  return { id, stratumCode, depth: 5, qualityClass, cc, cr, e0, cv, calpha: null }
}

const EST = [
  test('a', 'EST', 0.9, 0.1, 2.1, 1.5),
  test('b', 'EST', 1.1, 0.12, 2.4, 2.5),
  test('c', 'EST', 0.8, 0.09, 1.9, 1.0),
  test('d', 'EST', 1.3, 0.14, 2.6, null),
  // Left out: a very poor sample, and one a reviewer excluded.
  test('poor', 'EST', 3.0, 0.5, 4.0, 9, 'very-poor'),
  test('flagged', 'EST', 0.2, 0.02, 0.9, 0.1),
  // Two tests only in GLA: defaults.
  test('g1', 'GLA', 0.3, 0.04, 0.8, 3),
  test('g2', 'GLA', 0.35, 0.05, 0.85, 4),
]

describe('sampleCov', () => {
  it('is the sample sd (n − 1) over the mean, as simple-statistics computes them', () => {
    const xs = [0.9, 1.1, 0.8, 1.3]
    expect(sampleCov(xs)).toBeCloseTo(sampleStandardDeviation(xs) / mean(xs), 14)
  })
  it('is null for one value or a mean that is not positive', () => {
    expect(sampleCov([1])).toBeNull()
    expect(sampleCov([-1, -2])).toBeNull()
  })
})

describe('scatterFromTests — COVs from the interpreted tests', () => {
  const def = scenarioDefinition()
  const strata = scatterFromTests(def, EST, new Set(['flagged']))
  const est = strata.find(s => s.code === 'EST')!
  const gla = strata.find(s => s.code === 'GLA')!
  const of = (s: typeof est, v: string) => s.variables.find(x => x.variable === v)!

  it('lists every compressible stratum and only those', () => {
    expect(strata.map(s => s.code)).toEqual(def.strata.filter(s => s.compressible).map(s => s.code))
  })
  it('takes Cc, Cr, e0 from the eligible tests (very poor and excluded left out), n shown', () => {
    const cc = [0.9, 1.1, 0.8, 1.3]
    expect(of(est, 'cc')).toEqual({ variable: 'cc', cov: sampleStandardDeviation(cc) / mean(cc), source: 'data', n: 4 })
    expect(of(est, 'e0').cov).toBeCloseTo(sampleStandardDeviation([2.1, 2.4, 1.9, 2.6]) / mean([2.1, 2.4, 1.9, 2.6]), 14)
    expect(of(est, 'cr').n).toBe(4)
  })
  it('takes cv only from tests that measured it', () => {
    const cv = [1.5, 2.5, 1.0]
    expect(of(est, 'cv')).toMatchObject({ source: 'data', n: 3 })
    expect(of(est, 'cv').cov).toBeCloseTo(sampleStandardDeviation(cv) / mean(cv), 14)
  })
  it('falls back to the stated defaults below three tests, with the n there was', () => {
    expect(of(gla, 'cc')).toEqual({ variable: 'cc', cov: RUN_SCATTER_DEFAULT_COV.cc, source: 'default', n: 2 })
    expect(of(gla, 'cv')).toEqual({ variable: 'cv', cov: RUN_SCATTER_DEFAULT_COV.cv, source: 'default', n: 2 })
    const crust = strata.find(s => s.code === 'CRUST')!
    expect(of(crust, 'e0')).toEqual({ variable: 'e0', cov: RUN_SCATTER_DEFAULT_COV.e0, source: 'default', n: 0 })
  })
  it('draws σ\'p as trend lines where a fit covariance is given, else its default COV', () => {
    const withFit = scatterFromTests(def, EST, new Set(), { EST: { names: ['value'], matrix: [[100]], logScale: false } })
    const estTrend = def.strata.find(s => s.code === 'EST')!.trend!
    expect(withFit.find(s => s.code === 'EST')!.variables.find(v => v.variable === 'preconsolidation')).toEqual({ variable: 'preconsolidation', cov: 0, source: 'data', n: estTrend.n, trend: true })
    expect(of(gla, 'preconsolidation')).toEqual({ variable: 'preconsolidation', cov: RUN_SCATTER_DEFAULT_COV.preconsolidation, source: 'default', n: 0 })
  })
  it('adds ch (its default) only where drains pass', () => {
    const drained = scatterFromTests(def, EST, new Set(), {}, { strata: ['EST'] })
    expect(drained.find(s => s.code === 'EST')!.variables.some(v => v.variable === 'ch')).toBe(true)
    expect(drained.find(s => s.code === 'GLA')!.variables.some(v => v.variable === 'ch')).toBe(false)
  })
})

describe('resolveScatter — the set-up a run uses', () => {
  const def = scenarioDefinition()
  const data: RunScatterData = { strata: scatterFromTests(def, EST, new Set(['flagged'])), trends: {} }

  it('uses the data with fromData, and an entered value wins', () => {
    const p = RunProbabilisticSchema.parse({ fromData: true, layers: { EST: { cc: { cov: 0.4 } } } })
    const r = resolveScatter(def, p, data)
    const est = r.strata.find(s => s.code === 'EST')!
    expect(est.variables.find(v => v.variable === 'cc')).toEqual({ variable: 'cc', cov: 0.4, source: 'entered', n: 0 })
    expect(est.variables.find(v => v.variable === 'cr')!.source).toBe('data')
    expect(r.variation.EST!.cc).toEqual({ cov: 0.4 })
    expect(r.warnings.some(w => w.startsWith('Stratum GLA: fewer than 3 usable tests'))).toBe(true)
  })
  it('without fromData varies only what is entered', () => {
    const p = RunProbabilisticSchema.parse({ layers: { EST: { cc: { cov: 0.3, correlationLength: 2 } } } })
    const r = resolveScatter(def, p, data)
    expect(r.strata).toEqual([{ code: 'EST', name: 'Estuarine clay', variables: [{ variable: 'cc', cov: 0.3, source: 'entered', n: 0, correlationLength: 2 }] }])
    expect(r.variation).toEqual({ EST: { cc: { cov: 0.3, correlationLength: 2 } } })
  })
  it('says so when nothing varies', () => {
    const r = resolveScatter(def, RunProbabilisticSchema.parse({}), null)
    expect(r.variation).toEqual({})
    expect(r.warnings).toContain('No parameter varies: every realisation equals the deterministic settlement.')
  })
  it('names a code not in the version, and a stratum that is not compressible', () => {
    const p = RunProbabilisticSchema.parse({ layers: { XX: { cc: { cov: 0.1 } }, SAND: { cc: { cov: 0.1 } }, EST: {} } })
    const u = unknownScatterStrata(def, p)
    expect(u.map(x => x.code)).toEqual(['XX', 'SAND'])
    expect(u[0]!.message).toBe('options.probabilistic.layers names stratum XX, which is not in the run\'s model version. Strata there: MG, CRUST, EST, GLA, SAND.')
    expect(u[1]!.message).toMatch(/SAND \(Dense sand\), which is not compressible/)
  })
})

describe('gridNodeRealizations — the grid within its work budget', () => {
  it('gives a node at most a chunk and at most the run\'s realisations', () => {
    expect(gridNodeRealizations(5000, 100, 50)).toBe(1000)
    expect(gridNodeRealizations(300, 100, 50)).toBe(300)
  })
  it('fewer per node when the budget asks, in hundreds; none below the minimum', () => {
    // 4·10⁷ / (2000 × 50) = 400.
    expect(gridNodeRealizations(5000, 2000, 50)).toBe(Math.floor(RUN_PROBABILISTIC_WORK.grid / (2000 * 50) / 100) * 100)
    expect(gridNodeRealizations(5000, 10_000, 100)).toBe(0)
    expect(gridNodeRealizations(5000, 0, 100)).toBe(0)
  })
})

describe('exceedanceCurve', () => {
  it('is the share of values above each settlement, from 1 − 1/n at the least to 0 at the greatest', () => {
    const c = exceedanceCurve([0.1, 0.2, 0.3, 0.4], 4)
    expect(c.settlement.map(v => Number(v.toFixed(12)))).toEqual([0.1, 0.2, 0.3, 0.4])
    expect(c.probability).toEqual([0.75, 0.5, 0.25, 0])
  })
})

describe('the Monte Carlo at a run\'s point', () => {
  const input: RunComputeInput = {
    definition: scenarioDefinition(),
    loads: [{ type: 'rectangle', x: 0, y: 0, width: 30, length: 40, rotation: 0, pressure: 60 }],
    points: [{ label: 'C', x: 0, y: 0 }],
    grid: null,
    options: OPTIONS,
  }
  it('has the run\'s deterministic settlement at the point (the same profile and loads)', () => {
    const run = computeRun(input)
    const plan = planMonteCarlo(runSettlementInputAt(input, 0, 0), runMonteCarloOptions(RunProbabilisticSchema.parse({ realizations: 100 }), {}))
    expect(plan.deterministic).toBeCloseTo(run.results.points[0]!.settlement, 12)
  })
  it('gives the same draws in chunks as in one pass (any split across threads)', () => {
    const p = RunProbabilisticSchema.parse({ realizations: 2500, seed: 7, layers: { EST: { cc: { cov: 0.3 }, e0: { cov: 0.1 } } } })
    const options = runMonteCarloOptions(p, resolveScatter(input.definition, p, null).variation)
    const whole = simulateChunks(planMonteCarlo(runSettlementInputAt(input, 0, 0), options), 0, 3).settlement
    const parts = [pointChunks(input, options, 0, 0, 0, 1), pointChunks(input, options, 0, 0, 1, 3)]
    expect([...parts[0]!.settlement, ...parts[1]!.settlement]).toEqual([...whole])
    // and the engine's summary of one pass agrees with it
    const mc = runMonteCarlo(runSettlementInputAt(input, 0, 0), options)
    expect(mc.realizations).toBe(2500)
    expect(mc.sensitivity[0]!.stratum).toBe('EST')
  })
  it('gives a grid node the P50 and P95 of its draws, the same node by node or together', () => {
    const p = RunProbabilisticSchema.parse({ realizations: 200, seed: 3, layers: { EST: { cc: { cov: 0.3 } } } })
    const options = runMonteCarloOptions(p, resolveScatter(input.definition, p, null).variation)
    const both = gridNodeQuantiles(input, options, [[0, 0], [10, 5]])
    const one = gridNodeQuantiles(input, options, [[10, 5]])
    expect(both.p50[1]).toBe(one.p50[0])
    expect(both.p95[0]!).toBeGreaterThan(both.p50[0]!)
  })
})

describe('drains in a run\'s Monte Carlo', () => {
  const drains = { strata: ['EST'], pattern: 'triangular' as const, spacing: 1.5, diameter: 0.052, smearRatio: 3, permeabilityRatio: 3, chRatio: 2 }
  const input: RunComputeInput = {
    definition: scenarioDefinition(),
    loads: [{ type: 'rectangle', x: 0, y: 0, width: 30, length: 40, rotation: 0, pressure: 60 }],
    points: [{ label: 'C', x: 0, y: 0 }],
    grid: null,
    options: { ...OPTIONS, drains },
  }
  it('takes De (Barron 1948) and μ (Hansbo 1981) as the deterministic run does, per drained stratum', () => {
    const d = runMonteCarloDrains(input)!
    const de = influenceDiameter('triangular', 1.5)
    expect(Object.keys(d)).toEqual(['EST'])
    expect(d.EST!.influenceDiameter).toBe(de)
    expect(d.EST!.mu).toBe(hansboMu({ n: de / 0.052, smearRatio: 3, permeabilityRatio: 3 }))
    expect(d.EST!.chRatio).toBe(2)
    expect(d.EST!.mu).toBe(computeRun(input).results.drains!.mu)
  })
  it('takes none without drains or when a load is staged or taken off', () => {
    expect(runMonteCarloDrains({ ...input, options: OPTIONS })).toBeUndefined()
    const staged = [{ ...input.loads[0]!, stages: [{ start: 0, duration: 1, fraction: 1 }] }]
    expect(loadsPlacedAtOnce(staged)).toBe(false)
    expect(runMonteCarloDrains({ ...input, loads: staged })).toBeUndefined()
    expect(runMonteCarloDrains({ ...input, loads: [{ ...input.loads[0]!, removeAt: 2 }] })).toBeUndefined()
  })
  it('varies ch in a drained stratum and records it elsewhere', () => {
    const p = RunProbabilisticSchema.parse({ layers: { EST: { ch: { cov: 0.3 } }, GLA: { ch: { cov: 0.2 } } } })
    const r = resolveScatter(input.definition, p, null, new Set(['EST']))
    expect(r.variation.EST).toEqual({ ch: { cov: 0.3 } })
    expect(r.variation.GLA).toBeUndefined()
    expect(r.warnings).toEqual(['Stratum GLA: ch is recorded but not varied; the spread is of final primary settlement and of t90 by vertical drainage.'])
  })
  it('with every COV zero gives the deterministic drained run\'s t90 at the point', () => {
    const p = RunProbabilisticSchema.parse({ realizations: 100, layers: { EST: { cc: { cov: 0 }, cv: { cov: 0 }, ch: { cov: 0 } } } })
    const d = runMonteCarloDrains(input)
    const mc = runMonteCarlo(runSettlementInputAt(input, 0, 0), runMonteCarloOptions(p, resolveScatter(input.definition, p, null, new Set(Object.keys(d ?? {}))).variation, 100, d))
    const run = computeRun(input).results.points[0]!
    expect(mc.t90!.sd).toBe(0)
    expect(mc.t90!.quantiles.p50 / run.t90! - 1).toBeCloseTo(0, 3)
    expect(run.t90).toBeLessThan(run.t90WithoutDrains!)
  })
})
