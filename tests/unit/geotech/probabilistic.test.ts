import { describe, it, expect } from 'vitest'
import {
  equalIntervalBreaks,
  mean as ssMean,
  quantileSorted,
  sampleCorrelation,
  sampleRankCorrelation,
  sampleStandardDeviation,
} from 'simple-statistics'
import { computeSettlement, type SettlementInput, type SettlementLayer } from '../../../shared/geotech/settlement'
import { fitTrend, evaluateTrend, studentTQuantile } from '../../../shared/geotech/trends'
import {
  joinSamples,
  planMonteCarlo,
  runMonteCarlo,
  simulateChunks,
  summariseMonteCarlo,
  type MonteCarloOptions,
} from '../../../shared/probabilistic/monte-carlo'
import { histogramOfSorted, midranks, quantileOfSorted, rankCorrelation, sampleSd, sortedFinite } from '../../../shared/probabilistic/summary'
import { localAverageCovariance, varianceFunction } from '../../../shared/probabilistic/field'
import { normalStream } from '../../../shared/probabilistic/random'
import { catchGeotechError } from '../../helpers/geotech'
import { consolidationUnits, degreeOfConsolidation, timeFactor } from '../../../shared/geotech/consolidation'
import { combinedDegree, hansboMu, influenceDiameter, radialDegree, radialTimeFactor } from '../../../shared/geotech/radial-consolidation'

/*
 * Checks of the Monte Carlo settlement engine (shared/probabilistic/monte-carlo.ts) against closed
 * forms. Tolerances come from the sampling error of N realisations:
 *  - a sample mean: SE = sd/√N;
 *  - a sample p-quantile of a continuous variable: SE ≈ √(p(1 − p)/N)/f(x_p), f the density there
 *    (the asymptotic normality of sample quantiles, Cramér 1946 §28.5; David & Nagaraja 2003 §10.2).
 *    For a lognormal with σ = √ln(1 + V²), f(x_p) = φ(z_p)/(x_p·σ), so SE/x_p = σ·√(p(1 − p)/N)/φ(z_p);
 *  - a sample correlation r: SE ≈ (1 − ρ²)/√N (Fisher 1915, large N).
 * Each check allows 4 SE: with the fixed seeds the numbers are fixed, and a correct engine lands
 * outside 4 SE with a probability below 1e-4 for any seed.
 */

const N = 20_000
const phi = (z: number) => Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI)
/** Standard normal quantiles z_p (Abramowitz & Stegun 1964, Table 26.5, to more digits; recalled). */
const Z: Record<number, number> = { 0.05: -1.6448536269514722, 0.1: -1.2815515655446004, 0.5: 0, 0.9: 1.2815515655446004, 0.95: 1.6448536269514722 }

const sand: SettlementLayer = { name: 'Sand', thickness: 2, unitWeight: 18, unitWeightSaturated: 20, compressible: false }

/** Sand over a 6 m normally consolidated clay (OCR 1), water at 2 m, 60 kPa areal fill. */
function ncProfile(): SettlementInput {
  return {
    layers: [
      sand,
      { name: 'Clay', thickness: 6, unitWeight: 16.5, unitWeightSaturated: 16.5, compressible: true, cc: 0.45, cr: 0.06, e0: 1.3, preconsolidation: { type: 'ocr', value: 1 }, cv: 2 },
    ],
    groundwater: { waterTableDepth: 2 },
    load: { type: 'uniform', pressure: 60 },
    sublayers: { count: 24 },
  }
}

/** Three compressible strata of every case (OC, OC-NC, NC), a drainage group of two slices, and a finite load. */
function mixedProfile(): SettlementInput {
  return {
    layers: [
      { name: 'Crust', thickness: 1.5, unitWeight: 18, unitWeightSaturated: 18.5, compressible: true, cc: 0.3, cr: 0.04, e0: 0.9, preconsolidation: { type: 'pop', value: 80 }, cv: 5 },
      { name: 'Soft clay', thickness: 3, unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.6, cr: 0.07, e0: 1.6, preconsolidation: { type: 'linear', top: 40, bottom: 45 }, cv: 1.5, drainageGroup: 'soft' },
      { name: 'Soft clay', thickness: 4, unitWeight: 16.2, unitWeightSaturated: 16.2, compressible: true, cc: 0.55, cr: 0.06, e0: 1.5, preconsolidation: { type: 'ocr', value: 1 }, cv: 1.8, drainageGroup: 'soft' },
      { name: 'Gravel', thickness: 1, unitWeight: 20, unitWeightSaturated: 21, compressible: false },
      { name: 'Stiff clay', thickness: 5, unitWeight: 19, unitWeightSaturated: 19, compressible: true, cc: 0.25, cr: 0.03, e0: 0.7, preconsolidation: { type: 'constant', value: 300 }, cv: 8, drainage: 'top' },
    ],
    groundwater: { waterTableDepth: 1 },
    load: { type: 'rectangle', width: 20, length: 40, pressure: 90 },
    sublayers: { maxThickness: 0.25 },
  }
}

describe('Monte Carlo settlement — one NC layer with only Cc random is exactly lognormal', () => {
  // S = Cc·K with K fixed (NC law, Δe = Cc·log10(σ'vf/σ'v0)), so S is lognormal with mean S(mean Cc):
  // median S/√(1 + V²), P95 = median·exp(z95·√ln(1 + V²)) (Aitchison & Brown 1957, lognormal moments).
  const cov = 0.3
  const sigma = Math.sqrt(Math.log(1 + cov * cov))
  const result = runMonteCarlo(ncProfile(), { realizations: N, seed: 17, strata: { Clay: { cc: { cov } } } })
  const s = computeSettlement(ncProfile()).settlement

  it('P50 = S(mean Cc)/√(1 + COV²) within 4 sampling SE', () => {
    const p50 = s / Math.sqrt(1 + cov * cov)
    const se = p50 * sigma * Math.sqrt(0.25 / N) / phi(0)
    expect(Math.abs(result.quantiles.p50 - p50)).toBeLessThan(4 * se)
  })

  it('P95 = P50·exp(1.645·√ln(1 + COV²)) within 4 sampling SE', () => {
    const z95 = Z[0.95]!
    expect(z95).toBeCloseTo(1.645, 3)
    const p95 = (s / Math.sqrt(1 + cov * cov)) * Math.exp(z95 * sigma)
    const se = p95 * sigma * Math.sqrt(0.95 * 0.05 / N) / phi(z95)
    expect(Math.abs(result.quantiles.p95 - p95)).toBeLessThan(4 * se)
  })

  it('P5, P10 and P90 follow the same lognormal, and the mean is S(mean Cc) within 4 SE', () => {
    for (const [p, got] of [[0.05, result.quantiles.p05], [0.1, result.quantiles.p10], [0.9, result.quantiles.p90]] as const) {
      const z = Z[p]!
      const x = (s / Math.sqrt(1 + cov * cov)) * Math.exp(z * sigma)
      expect(Math.abs(got - x)).toBeLessThan(4 * x * sigma * Math.sqrt(p * (1 - p) / N) / phi(z))
    }
    expect(Math.abs(result.mean - s)).toBeLessThan(4 * s * cov / Math.sqrt(N))
    // The sample sd of a lognormal with COV V: SE of s/sd ≈ √((κ − 1)/(4N)), κ the kurtosis (≈ 4.6 at V = 0.3).
    expect(Math.abs(result.sd / (s * cov) - 1)).toBeLessThan(4 * Math.sqrt(3.6 / (4 * N)))
    expect(result.deterministic).toBe(s)
  })

  it('ranks Cc as the only variable, with rank correlation 1 (settlement is Cc times a constant)', () => {
    expect(result.sensitivity).toEqual([{ stratum: 'Clay', variable: 'cc', rankCorrelation: 1 }])
  })

  it('counts every realisation once in the histogram', () => {
    expect(result.histogram.counts.reduce((a, b) => a + b, 0)).toBe(N)
    expect(result.histogram.edges).toHaveLength(result.histogram.counts.length + 1)
  })
})

describe('Monte Carlo settlement — the drawn parameters match the inputs', () => {
  const options: MonteCarloOptions = {
    realizations: N,
    seed: 'draws',
    strata: { Clay: { cc: { cov: 0.3 }, e0: { cov: 0.15 }, cr: { cov: 0.4 }, cv: { cov: 0.5 } } },
    ccE0Correlation: 0.5,
  }
  const plan = planMonteCarlo(ncProfile(), options)
  const samples = simulateChunks(plan, 0, Math.ceil(N / 1000))
  const layer = ncProfile().layers[1]!
  // A lognormal value from its stored normal score: m·exp(σz − σ²/2).
  const values = (name: 'cc' | 'e0' | 'cr' | 'cv', m: number, cov: number) => {
    const k = plan.variables.findIndex(v => v.variable === name)
    const s = Math.sqrt(Math.log(1 + cov * cov))
    return Array.from(samples.draws[k]!, z => m * Math.exp(s * z - s * s / 2))
  }

  it.each([['cc', 0.45, 0.3], ['e0', 1.3, 0.15], ['cr', 0.06, 0.4], ['cv', 2, 0.5]] as const)('%s: sample mean and COV within 4 SE of %s and %s', (name, m, cov) => {
    expect((layer as unknown as Record<string, unknown>)[name]).toBe(m)
    const x = values(name, m, cov)
    const mean = ssMean(x)
    const sd = sampleStandardDeviation(x)
    expect(Math.abs(mean - m)).toBeLessThan(4 * m * cov / Math.sqrt(N))
    // Kurtosis of a lognormal: κ = w⁴ + 2w³ + 3w² − 3, w = 1 + V² (Johnson, Kotz & Balakrishnan 1994, §14.3).
    const w = 1 + cov * cov
    const kappa = w ** 4 + 2 * w ** 3 + 3 * w ** 2 - 3
    expect(Math.abs(sd / mean / cov - 1)).toBeLessThan(4 * Math.sqrt((kappa - 1) / (4 * N)) + 4 * cov / Math.sqrt(N))
  })

  it('Cc and e0 correlate as asked (0.5, product-moment, simple-statistics sampleCorrelation) within 4 SE', () => {
    const r = sampleCorrelation(values('cc', 0.45, 0.3), values('e0', 1.3, 0.15))
    expect(Math.abs(r - 0.5)).toBeLessThan(4 * (1 - 0.25) / Math.sqrt(N))
  })

  it('the other pairs stay independent', () => {
    const r = sampleCorrelation(values('cc', 0.45, 0.3), values('cr', 0.06, 0.4))
    expect(Math.abs(r)).toBeLessThan(4 / Math.sqrt(N))
  })

  it('t90 is reported and falls as cv rises (rank correlation near −1 with cv)', () => {
    const result = summariseMonteCarlo(plan, samples)
    const cv = result.sensitivity.find(e => e.variable === 'cv')
    expect(cv).toBeDefined()
    expect(result.t90!.quantiles.p50).toBeGreaterThan(0)
    const k = plan.variables.findIndex(v => v.variable === 'cv')
    expect(rankCorrelation(samples.draws[k]!, samples.t90!)).toBeCloseTo(-1, 10)
  })
})

describe('Monte Carlo settlement — every COV zero gives the deterministic result exactly', () => {
  const input = mixedProfile()
  const det = computeSettlement(input)
  const zero = { cov: 0 }
  const result = runMonteCarlo(input, {
    realizations: 300,
    seed: 3,
    strata: { 'Crust': { cc: zero, cr: zero, e0: zero, cv: zero, preconsolidation: zero }, 'Soft clay': { cc: zero, e0: zero, preconsolidation: zero }, 'Stiff clay': { cr: zero } },
  })

  it('mean, every quantile and sd equal the engine\'s settlement (toBe)', () => {
    expect(det.sublayers.some(r => r.case === 'OC')).toBe(true)
    expect(det.sublayers.some(r => r.case === 'OC-NC')).toBe(true)
    expect(det.sublayers.some(r => r.case === 'NC')).toBe(true)
    expect(result.deterministic).toBe(det.settlement)
    expect(result.mean).toBe(det.settlement)
    for (const q of Object.values(result.quantiles)) expect(q).toBe(det.settlement)
    expect(result.sd).toBe(0)
    expect(result.histogram).toEqual({ edges: [det.settlement, det.settlement], counts: [300] })
    expect(result.sensitivity).toEqual([])
  })

  it('t90 equals the engine\'s t90 to 1e-9 (both bisections stop near 1e-12 of the span)', () => {
    expect(result.t90!.mean / det.times!.t90 - 1).toBeLessThan(1e-9)
    expect(Math.abs(result.t90!.quantiles.p95 / det.times!.t90 - 1)).toBeLessThan(1e-9)
  })

  it('a σ\'p scale of COV 0 on an OCR model is the model itself, also with the other strata random', () => {
    const r = runMonteCarlo(input, { realizations: 200, seed: 3, strata: { 'Crust': { preconsolidation: zero }, 'Stiff clay': { cr: { cov: 0.2 } } } })
    expect(r.sensitivity.map(e => `${e.stratum}/${e.variable}`)).toEqual(['Stiff clay/cr'])
  })
})

describe('Monte Carlo settlement — reproducible by seed', () => {
  const options: MonteCarloOptions = {
    realizations: 2500,
    seed: 42,
    strata: {
      'Crust': { cc: { cov: 0.25 }, e0: { cov: 0.1 }, preconsolidation: { cov: 0.3 } },
      'Soft clay': { cc: { cov: 0.3, correlationLength: 1.5 }, e0: { cov: 0.1, correlationLength: 1.5 }, cv: { cov: 0.4 } },
    },
    limit: 0.5,
  }

  it('the same inputs and seed give the same numbers; another seed does not', () => {
    const a = runMonteCarlo(mixedProfile(), options)
    const b = runMonteCarlo(mixedProfile(), options)
    const c = runMonteCarlo(mixedProfile(), { ...options, seed: 43 })
    expect(b).toEqual(a)
    expect(c.quantiles.p50).not.toBe(a.quantiles.p50)
    expect(a.exceedance!.limit).toBe(0.5)
  })

  it('any split of the chunks (as across workers) gives the same realisations', () => {
    const plan = planMonteCarlo(mixedProfile(), options)
    const whole = simulateChunks(plan, 0, 3)
    const split = joinSamples(plan, [simulateChunks(plan, 2, 3), simulateChunks(plan, 0, 2)])
    expect(Array.from(split.settlement)).toEqual(Array.from(whole.settlement))
    expect(Array.from(split.t90!)).toEqual(Array.from(whole.t90!))
  })

  it('the normal stream is seeded (same name, same numbers) and standard (mean 0, sd 1 within 4 SE)', () => {
    const a = normalStream(1, 'x')
    const b = normalStream(1, 'x')
    const xs = Array.from({ length: N }, () => a())
    expect(Array.from({ length: 5 }, () => b())).toEqual(xs.slice(0, 5))
    expect(Math.abs(ssMean(xs))).toBeLessThan(4 / Math.sqrt(N))
    expect(Math.abs(sampleStandardDeviation(xs) - 1)).toBeLessThan(4 * Math.sqrt(2 / (4 * N)))
  })
})

describe('Monte Carlo settlement — refusals', () => {
  it('a stratum that names no layer, or a layer that is not compressible', () => {
    expect(catchGeotechError(() => planMonteCarlo(ncProfile(), { realizations: 100, seed: 1, strata: { Peat: { cc: { cov: 0.2 } } } })).code).toBe('stratum-unknown')
    const e = catchGeotechError(() => planMonteCarlo(ncProfile(), { realizations: 100, seed: 1, strata: { Sand: { cc: { cov: 0.2 } } } }))
    expect(e.message).toContain('no compressible layer')
  })

  it('realisations out of range and a random field too large', () => {
    expect(catchGeotechError(() => planMonteCarlo(ncProfile(), { realizations: 0, seed: 1, strata: {} })).code).toBe('realizations-out-of-range')
    const fine = { ...ncProfile(), sublayers: { count: 500 } }
    expect(catchGeotechError(() => planMonteCarlo(fine, { realizations: 100, seed: 1, strata: { Clay: { cc: { cov: 0.2, correlationLength: 1 } } } })).code).toBe('field-too-large')
  })
})

describe('Random field — local averages of an exponentially correlated field (Vanmarcke 1977)', () => {
  it('γ(T) → 1 for T ≪ θ and → θ/T for T ≫ θ (Vanmarcke 1983, §5.2)', () => {
    expect(varianceFunction(1e-6, 2)).toBeCloseTo(1, 6)
    expect(varianceFunction(2e5, 2) * 2e5 / 2).toBeCloseTo(1, 4)
    // At T = θ: γ = ½·(2 − 1 + e⁻²).
    expect(varianceFunction(2, 2)).toBeCloseTo(0.5 * (2 - 1 + Math.exp(-2)) / 1, 12)
  })

  it('the covariance of two averages equals the double integral of ρ by the midpoint rule', () => {
    const theta = 1.2
    const c = localAverageCovariance([0, 0.7], [0.5, 1.5], theta)
    const m = 400
    let sum = 0
    for (let i = 0; i < m; i++) {
      const x = 0 + (i + 0.5) * 0.5 / m
      for (let j = 0; j < m; j++) {
        const y = 0.7 + (j + 0.5) * 0.8 / m
        sum += Math.exp(-2 * Math.abs(x - y) / theta)
      }
    }
    expect(c[1]).toBeCloseTo(sum / (m * m), 5)
    expect(c[0]).toBeCloseTo(varianceFunction(0.5, theta), 12)
  })

  it('each sublayer\'s drawn ln-factor has variance σ²·γ(h) (4 SE)', () => {
    const cov = 0.3
    const input = { ...ncProfile(), sublayers: { count: 12 } }
    const plan = planMonteCarlo(input, { realizations: N, seed: 9, strata: { Clay: { cc: { cov, correlationLength: 2 } } } })
    const field = plan.variables[0]!.field!
    const h = plan.thickness[0]!
    const gamma = varianceFunction(h, 2)
    const diag = Array.from({ length: 12 }, (_, i) => Array.from({ length: i + 1 }, (_, k) => field.factor[i * 12 + k]! ** 2).reduce((a, b) => a + b))
    for (const d of diag) expect(d).toBeCloseTo(gamma, 10)
    // The layer mean of the field (the sensitivity column) has the variance of the whole layer's average, γ(6 m).
    const samples = simulateChunks(plan, 0, N / 1000)
    const v = sampleStandardDeviation(Array.from(samples.draws[0]!)) ** 2
    expect(Math.abs(v / varianceFunction(6, 2) - 1)).toBeLessThan(4 * Math.sqrt(2 / N))
  })
})

describe('σ\'p from a fitted trend — a realisation is a whole trend line', () => {
  // Invented points: σ'p linear in depth with scatter.
  const points = Array.from({ length: 12 }, (_, i) => ({ depth: 2.5 + i * 0.5, preconsolidation: 40 + 6 * (2.5 + i * 0.5) + [3, -4, 2, -1, 5, -3, 0, 4, -2, -5, 1, 3][i]! }))
  const fit = fitTrend(points, { model: 'linear' })

  it('the fit\'s covariance is the band\'s: half-width = t·√(x·C·xᵀ) at every band depth', () => {
    const t = studentTQuantile(0.975, fit.n - 2)
    const c = fit.covariance!.matrix
    expect(fit.covariance!.names).toEqual(['intercept', 'gradient'])
    for (const b of fit.band) {
      const q = c[0]![0]! + 2 * b.depth * c[0]![1]! + b.depth * b.depth * c[1]![1]!
      expect(b.upper - b.fitted).toBeCloseTo(t * Math.sqrt(q), 9)
    }
  })

  it('the OLS slope variance s²/Σ(z − z̄)² (any regression text)', () => {
    const zs = points.map(p => p.depth)
    const zbar = ssMean(zs)
    const szz = zs.reduce((a, z) => a + (z - zbar) ** 2, 0)
    const s2 = fit.rmse ** 2 * fit.n / (fit.n - 2)
    expect(fit.covariance!.matrix[1]![1]).toBeCloseTo(s2 / szz, 10)
  })

  it('σ\'p drawn at a depth has the fit as its mean and the standard error of the mean response as its sd (4 SE)', () => {
    const input: SettlementInput = {
      layers: [{ name: 'Clay', thickness: 9, unitWeight: 16.5, unitWeightSaturated: 16.5, compressible: true, cc: 0.4, cr: 0.05, e0: 1.2, preconsolidation: { type: 'linear', top: 40, bottom: 94 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: 200 },
      sublayers: { count: 9 },
    }
    const plan = planMonteCarlo(input, { realizations: N, seed: 5, strata: { Clay: { preconsolidation: { trend: fit } } } })
    const samples = simulateChunks(plan, 0, N / 1000)
    // The column is the thickness-weighted mean of ln(σ'p drawn/σ'p fitted); at small spread ≈ the relative shift at mid-layer.
    const col = Array.from(samples.draws[0]!)
    expect(Math.abs(ssMean(col))).toBeLessThan(0.01)
    const c = fit.covariance!.matrix
    const z = 4.5
    const se = Math.sqrt(c[0]![0]! + 2 * z * c[0]![1]! + z * z * c[1]![1]!)
    const fitted = evaluateTrend(fit, z)
    // A linear trend's level along the layer is a linear function of the parameters; its sd is
    // bounded below by the se at the layer's mean depth and lies within a few % of it.
    const sd = sampleStandardDeviation(col) * fitted
    expect(sd).toBeGreaterThan(0.9 * se)
    expect(sd).toBeLessThan(1.3 * se)
  })
})

describe('Summaries against simple-statistics 7.12', () => {
  const stream = normalStream(7, 'summary')
  const x = Array.from({ length: 5001 }, () => Math.exp(0.3 * stream()))
  // Ties: values rounded to two decimals.
  const tied = x.map(v => Math.round(v * 100) / 100)
  const sorted = sortedFinite(x)

  it('quantiles equal quantileSorted (type 7) at P5 … P95 and the ends', () => {
    const ref = [...x].sort((a, b) => a - b)
    for (const p of [0, 0.05, 0.1, 0.5, 0.9, 0.95, 1, 0.123]) expect(quantileOfSorted(sorted, p)).toBe(quantileSorted(ref, p))
    for (const n of [1, 2, 3, 10]) {
      const small = ref.slice(0, n)
      for (const p of [0.05, 0.5, 0.95]) expect(quantileOfSorted(Float64Array.from(small), p)).toBeCloseTo(quantileSorted(small, p), 14)
    }
  })

  it('sd equals sampleStandardDeviation', () => {
    expect(sampleSd(x)).toBeCloseTo(sampleStandardDeviation(x), 12)
  })

  it('histogram edges equal equalIntervalBreaks and counts equal a direct count', () => {
    const h = histogramOfSorted(sorted, 25)
    const breaks = equalIntervalBreaks(x, 25)
    expect(h.edges).toEqual(breaks)
    const counts = h.counts.map((_, i) => x.filter(v => v >= breaks[i]! && (i === 24 ? v <= breaks[i + 1]! : v < breaks[i + 1]!)).length)
    expect(h.counts).toEqual(counts)
  })

  it('rank correlation equals sampleRankCorrelation, with and without ties', () => {
    const y = x.map((v, i) => v + 0.2 * Math.sin(i))
    expect(rankCorrelation(x, y)).toBeCloseTo(sampleRankCorrelation(x, y), 12)
    const tiedY = y.map(v => Math.round(v * 10) / 10)
    expect(rankCorrelation(tied, tiedY)).toBeCloseTo(sampleRankCorrelation(tied, tiedY), 12)
    expect(Array.from(midranks([3, 1, 3, 2]))).toEqual([2.5, 0, 2.5, 1])
  })
})

describe('Monte Carlo settlement — a variable that does not move the settlement', () => {
  it('cv alone varies: the settlement is constant, its sensitivity left out, t90 spread (no slow path on 20 000 ties)', () => {
    const r = runMonteCarlo(ncProfile(), { realizations: N, seed: 2, strata: { Clay: { cv: { cov: 0.4 } } } })
    expect(r.sd).toBe(0)
    expect(r.sensitivity).toEqual([])
    expect(r.t90!.sd).toBeGreaterThan(0)
    expect(Array.from(midranks(new Float64Array(N).fill(1)).subarray(0, 2))).toEqual([(N - 1) / 2, (N - 1) / 2])
  })
})

describe('Monte Carlo settlement — vertical drains and a random ch', () => {
  // Drains through the clay of ncProfile: De of a 1.5 m triangular pattern (Barron 1948) and
  // Hansbo's (1981) μ with smear, as the deterministic path takes them.
  const de = influenceDiameter('triangular', 1.5)
  const mu = hansboMu({ n: de / 0.052, smearRatio: 3, permeabilityRatio: 3 })

  describe('vertical drainage negligible, only ch random: t90 = μ·De²·ln 10/(8·ch) is lognormal in 1/ch', () => {
    // cv = 1e-10 m²/yr with ch/cv = 1e10 gives ch = 1 m²/yr while Uv at t90 stays below 1e-5, so
    // (1 − Uv)·exp(−8·ch·t/(μ·De²)) = 0.1 gives t90 within 1e-5 of the radial form (Hansbo 1981,
    // Barron 1948 equal strain, Ur = 1 − exp(−8·Th/μ) at Ur = 0.9) — far inside the sampling tolerance.
    // With ch lognormal of mean m and COV V, 1/ch is lognormal with median √(1 + V²)/m and the same
    // σ = √ln(1 + V²) (Aitchison & Brown 1957), so t90 has median K·√(1 + V²)/m, K = μ·De²·ln 10/8.
    const cov = 0.4
    const sigma = Math.sqrt(Math.log(1 + cov * cov))
    const profile = ncProfile()
    profile.layers[1] = { ...profile.layers[1]!, cv: 1e-10 }
    const result = runMonteCarlo(profile, { realizations: N, seed: 'drains', strata: { Clay: { ch: { cov } } }, drains: { Clay: { influenceDiameter: de, mu, chRatio: 1e10 } } })
    const k = (mu * de * de * Math.LN10) / 8
    const p50 = k * Math.sqrt(1 + cov * cov)

    it('P50 of t90 = μ·De²·ln 10·√(1 + COV²)/(8·ch) within 4 sampling SE', () => {
      const se = p50 * sigma * Math.sqrt(0.25 / N) / phi(0)
      expect(Math.abs(result.t90!.quantiles.p50 - p50)).toBeLessThan(4 * se)
    })

    it('P95 of t90 = P50·exp(1.645·√ln(1 + COV²)) within 4 sampling SE', () => {
      const z95 = Z[0.95]!
      const p95 = p50 * Math.exp(z95 * sigma)
      const se = p95 * sigma * Math.sqrt(0.95 * 0.05 / N) / phi(z95)
      expect(Math.abs(result.t90!.quantiles.p95 - p95)).toBeLessThan(4 * se)
    })

    it('leaves the settlement alone (ch does not enter it)', () => {
      expect(result.sd).toBe(0)
      expect(result.quantiles.p50).toBe(result.deterministic)
    })
  })

  it('with every COV zero, t90 equals the deterministic drained t90 (Carrillo 1942 with Hansbo 1981)', () => {
    const chRatio = 2
    const result = runMonteCarlo(ncProfile(), { realizations: 200, seed: 3, strata: { Clay: { cc: { cov: 0 }, cv: { cov: 0 }, ch: { cov: 0 } } }, drains: { Clay: { influenceDiameter: de, mu, chRatio } } })
    const { cv } = ncProfile().layers[1]!
    const hdr = consolidationUnits([{ thickness: 6, cv }])[0]!.hdr
    const degree = (t: number) => combinedDegree(degreeOfConsolidation(timeFactor(cv!, t, hdr)), radialDegree(radialTimeFactor(chRatio * cv!, t, de), mu))
    let lo = 0
    let hi = 100
    for (let i = 0; i < 200; i++) {
      const mid = 0.5 * (lo + hi)
      if (degree(mid) >= 0.9) hi = mid
      else lo = mid
    }
    // Faster than either drainage alone.
    expect(hi).toBeLessThan((mu * de * de * Math.LN10) / (8 * chRatio * cv!))
    expect(result.t90!.sd).toBe(0)
    expect(result.t90!.quantiles.p50 / hi - 1).toBeCloseTo(0, 10)
    expect(result.t90!.mean / hi - 1).toBeCloseTo(0, 10)
  })

  it('ch follows cv: with cv random and ch/cv fixed, t90 falls as cv rises; sensitivity names ch', () => {
    const result = runMonteCarlo(ncProfile(), { realizations: 2000, seed: 5, strata: { Clay: { cc: { cov: 0.3 }, cv: { cov: 0.3 }, ch: { cov: 0.3 } } }, drains: { Clay: { influenceDiameter: de, mu, chRatio: 2 } } })
    const names = result.sensitivity.map(e => e.variable)
    expect(names).toContain('ch')
    expect(names).toContain('cv')
    expect(result.t90!.quantiles.p95).toBeGreaterThan(result.t90!.quantiles.p50)
    // Without drains the same draws give a longer t90 at every quantile.
    const vertical = runMonteCarlo(ncProfile(), { realizations: 2000, seed: 5, strata: { Clay: { cc: { cov: 0.3 }, cv: { cov: 0.3 } } } })
    expect(result.t90!.quantiles.p50).toBeLessThan(vertical.t90!.quantiles.p50)
    expect(result.quantiles).toEqual(vertical.quantiles)
  })

  it('warns and leaves ch alone where no drains pass; refuses drains in an unknown stratum or with μ ≤ 0', () => {
    const plan = planMonteCarlo(ncProfile(), { realizations: 10, seed: 1, strata: { Clay: { ch: { cov: 0.3 } } } })
    expect(plan.variables).toHaveLength(0)
    expect(plan.warnings).toEqual(['Stratum "Clay": ch varies, but no drains pass through it; ch is not varied.'])
    expect(catchGeotechError(() => planMonteCarlo(ncProfile(), { realizations: 10, seed: 1, strata: {}, drains: { Sand: { influenceDiameter: de, mu, chRatio: 1 } } })).code).toBe('stratum-unknown')
    expect(catchGeotechError(() => planMonteCarlo(ncProfile(), { realizations: 10, seed: 1, strata: {}, drains: { Clay: { influenceDiameter: de, mu: 0, chRatio: 1 } } })).code).toBe('drains-invalid')
  })
})
