import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import {
  degreeOfConsolidation,
  drainagePath,
  secondaryCompression,
  timeFactor,
  timeFactorForDegree,
  timeForDegree,
} from '../../../shared/geotech/consolidation'
import { expectGeotechError } from '../../helpers/geotech'


describe('degreeOfConsolidation (Terzaghi 1925 series)', () => {
  it('gives U = 50 % at Tv ≈ 0.197 and U = 90 % at Tv ≈ 0.848', () => {
    // Das, Principles of Geotechnical Engineering, table of Tv against U: 0.197 and 0.848 (memory).
    expect(timeFactorForDegree(0.5)).toBeCloseTo(0.197, 3)
    expect(timeFactorForDegree(0.9)).toBeCloseTo(0.848, 3)
    expect(Math.abs(degreeOfConsolidation(0.197) - 0.5)).toBeLessThan(0.001)
    expect(Math.abs(degreeOfConsolidation(0.848) - 0.9)).toBeLessThan(0.001)
  })

  // Das, Principles of Geotechnical Engineering, table of Tv against U, three decimals (memory).
  const table: [number, number][] = [
    [0.1, 0.008],
    [0.2, 0.031],
    [0.3, 0.071],
    [0.4, 0.126],
    [0.6, 0.287],
    [0.7, 0.403],
    [0.8, 0.567],
    [0.95, 1.129],
    [0.99, 1.781],
  ]
  for (const [u, tv] of table) {
    it(`Tv for U = ${u * 100} % matches the table value ${tv} within 0.001`, () => {
      expect(Math.abs(timeFactorForDegree(u) - tv)).toBeLessThanOrEqual(0.001)
    })
  }

  it('gives U ≈ 25.2 % at Tv = 0.05', () => {
    // Das, table of U against Tv: Tv = 0.05 → U = 25.23 % (memory); also √(4·0.05/π) = 0.2523 (Terzaghi 1925 short-time solution).
    expect(degreeOfConsolidation(0.05)).toBeCloseTo(0.2523, 4)
  })

  it('is 0 at Tv = 0 and follows the first series term at large Tv', () => {
    expect(degreeOfConsolidation(0)).toBe(0)
    // Terzaghi 1925: for Tv > ~0.3 only m = 0 matters, U ≈ 1 − (8/π²)·exp(−π²Tv/4) (common practice).
    for (const tv of [0.5, 1, 2]) {
      const oneTerm = 1 - (8 / Math.PI ** 2) * Math.exp((-(Math.PI ** 2) * tv) / 4)
      expect(degreeOfConsolidation(tv)).toBeCloseTo(oneTerm, 4)
    }
  })

  it('joins the √(4Tv/π) short-time solution smoothly at Tv = 1e-4', () => {
    // Short-time solution U = 2√(Tv/π) (Terzaghi 1925); a brute-force 200 000-term series in the test.
    let sum = 0
    for (let m = 0; m < 200_000; m++) {
      const M = (Math.PI * (2 * m + 1)) / 2
      sum += (2 / (M * M)) * Math.exp(-M * M * 2e-4)
    }
    expect(degreeOfConsolidation(2e-4)).toBeCloseTo(1 - sum, 10)
    expect(degreeOfConsolidation(1e-6)).toBeCloseTo(2 * Math.sqrt(1e-6 / Math.PI), 14)
    const below = degreeOfConsolidation(0.99999e-4)
    const above = degreeOfConsolidation(1.00001e-4)
    expect(above).toBeGreaterThan(below)
    expect(above - below).toBeLessThan(1e-6)
  })

  it('is strictly increasing and inverted by timeFactorForDegree (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-7, max: 3, noNaN: true }), fc.double({ min: 1.01, max: 2, noNaN: true }), (tv, k) => {
        expect(degreeOfConsolidation(tv * k)).toBeGreaterThan(degreeOfConsolidation(tv))
        const u = degreeOfConsolidation(tv)
        expect(Math.abs(timeFactorForDegree(u) - tv) / tv).toBeLessThan(1e-8)
      }),
    )
  })

  it('rejects negative Tv and U outside [0, 1)', () => {
    expectGeotechError(() => degreeOfConsolidation(-0.1), 'time-factor-negative')
    expectGeotechError(() => timeFactorForDegree(1), 'degree-out-of-range')
    expectGeotechError(() => timeFactorForDegree(-0.01), 'degree-out-of-range')
    expect(timeFactorForDegree(0)).toBe(0)
  })
})

describe('time factor and drainage path', () => {
  it('Tv = cv·t/Hdr², Hdr = H/2 for double and H for single drainage', () => {
    // Terzaghi 1925: hand calc 1.2 m²/yr × 2 yr / (5.8 m)² = 0.071344…
    expect(timeFactor(1.2, 2, 5.8)).toBeCloseTo(2.4 / 33.64, 12)
    expect(drainagePath(11.6)).toBe(5.8)
    expect(drainagePath(11.6, 'double')).toBe(5.8)
    expect(drainagePath(11.6, 'top')).toBe(11.6)
    expect(drainagePath(11.6, 'bottom')).toBe(11.6)
  })

  it('time to 90 % of a 4 m double-drained layer with cv = 1.2 m²/yr', () => {
    // t90 = 0.848·Hdr²/cv = 0.848 × 4 / 1.2 = 2.827 yr (Das table value 0.848, memory).
    expect(timeForDegree(0.9, 1.2, 2)).toBeCloseTo(2.827, 2)
  })

  it('rejects non-positive cv, drainage path and negative time', () => {
    expectGeotechError(() => timeFactor(0, 1, 1), 'cv-not-positive')
    expectGeotechError(() => timeFactor(1, -1, 1), 'time-negative')
    expectGeotechError(() => timeFactor(1, 1, 0), 'drainage-path-not-positive')
    expectGeotechError(() => drainagePath(0), 'layer-thickness-not-positive')
  })
})

describe('secondaryCompression (Mesri 1973)', () => {
  it('Δh = Cα/(1 + ep)·h·log10(t/tp): hand calc', () => {
    // Cα = 0.03, ep = 1.8, h = 5 m, tp = 2 yr, t = 50 yr: 0.03/2.8 × 5 × log10(25) = 0.074893 m (common practice).
    expect(secondaryCompression({ calpha: 0.03, ep: 1.8, thickness: 5, tp: 2, t: 50 })).toBeCloseTo(0.074893, 5)
  })

  it('is zero before the end of primary consolidation', () => {
    expect(secondaryCompression({ calpha: 0.03, ep: 1.8, thickness: 5, tp: 2, t: 1 })).toBe(0)
  })

  it('rejects negative Cα, non-positive ep and tp', () => {
    expectGeotechError(() => secondaryCompression({ calpha: -0.01, ep: 1, thickness: 1, tp: 1, t: 2 }), 'calpha-negative')
    expectGeotechError(() => secondaryCompression({ calpha: 0.01, ep: 0, thickness: 1, tp: 1, t: 2 }), 'void-ratio-not-positive')
    expectGeotechError(() => secondaryCompression({ calpha: 0.01, ep: 1, thickness: 1, tp: 0, t: 2 }), 'time-not-positive')
  })
})
