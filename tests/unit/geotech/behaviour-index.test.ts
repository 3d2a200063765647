// The CPT soil behaviour type index Ic, Robertson (2009) "Interpretation of cone penetration tests —
// a unified approach", Can. Geotech. J. 46: Qtn = ((qt − σv0)/pa)(pa/σ'v0)^n, Fr = fs/(qt − σv0)·100,
// Ic = √((3.47 − log Qtn)² + (log Fr + 1.22)²), n = 0.381·Ic + 0.05(σ'v0/pa) − 0.15 ≤ 1.0.
// The formula text was checked against two open reference implementations: the R package soilmech
// (robertsons_chart.R, FrQtn2Ic: √((3.47 − log10 Qtn)² + (1.22 + log10 Fr)²)) and the NGL tools
// library (get_Ic_Qtn_Fr, iterated, pa = 101.325 kPa). The values below are worked by hand here.
import { describe, expect, it } from 'vitest'
import { expectGeotechError } from '../../helpers/geotech'
import { ATMOSPHERIC_PRESSURE, behaviourBand, behaviourIndexProfile, IC_BOUNDARIES, soilBehaviourIndex } from '../../../shared/geotech/behaviour-index'

const PA = 101.325
const log10 = Math.log10

describe('Ic at one reading — worked by hand from Robertson (2009)', () => {
  it('soft clay: n reaches its cap of 1, so Qtn = (qt − σv0)/σ\'v0 and Ic is closed-form', () => {
    // qt = 600 kPa, fs = 15 kPa, σv0 = 100 kPa, σ'v0 = 60 kPa.
    // qnet = 500; Fr = 15/500·100 = 3 %; with n = 1, Qtn = 500/60 = 8.3333.
    // Ic = √((3.47 − log 8.3333)² + (log 3 + 1.22)²) = √(2.54918² + 1.69712²) = √9.37854 = 3.0624.
    // n = 0.381·3.0624 + 0.05·(60/101.325) − 0.15 = 1.046 > 1 → 1 (the cap).
    const qtn = 500 / 60
    const ic = Math.sqrt((3.47 - log10(qtn)) ** 2 + (log10(3) + 1.22) ** 2)
    expect(ic).toBeCloseTo(3.0624, 4)
    expect(0.381 * ic + 0.05 * (60 / PA) - 0.15).toBeGreaterThan(1)
    const r = soilBehaviourIndex({ qt: 600, fs: 15, totalStress: 100, effectiveStress: 60 })
    expect(r.n).toBe(1)
    expect(r.fr).toBeCloseTo(3, 12)
    expect(r.qtn).toBeCloseTo(qtn, 10)
    expect(r.ic).toBeCloseTo(ic, 10)
    expect(r.converged).toBe(true)
    expect(behaviourBand(r.ic)).toBe(4) // 2.95–3.60: clay-like
  })

  it('dense sand: n below 1, solved here by bisection on the same equations, agrees with the iteration', () => {
    // qt = 10 000 kPa, fs = 50 kPa, σv0 = 100 kPa, σ'v0 = 60 kPa: qnet = 9900, Fr = 0.50505 %.
    // A first pass by hand with n = 0.5: Qtn = (9900/101.325)·(101.325/60)^0.5 = 97.708·1.29953 = 126.97,
    // Ic = √((3.47 − 2.1037)² + (−0.29667 + 1.22)²) = √(1.8668 + 0.8525) = 1.649, n = 0.5079: the answer
    // lies near n ≈ 0.51, Ic ≈ 1.65.
    const qnet = 9900
    const fr = (50 / qnet) * 100
    const icAt = (n: number) => Math.sqrt((3.47 - log10((qnet / PA) * (PA / 60) ** n)) ** 2 + (log10(fr) + 1.22) ** 2)
    const gap = (n: number) => n - Math.min(1, 0.381 * icAt(n) + 0.05 * (60 / PA) - 0.15)
    let lo = 0.3
    let hi = 1
    expect(gap(lo)).toBeLessThan(0)
    expect(gap(hi)).toBeGreaterThan(0)
    for (let i = 0; i < 200; i++) {
      const mid = (lo + hi) / 2
      if (gap(mid) < 0) lo = mid
      else hi = mid
    }
    const n = (lo + hi) / 2
    const r = soilBehaviourIndex({ qt: 10_000, fs: 50, totalStress: 100, effectiveStress: 60 })
    expect(r.converged).toBe(true)
    expect(r.iterations).toBeGreaterThan(1)
    expect(r.n).toBeCloseTo(n, 6)
    expect(r.ic).toBeCloseTo(icAt(n), 6)
    expect(r.ic).toBeCloseTo(1.65, 1)
    expect(r.n).toBeGreaterThan(0.5)
    expect(r.n).toBeLessThan(0.52)
    expect(behaviourBand(r.ic)).toBe(1) // 1.31–2.05: sand-like
  })

  it('a silty mixture in between: the answer satisfies every equation at once', () => {
    const input = { qt: 2500, fs: 30, totalStress: 150, effectiveStress: 90 }
    const r = soilBehaviourIndex(input)
    const qnet = input.qt - input.totalStress
    expect(r.fr).toBeCloseTo((30 / qnet) * 100, 12)
    expect(r.qtn).toBeCloseTo((qnet / PA) * (PA / 90) ** r.n, 9)
    expect(r.ic).toBeCloseTo(Math.sqrt((3.47 - log10(r.qtn)) ** 2 + (log10(r.fr) + 1.22) ** 2), 9)
    expect(r.n).toBeCloseTo(Math.min(1, 0.381 * r.ic + 0.05 * (90 / PA) - 0.15), 6)
    expect(r.ic).toBeGreaterThan(2.05)
    expect(r.ic).toBeLessThan(2.95)
  })

  it('uses the standard atmosphere for pa unless told otherwise', () => {
    expect(ATMOSPHERIC_PRESSURE).toBe(101.325)
    const a = soilBehaviourIndex({ qt: 10_000, fs: 50, totalStress: 100, effectiveStress: 60 })
    const b = soilBehaviourIndex({ qt: 10_000, fs: 50, totalStress: 100, effectiveStress: 60 }, { pa: 100 })
    expect(a.ic).not.toBe(b.ic)
    expect(Math.abs(a.ic - b.ic)).toBeLessThan(0.01)
  })

  it('refuses readings where Ic is undefined', () => {
    expectGeotechError(() => soilBehaviourIndex({ qt: 90, fs: 5, totalStress: 100, effectiveStress: 60 }), 'net-resistance-not-positive')
    expectGeotechError(() => soilBehaviourIndex({ qt: 900, fs: 5, totalStress: 100, effectiveStress: 0 }), 'effective-stress-not-positive')
    expectGeotechError(() => soilBehaviourIndex({ qt: 900, fs: 0, totalStress: 100, effectiveStress: 60 }), 'sleeve-friction-not-positive')
    expectGeotechError(() => soilBehaviourIndex({ qt: Number.NaN, fs: 5, totalStress: 100, effectiveStress: 60 }), 'behaviour-input-not-finite')
    expectGeotechError(() => soilBehaviourIndex({ qt: 900, fs: 5, totalStress: 100, effectiveStress: 60 }, { pa: 0 }), 'atmospheric-pressure-not-positive')
  })

  it('says so when the rounds run out before n settles', () => {
    const r = soilBehaviourIndex({ qt: 10_000, fs: 50, totalStress: 100, effectiveStress: 60 }, { maxIterations: 1 })
    expect(r.converged).toBe(false)
    expect(r.iterations).toBe(1)
  })
})

describe('Ic along a sounding and its bands', () => {
  it('gives NaN rows where Ic is undefined and the single-reading value elsewhere', () => {
    const ic = behaviourIndexProfile({ qt: [600, 90, 10_000, 900, Number.NaN], fs: [15, 5, 50, 0, 5], totalStress: [100, 100, 100, 100, 100], effectiveStress: [60, 60, 60, 60, 60] })
    expect(ic[0]).toBeCloseTo(soilBehaviourIndex({ qt: 600, fs: 15, totalStress: 100, effectiveStress: 60 }).ic, 12)
    expect(ic[2]).toBeCloseTo(soilBehaviourIndex({ qt: 10_000, fs: 50, totalStress: 100, effectiveStress: 60 }).ic, 12)
    expect([ic[1], ic[3], ic[4]].every(v => Number.isNaN(v))).toBe(true)
    expectGeotechError(() => behaviourIndexProfile({ qt: [1], fs: [], totalStress: [1], effectiveStress: [1] }), 'array-length-mismatch')
  })

  // The Ic boundaries of the soil behaviour type chart (Robertson 1990, restated in Robertson 2009) are recalled
  // (memory); open implementations checked against band on the same five values.
  it('bands by the published boundaries 1.31, 2.05, 2.60, 2.95, 3.60 (a boundary belongs to the band above)', () => {
    expect(IC_BOUNDARIES).toEqual([1.31, 2.05, 2.6, 2.95, 3.6])
    expect([1.0, 1.31, 2.0, 2.05, 2.59, 2.6, 2.95, 3.59, 3.6, 4.2].map(behaviourBand)).toEqual([0, 1, 1, 2, 2, 3, 4, 4, 5, 5])
    expect(behaviourBand(Number.NaN)).toBe(-1)
  })
})
