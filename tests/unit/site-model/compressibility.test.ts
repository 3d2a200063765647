import { linearRegression, mean, rSquared } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { compressibilityAt, depthTrendCandidates, eligibleTests, fitDepthTrend, meanCompressibility, type TestCompressibility } from '../../../shared/site-model/compressibility'
import { depthTrendAt, depthTrendProblems } from '../../../shared/site-model/definition'

const t = (id: string, code: string, cc: number, quality = 'good-to-fair', cv: number | null = 1.2, depth = 6): TestCompressibility => ({ id, stratumCode: code, depth, qualityClass: quality, cc, cr: cc / 10, e0: 2, cv, calpha: 0.034 })

describe('meanCompressibility (arithmetic mean, common practice)', () => {
  it('averages the stratum\'s tests, leaving out very poor samples and reviewer exclusions', () => {
    const tests = [t('a', 'EST', 0.8), t('b', 'EST', 0.9), t('c', 'EST', 0.5, 'very-poor'), t('d', 'EST', 0.6), t('e', 'GLAC', 0.22)]
    const m = meanCompressibility(tests, 'EST', new Set(['d']))!
    expect(m).toEqual({ cc: 0.85, cr: 0.085, e0: 2, cv: 1.2, calpha: 0.034, n: 2, used: ['a', 'b'] })
  })

  it('omits cv when no test measured it, and is null for a stratum without tests', () => {
    expect(meanCompressibility([t('a', 'EST', 0.8, 'poor', null)], 'EST')).toEqual({ cc: 0.8, cr: 0.08, e0: 2, calpha: 0.034, n: 1, used: ['a'] })
    expect(meanCompressibility([t('a', 'EST', 0.8)], 'CRUST')).toBeNull()
  })
})

/** Invented tests down a soft clay: Cc rising with depth with scatter, e0 falling, cv missing on one. */
const clay: TestCompressibility[] = [
  { id: 't1', stratumCode: 'EST', depth: 4.25, qualityClass: 'very-good-to-excellent', cc: 0.71, cr: 0.081, e0: 2.31, cv: 1.6, calpha: 0.031 },
  { id: 't2', stratumCode: 'EST', depth: 6.1, qualityClass: 'good-to-fair', cc: 0.79, cr: 0.086, e0: 2.22, cv: 1.3, calpha: 0.033 },
  { id: 't3', stratumCode: 'EST', depth: 7.9, qualityClass: 'poor', cc: 0.8, cr: 0.09, e0: 2.18, cv: null, calpha: 0.035 },
  { id: 't4', stratumCode: 'EST', depth: 9.4, qualityClass: 'good-to-fair', cc: 0.9, cr: 0.094, e0: 2.07, cv: 1.1, calpha: 0.036 },
  { id: 't5', stratumCode: 'EST', depth: 12.7, qualityClass: 'very-good-to-excellent', cc: 0.97, cr: 0.092, e0: 1.98, cv: 0.9, calpha: 0.04 },
  // Left out: a very poor sample and one a reviewer excluded.
  { id: 'vp', stratumCode: 'EST', depth: 8.5, qualityClass: 'very-poor', cc: 0.45, cr: 0.05, e0: 2.1, cv: 2.5, calpha: 0.02 },
  { id: 'rx', stratumCode: 'EST', depth: 11, qualityClass: 'good-to-fair', cc: 0.4, cr: 0.2, e0: 1.5, cv: 4, calpha: 0.01 },
  { id: 'g1', stratumCode: 'GLAC', depth: 16, qualityClass: 'good-to-fair', cc: 0.22, cr: 0.03, e0: 0.65, cv: 6, calpha: 0.008 },
]
const excluded = new Set(['rx'])

describe('fitDepthTrend — least squares of a parameter on depth, against simple-statistics', () => {
  it('gradient, value at the mean depth and R² equal simple-statistics linearRegression and rSquared', () => {
    const use = eligibleTests(clay, 'EST', excluded)
    expect(use.map(x => x.id)).toEqual(['t1', 't2', 't3', 't4', 't5'])
    const data = use.map(x => [x.depth, x.cc!])
    const ref = linearRegression(data)
    const fit = fitDepthTrend(use.map(x => ({ id: x.id, depth: x.depth, value: x.cc! })))
    expect(fit.gradient).toBeCloseTo(ref.m, 12)
    expect(fit.referenceDepth).toBeCloseTo(mean(use.map(x => x.depth)), 12)
    // The least-squares line passes through the centroid: value(z̄) = ȳ = b + m·z̄.
    expect(fit.value).toBeCloseTo(ref.b + ref.m * fit.referenceDepth, 12)
    for (const z of [3.4, 9, 15]) expect(depthTrendAt(fit, z)).toBeCloseTo(ref.b + ref.m * z, 12)
    expect(fit.r2!).toBeCloseTo(rSquared(data, z => ref.b + ref.m * z), 12)
    expect(fit.n).toBe(5)
    expect(fit.testDepths).toEqual({ top: 4.25, bottom: 12.7 })
    expect(fit.testIds).toEqual(['t1', 't2', 't3', 't4', 't5'])
  })

  it('a falling e0 gives a negative gradient; a cv missing on one test fits the other four', () => {
    const c = depthTrendCandidates(clay, 'EST', excluded)
    if (!c.e0.ok || !c.cv.ok) throw new Error('expected trends for e0 and cv')
    const ref = linearRegression(clay.filter(x => ['t1', 't2', 't3', 't4', 't5'].includes(x.id)).map(x => [x.depth, x.e0!]))
    expect(c.e0.trend.gradient).toBeCloseTo(ref.m, 5)
    expect(c.e0.trend.gradient).toBeLessThan(0)
    expect(c.cv.trend.n).toBe(4)
    expect(c.cv.trend.testIds).toEqual(['t1', 't2', 't4', 't5'])
    const cvRef = linearRegression([[4.25, 1.6], [6.1, 1.3], [9.4, 1.1], [12.7, 0.9]])
    expect(c.cv.trend.gradient).toBeCloseTo(cvRef.m, 4)
  })

  it('refuses fewer than three tests or tests all at one depth, with the reason', () => {
    expect(() => fitDepthTrend([{ depth: 5, value: 0.8 }, { depth: 7, value: 0.9 }])).toThrow('at least 3 tests (2 here)')
    expect(() => fitDepthTrend([{ depth: 5, value: 0.8 }, { depth: 5, value: 0.9 }, { depth: 5, value: 0.7 }])).toThrow('more than one depth')
    const c = depthTrendCandidates(clay, 'GLAC')
    expect(c.cc).toEqual({ ok: false, reason: 'a depth trend needs at least 3 tests (1 here)' })
  })

  it('R² is null when every value is the same (no variance to explain), and the gradient 0', () => {
    const fit = fitDepthTrend([{ depth: 4, value: 0.09 }, { depth: 8, value: 0.09 }, { depth: 12, value: 0.09 }])
    expect(fit.gradient).toBe(0)
    expect(fit.r2).toBeNull()
  })
})

describe('compressibilityAt — a trend where chosen, the constant elsewhere', () => {
  it('evaluates the chosen parameters at the depth and keeps the others', () => {
    const c = depthTrendCandidates(clay, 'EST', excluded)
    if (!c.cc.ok) throw new Error('expected a Cc trend')
    const comp = { cc: 0.834, cr: 0.089, e0: 2.152, cv: 1.2, drainage: 'double' as const, source: 'mean' as const, trends: { cc: c.cc.trend } }
    const at5 = compressibilityAt(comp, 5)
    const at14 = compressibilityAt(comp, 14)
    expect(at5.cc).toBeCloseTo(c.cc.trend.value + c.cc.trend.gradient * (5 - c.cc.trend.referenceDepth), 12)
    expect(at14.cc - at5.cc).toBeCloseTo(9 * c.cc.trend.gradient, 12)
    expect(at5.cr).toBe(0.089)
    expect(at14.e0).toBe(2.152)
    expect(at5.cv).toBe(1.2)
    expect(at5).not.toHaveProperty('calpha')
  })

  it('a trend that reaches 0 inside the stratum is refused with where and what it gives', () => {
    // Cr falling 0.02 per metre from 0.09 at 6 m reaches 0 at 10.5 m, above the base at 15 m.
    const s = { name: 'Estuarine clay', compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, drainage: 'double' as const, source: 'mean' as const, trends: { cr: { referenceDepth: 6, value: 0.09, gradient: -0.02, n: 4, r2: 0.5, testDepths: { top: 4, bottom: 8 }, testIds: [] } } } }
    expect(depthTrendProblems(s, { top: 3.4, bottom: 15 })).toEqual([
      { key: 'cr', message: 'the Cr trend gives -0.09 at the base of Estuarine clay (15.00 m); it must stay above 0 through the stratum: keep the constant' },
    ])
    // The same trend in a thinner stratum stays positive.
    expect(depthTrendProblems(s, { top: 3.4, bottom: 10 })).toEqual([])
  })
})
