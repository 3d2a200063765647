import { geometricMean, linearRegression, mean, rSquared, sampleStandardDeviation } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { expectGeotechError } from '../../helpers/geotech'
import {
  evaluateTrend,
  fitTrend,
  ocrProfile,
  popProfile,
  studentTQuantile,
  type TrendPoint,
} from '../../../shared/geotech/trends'


/** Deterministic noise: Park & Miller (1988) minimal standard generator, then Box–Muller for a normal deviate. */
function noise(seed: number): () => number {
  let s = seed
  const uniform = () => {
    s = (s * 16807) % 2147483647
    return s / 2147483647
  }
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform())
}

// σ'v0 of the demo site's estuarine and glacial clays (demo scenario): water table 1.6 m, hydrostatic to
// 12 m, under-drained below toward a piezometric level of 4.5 m in the sand at 21.5 m.
function demoEffectiveStress(z: number): number {
  const total = 19 * 1.2 + 18 * 0.4 + 18.5 * (Math.min(z, 3.4) - 1.6) + 16 * Math.max(0, Math.min(z, 15) - 3.4) + 20.5 * Math.max(0, z - 15)
  const u12 = 9.81 * (12 - 1.6)
  const u = z <= 12 ? 9.81 * (z - 1.6) : u12 + ((9.81 * (21.5 - 4.5) - u12) / 9.5) * (z - 12)
  return total - u
}

// Three boreholes whose ground levels differ (±0.4 m on the demo site), so σ'v0 at one depth differs
// between holes by a few kPa — what lets POP/OCR trends be told apart from a plain depth trend.
const HOLE_OFFSETS = [-0.4, 0, 0.4]
function points(depths: number[], truth: (z: number, s: number) => number, sd: number, seed: number): TrendPoint[] {
  const rand = noise(seed)
  const out: TrendPoint[] = []
  for (const offset of HOLE_OFFSETS) {
    for (const z of depths) {
      const s = demoEffectiveStress(z + offset)
      out.push({ depth: z, effectiveStress: s, preconsolidation: truth(z, s) + sd * rand() })
    }
  }
  return out
}
const range = (from: number, to: number, step: number) => Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step)

describe('studentTQuantile', () => {
  // Two-sided 95 % critical values from standard t tables (e.g. Fisher & Yates; any statistics text), 3 decimals.
  it.each([
    [5, 2.571],
    [10, 2.228],
    [30, 2.042],
    [20, 2.086],
    [3, 3.182],
  ])('t(0.975, %d) = %f (standard t table)', (dof, table) => {
    expect(Math.abs(studentTQuantile(0.975, dof) - table)).toBeLessThan(0.0005)
  })

  it('matches the closed forms for 1 and 2 degrees of freedom', () => {
    // ν = 1 is the Cauchy distribution: t = tan(π(p − ½)); ν = 2: t = (2p − 1)/√(2p(1 − p)) (Johnson, Kotz & Balakrishnan 1995 — memory).
    for (const p of [0.6, 0.9, 0.975, 0.995]) {
      expect(studentTQuantile(p, 1)).toBeCloseTo(Math.tan(Math.PI * (p - 0.5)), 8)
      expect(studentTQuantile(p, 2)).toBeCloseTo((2 * p - 1) / Math.sqrt(2 * p * (1 - p)), 9)
    }
  })

  it('tends to the normal quantile 1.959964 for large ν (standard normal table) and is symmetric', () => {
    expect(studentTQuantile(0.975, 1e7)).toBeCloseTo(1.959964, 5)
    expect(studentTQuantile(0.025, 7)).toBeCloseTo(-studentTQuantile(0.975, 7), 12)
    expect(studentTQuantile(0.5, 4)).toBe(0)
  })
})

describe('fitTrend — constant and linear against simple-statistics', () => {
  const rand = noise(7)
  const pts: TrendPoint[] = range(3.5, 15, 0.5).map(z => ({ depth: z, preconsolidation: 40 + 5.5 * z + 4 * rand() }))
  const data = pts.map(p => [p.depth, p.preconsolidation])

  it('linear parameters and R² equal linearRegression and rSquared', () => {
    const fit = fitTrend(pts, { model: 'linear' })
    const ref = linearRegression(data)
    expect(fit.parameters.gradient).toBeCloseTo(ref.m, 10)
    expect(fit.parameters.intercept).toBeCloseTo(ref.b, 9)
    expect(fit.r2).toBeCloseTo(rSquared(data, x => ref.b + ref.m * x), 10)
    expect(fit.n).toBe(pts.length)
  })

  it('constant is the mean, with a band of mean ± t·s/√n', () => {
    const values = pts.map(p => p.preconsolidation)
    const fit = fitTrend(pts, { model: 'constant' })
    expect(fit.parameters.preconsolidation).toBeCloseTo(mean(values), 10)
    expect(fit.r2).toBe(0)
    const half = studentTQuantile(0.975, values.length - 1) * sampleStandardDeviation(values) / Math.sqrt(values.length)
    expect(fit.band[0]!.upper - fit.band[0]!.fitted).toBeCloseTo(half, 9)
    expect(fit.band).toHaveLength(50)
  })

  it('linear band is ŷ ± t·s·√(1/n + (z − z̄)²/Szz) (mean-response interval, any regression text)', () => {
    const fit = fitTrend(pts, { model: 'linear' })
    const ref = linearRegression(data)
    const n = pts.length
    const zbar = mean(pts.map(p => p.depth))
    const szz = pts.reduce((s, p) => s + (p.depth - zbar) ** 2, 0)
    const rss = pts.reduce((s, p) => s + (p.preconsolidation - ref.b - ref.m * p.depth) ** 2, 0)
    const sres = Math.sqrt(rss / (n - 2))
    const t = studentTQuantile(0.975, n - 2)
    for (const b of [fit.band[0]!, fit.band[25]!, fit.band[49]!]) {
      const half = t * sres * Math.sqrt(1 / n + (b.depth - zbar) ** 2 / szz)
      expect(b.upper - b.fitted).toBeCloseTo(half, 9)
      expect(b.fitted - b.lower).toBeCloseTo(half, 9)
    }
    expect(fit.band[0]!.depth).toBe(3.5)
    expect(fit.band[49]!.depth).toBe(15)
    expect(fit.rmse).toBeCloseTo(Math.sqrt(rss / n), 10)
  })

  it('a weight of 2 equals entering the point twice; weight 0 leaves it out', () => {
    const weighted = pts.map((p, i) => ({ ...p, weight: i % 3 === 0 ? 2 : 1 }))
    const duplicated = pts.flatMap((p, i) => (i % 3 === 0 ? [p, p] : [p]))
    const a = fitTrend(weighted, { model: 'linear' })
    const b = fitTrend(duplicated, { model: 'linear' })
    expect(a.parameters.gradient).toBeCloseTo(b.parameters.gradient!, 10)
    expect(a.parameters.intercept).toBeCloseTo(b.parameters.intercept!, 9)
    const withOutlier = [...pts, { depth: 8, preconsolidation: 900, weight: 0 }]
    const c = fitTrend(withOutlier, { model: 'linear' })
    expect(c.n).toBe(pts.length)
    expect(c.parameters.gradient).toBeCloseTo(fitTrend(pts, { model: 'linear' }).parameters.gradient!, 12)
  })

  it('stays accurate for large offsets (centred sums)', () => {
    const shifted = pts.map(p => ({ ...p, depth: p.depth + 1e6 }))
    const fit = fitTrend(shifted, { model: 'linear' })
    const ref = linearRegression(shifted.map(p => [p.depth, p.preconsolidation]))
    expect(fit.parameters.gradient).toBeCloseTo(ref.m, 6)
  })
})

describe('fitTrend — AIC and AICc', () => {
  const rand = noise(11)
  const pts: TrendPoint[] = range(4, 14, 1).map(z => ({ depth: z, preconsolidation: 50 + 4 * z + 3 * rand() }))
  const fit = fitTrend(pts, { model: 'linear' })
  const n = pts.length
  const rss = pts.reduce((s, p) => s + (p.preconsolidation - fit.parameters.intercept! - fit.parameters.gradient! * p.depth) ** 2, 0)

  it('AIC = n·ln(RSS/n) + 2k (Akaike 1974), k = 2 trend parameters + residual variance', () => {
    expect(fit.k).toBe(3)
    expect(fit.aic).toBeCloseTo(n * Math.log(rss / n) + 2 * 3, 9)
  })

  it('AICc = AIC + 2k(k+1)/(n − k − 1), equal to Hurvich & Tsai\'s (1989) regression form n·ln(RSS/n) + n(n+m)/(n−m−2) less n', () => {
    expect(fit.aicc).toBeCloseTo(fit.aic + (2 * 3 * 4) / (n - 3 - 1), 9)
    const m = 2
    expect(fit.aicc + n).toBeCloseTo(n * Math.log(rss / n) + (n * (n + m)) / (n - m - 2), 9)
  })

  it('AICc is Infinity when n ≤ k + 1', () => {
    const three = fitTrend(pts.slice(0, 3), { model: 'linear' })
    expect(three.aicc).toBe(Infinity)
    expect(Number.isFinite(three.aic)).toBe(true)
  })
})

describe('fitTrend — POP and OCR', () => {
  const pts = points(range(4, 14, 1), (_z, s) => s + 25, 2, 3)

  it('POP is the weighted mean of σ\'p − σ\'v0 (least squares with σ\'v0 as offset)', () => {
    const fit = fitTrend(pts, { model: 'pop' })
    expect(fit.parameters.pop).toBeCloseTo(mean(pts.map(p => p.preconsolidation - p.effectiveStress!)), 10)
    expect(fit.parameters.pop).toBeGreaterThan(23)
    expect(fit.parameters.pop).toBeLessThan(27)
  })

  it('OCR is Σσ\'pσ\'v0/Σσ\'v0² (regression through the origin)', () => {
    const glacial = points(range(15.5, 21, 0.5), (_z, s) => 2.4 * s, 4, 5)
    const fit = fitTrend(glacial, { model: 'ocr' })
    const num = glacial.reduce((s, p) => s + p.preconsolidation * p.effectiveStress!, 0)
    const den = glacial.reduce((s, p) => s + p.effectiveStress! ** 2, 0)
    expect(fit.parameters.ocr).toBeCloseTo(num / den, 10)
    expect(fit.parameters.ocr).toBeCloseTo(2.4, 1)
  })

  it('profiles give POP(z) and OCR(z) from the fitted trend', () => {
    const fit = fitTrend(pts, { model: 'pop' })
    const stress = [{ depth: 5, effectiveStress: 40 }, { depth: 10, effectiveStress: 70 }]
    const pop = popProfile(fit, stress)
    expect(pop.map(p => p.pop)).toEqual([fit.parameters.pop, fit.parameters.pop].map(v => expect.closeTo(v!, 10)))
    const ocr = ocrProfile(fit, stress)
    expect(ocr[0]!.ocr).toBeCloseTo((40 + fit.parameters.pop!) / 40, 12)
    expect(evaluateTrend(fit, 10, 70)).toBeCloseTo(70 + fit.parameters.pop!, 12)
    expectGeotechError(() => evaluateTrend(fit, 10), 'effective-stress-missing')
    expectGeotechError(() => ocrProfile(fit, [{ depth: 1, effectiveStress: 0 }]), 'effective-stress-not-positive')
  })

  it('needs σ\'v0 at every point', () => {
    expectGeotechError(() => fitTrend([...pts, { depth: 9, preconsolidation: 80 }], { model: 'pop' }), 'effective-stress-missing')
    expectGeotechError(() => fitTrend([{ depth: 9, preconsolidation: 80 }, { depth: 10, preconsolidation: 85 }], { model: 'ocr' }), 'effective-stress-missing')
  })
})

describe('fitTrend — log space', () => {
  it('constant on ln σ\'p gives the geometric mean (median back-transform)', () => {
    const values = [60, 75, 90, 120, 150]
    const fit = fitTrend(values.map((v, i) => ({ depth: i + 1, preconsolidation: v })), { model: 'constant', logSpace: true })
    expect(fit.parameters.preconsolidation).toBeCloseTo(geometricMean(values), 9)
    // The band is symmetric in ln σ'p, so multiplicative about the fitted value.
    const b = fit.band[0]!
    expect(b.upper / b.fitted).toBeCloseTo(b.fitted / b.lower, 10)
  })

  it('OCR on ln σ\'p is exp(mean ln(σ\'p/σ\'v0))', () => {
    const glacial = points(range(15.5, 21, 0.5), (_z, s) => 2.4 * s, 6, 9)
    const fit = fitTrend(glacial, { model: 'ocr', logSpace: true })
    expect(fit.parameters.ocr).toBeCloseTo(geometricMean(glacial.map(p => p.preconsolidation / p.effectiveStress!)), 8)
  })

  it('linear on ln σ\'p reaches the least-squares optimum of Σ(ln σ\'p − ln(a + b·z))²', () => {
    const rand = noise(21)
    const pts = range(3.5, 15, 0.5).map(z => ({ depth: z, preconsolidation: (40 + 5 * z) * Math.exp(0.08 * rand()) }))
    const fit = fitTrend(pts, { model: 'linear', logSpace: true })
    const sse = (a: number, b: number) => pts.reduce((s, p) => s + (Math.log(p.preconsolidation) - Math.log(a + b * p.depth)) ** 2, 0)
    const { intercept: a, gradient: b } = fit.parameters as { intercept: number, gradient: number }
    const best = sse(a, b)
    for (const [da, db] of [[0.05, 0], [-0.05, 0], [0, 0.005], [0, -0.005], [0.05, -0.005]]) {
      expect(sse(a + da!, b + db!)).toBeGreaterThan(best)
    }
    expect(a).toBeGreaterThan(30)
    expect(b).toBeGreaterThan(4)
    expect(fit.aic).toBeCloseTo(pts.length * Math.log(best / pts.length) + 2 * 3, 8)
  })

  it('rejects a non-positive σ\'p', () => {
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: 50 }, { depth: 2, preconsolidation: 0 }, { depth: 3, preconsolidation: 40 }], { model: 'linear', logSpace: true }), 'preconsolidation-not-positive')
  })
})

describe('fitTrend — crust model', () => {
  // Crust down to 3.0 m with σ'p falling 40 kPa/m, continuous with constant POP = 25 kPa below (demo-like), 3 % noise.
  const rand = noise(17)
  const zb = 3
  const crustPoints: TrendPoint[] = range(0.5, 10, 0.25).map((z) => {
    const s = demoEffectiveStress(Math.max(z, 1.7))
    const truth = z < zb ? demoEffectiveStress(zb) + 25 - 40 * (z - zb) : s + 25
    return { depth: z, effectiveStress: s, preconsolidation: truth * (1 + 0.03 * rand()) }
  })

  it('recovers the breakpoint, the crust gradient and POP', () => {
    const fit = fitTrend(crustPoints, { model: 'crust', effectiveStressAt: z => demoEffectiveStress(Math.max(z, 1.7)) })
    expect(fit.crustBelow).toBe('pop')
    expect(Math.abs(fit.parameters.breakpointDepth! - zb)).toBeLessThan(0.15)
    expect(fit.parameters.crustGradient! / -40).toBeGreaterThan(0.9)
    expect(fit.parameters.crustGradient! / -40).toBeLessThan(1.1)
    expect(Math.abs(fit.parameters.pop! - 25)).toBeLessThan(2)
    expect(fit.k).toBe(4) // POP, gradient, breakpoint, residual variance
    // Continuous at zb and evaluable above it without σ'v0.
    const above = evaluateTrend(fit, fit.parameters.breakpointDepth! - 1e-9)
    const below = evaluateTrend(fit, fit.parameters.breakpointDepth!, fit.parameters.effectiveStressAtBreakpoint)
    expect(above).toBeCloseTo(below, 6)
    expect(evaluateTrend(fit, 1)).toBeCloseTo(fit.parameters.valueAtBreakpoint! + fit.parameters.crustGradient! * (1 - fit.parameters.breakpointDepth!), 10)
    // The band includes the breakpoint depth so the kink is drawn.
    expect(fit.band.some(b => b.depth === fit.parameters.breakpointDepth)).toBe(true)
    expect(fit.band.every(b => b.lower < b.fitted && b.fitted < b.upper)).toBe(true)
  })

  it('works over a constant σ\'p without stresses', () => {
    const pts = range(0.5, 8, 0.25).map(z => ({ depth: z, preconsolidation: z < 2 ? 100 - 30 * (z - 2) : 100 }))
    const fit = fitTrend(pts, { model: 'crust' })
    expect(fit.crustBelow).toBe('constant')
    expect(fit.parameters.breakpointDepth).toBeCloseTo(2, 4)
    expect(fit.parameters.preconsolidation).toBeCloseTo(100, 6)
    expect(fit.parameters.crustGradient).toBeCloseTo(-30, 6)
  })

  it('refuses a "crust" whose σ\'p rises with depth, and auto says why it was not fitted', () => {
    // A crust is σ'p falling with depth down to the breakpoint (common practice); constant-POP data have none.
    const pts = points(range(4, 14.5, 0.75), (_z, s) => s + 25, 0, 1)
    expectGeotechError(() => fitTrend(pts, { model: 'crust' }), 'no-crust')
    const auto = fitTrend(pts, { model: 'auto' })
    expect(auto.candidates!.find(c => c.model === 'crust')).toHaveProperty('skipped')
    expect(auto.reason).toContain('no crust')
  })

  it('needs points on both sides of the breakpoint', () => {
    expectGeotechError(() => fitTrend(crustPoints.slice(0, 3), { model: 'crust' }), 'too-few-points')
  })
})

describe('fitTrend — auto picks the generating model on clean synthetic data', () => {
  const estuarine = range(4, 14.5, 0.75)
  const glacial = range(15.5, 21, 0.5)
  const truths = [
    ['pop', estuarine, (_z: number, s: number) => s + 25, 2],
    ['ocr', glacial, (_z: number, s: number) => 2.4 * s, 3],
    ['linear', estuarine, (z: number) => 20 + 9 * z, 2],
    ['constant', glacial, () => 300, 4],
  ] as const

  it.each(truths)('%s, noise-free', (model, depths, truth) => {
    const fit = fitTrend(points(depths, truth, 0, 1), { model: 'auto' })
    expect(fit.model).toBe(model)
    expect(fit.candidates).toHaveLength(5)
    // The reason names every fitted candidate with its AICc.
    for (const c of fit.candidates!) {
      if ('aicc' in c && Number.isFinite(c.aicc)) expect(fit.reason).toContain(c.aicc.toFixed(1))
    }
    expect(fit.reason).toMatch(/lowest AICc/)
  })

  // With noise, AICc still prefers a larger model that nests the true one now and then: for one extra
  // parameter about P(χ²₁ > 2) ≈ 16 % of the time (Burnham & Anderson 2002 — memory). Over 40 noisy data
  // sets the generating model must win at least 70 % of the time.
  it.each(truths)('%s, with noise, over 40 data sets', (model, depths, truth, sd) => {
    let wins = 0
    for (let seed = 1; seed <= 40; seed++) {
      if (fitTrend(points(depths, truth, sd, 1000 + seed), { model: 'auto' }).model === model) wins++
    }
    expect(wins / 40).toBeGreaterThanOrEqual(0.7)
  })

  it('crust', () => {
    const pts = points(range(0.5, 10, 0.25), (z, s) => (z < 3 ? demoEffectiveStress(3) + 25 - 40 * (z - 3) : s + 25), 2, 47)
    expect(fitTrend(pts, { model: 'auto' }).model).toBe('crust')
  })

  it('skips models that have too few points and says so', () => {
    const pts = points([5, 8], (_z, s) => s + 25, 1, 53).slice(0, 3)
    const fit = fitTrend(pts, { model: 'auto' })
    expect(fit.candidates!.some(c => 'skipped' in c && c.model === 'crust')).toBe(true)
    expect(fit.reason).toContain('Not fitted')
  })
})

describe('fitTrend — errors', () => {
  it('too few points for the model (n ≤ number of parameters)', () => {
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: 50 }], { model: 'constant' }), 'too-few-points')
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: 50 }, { depth: 2, preconsolidation: 60 }], { model: 'linear' }), 'too-few-points')
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: 50, effectiveStress: 20 }], { model: 'pop' }), 'too-few-points')
  })

  it('rejects a negative weight and a non-positive σ\'p', () => {
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: 50, weight: -1 }, { depth: 2, preconsolidation: 60 }], { model: 'constant' }), 'weight-not-valid')
    expectGeotechError(() => fitTrend([{ depth: 1, preconsolidation: -5 }, { depth: 2, preconsolidation: 60 }], { model: 'constant' }), 'preconsolidation-not-positive')
  })
})
