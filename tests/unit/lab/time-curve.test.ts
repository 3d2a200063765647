// Taylor's √t method and Cα on synthetic stage readings generated from Terzaghi's (1925) solution
// through the engine's degreeOfConsolidation, with a known cv (and a known Cα after primary).
import { describe, expect, it } from 'vitest'
import { degreeOfConsolidation } from '../../../shared/geotech/consolidation'
import { GeotechError } from '../../../shared/geotech/errors'
import { analyseTimeCurve, secondaryCompressionIndex, taylorSqrtTime, TV90 } from '../../../shared/lab/time-curve'
import type { TimeReading } from '../../../shared/lab/stages'

const MINUTES_PER_YEAR = 365.25 * 24 * 60

/** Gauge readings of one stage: d = d0 + Δp·U(cv·t/Hdr²) (+ Cα-slope·log10(t/tp) after tp). */
function stage(opts: { cv: number, hdrMm: number, primary: number, times: number[], secondarySlope?: number, tp?: number }): TimeReading[] {
  const hdr = opts.hdrMm / 1000
  return opts.times.map((t) => {
    const tv = (opts.cv * (t / MINUTES_PER_YEAR)) / (hdr * hdr)
    let d = 5 + opts.primary * degreeOfConsolidation(tv)
    if (opts.secondarySlope && opts.tp !== undefined && t > opts.tp) d += opts.secondarySlope * Math.log10(t / opts.tp)
    return { minutes: t, dial: d }
  })
}

/** A common laboratory schedule: 0.1 min to 24 h, roughly doubling (common practice). */
const STANDARD = [0, 0.1, 0.25, 0.5, 1, 2, 4, 8, 15, 30, 60, 120, 240, 480, 1440]
/** A dense logger schedule: every 15 % in time from 0.05 min to 24 h. */
const DENSE: number[] = [0]
for (let t = 0.05; t < 1440; t *= 1.15) DENSE.push(Math.round(t * 1000) / 1000)

/**
 * Taylor's construction applied exactly to Terzaghi's curve meets the 1.15 line at Tv = 0.8354 (found by
 * solving U(Tv) = (2/√π)·√Tv/1.15 with degreeOfConsolidation), not at 0.848: the method itself reads cv
 * 0.848/0.8354 = 1.5 % high. A dense schedule should show exactly that bias.
 */
const TAYLOR_BIAS = TV90 / 0.8354

describe('Taylor\'s √t method (Taylor 1948)', () => {
  for (const cv of [0.3, 1.2, 6, 20]) {
    it(`recovers cv = ${cv} m²/yr on a dense schedule to the method's own bias (±0.3 %)`, () => {
      const r = taylorSqrtTime(stage({ cv, hdrMm: 10, primary: 0.8, times: DENSE }), 10)
      expect(r.cv / cv / TAYLOR_BIAS).toBeGreaterThan(0.997)
      expect(r.cv / cv / TAYLOR_BIAS).toBeLessThan(1.003)
      expect(r.correctedZero).toBeCloseTo(5, 2)
    })
    it(`recovers cv = ${cv} m²/yr within 5 % on a standard 0.1 min – 24 h schedule`, () => {
      const r = taylorSqrtTime(stage({ cv, hdrMm: 10, primary: 0.8, times: STANDARD }), 10)
      expect(Math.abs(r.cv / cv - 1)).toBeLessThan(0.05)
    })
  }

  it('gives t90 in minutes consistent with cv: cv = 1.2 m²/yr, Hdr = 10 mm → t90 ≈ 37.2 min', () => {
    // t90 = 0.848 × (0.01 m)² / 1.2 m²/yr = 7.067e-5 yr = 37.17 min; the method reads 1.5 % early.
    const r = taylorSqrtTime(stage({ cv: 1.2, hdrMm: 10, primary: 0.8, times: DENSE }), 10)
    expect(r.t90 * TAYLOR_BIAS).toBeCloseTo(37.17, 0)
    expect(r.drainagePath).toBe(10)
  })

  it('refuses stages it cannot read', () => {
    expect(() => taylorSqrtTime([{ minutes: 0, dial: 1 }, { minutes: 1, dial: 1.1 }], 10)).toThrow(GeotechError)
    const swelling = stage({ cv: 1.2, hdrMm: 10, primary: -0.3, times: STANDARD })
    expect(() => taylorSqrtTime(swelling, 10)).toThrow(/no compression/)
    // Readings that stop at 4 minutes never reach the 1.15 line.
    const early = stage({ cv: 0.3, hdrMm: 10, primary: 0.8, times: STANDARD.slice(0, 8) })
    expect(() => taylorSqrtTime(early, 10)).toThrow(/90 % consolidation/)
  })
})

describe('Cα from the readings after primary', () => {
  // Estuarine clay of the demo scenario: e0 = 2.10, H0 = 20 mm; Cα = 0.034 (0.04·Cc with Cc = 0.85,
  // Mesri & Godlewski 1977, memory), i.e. a gauge slope of Cα·H0/(1 + e0) = 0.2194 mm per log cycle.
  const basis = { e0: 2.1, specimenHeight: 20 }
  const calpha = 0.034
  const slope = (calpha * basis.specimenHeight) / (1 + basis.e0)
  for (const cv of [1.2, 6]) {
    // Secondary compression starts at Tv = 2 (U > 99.3 %).
    const tp = (2 * 0.01 ** 2 / cv) * MINUTES_PER_YEAR
    it(`cv = ${cv} m²/yr: Cα within 2 % and cv within 5 % on the standard schedule`, () => {
      const out = analyseTimeCurve(stage({ cv, hdrMm: 10, primary: 0.8, times: STANDARD, secondarySlope: slope, tp }), 10, basis)
      expect(out.ok).toBe(true)
      if (!out.ok) return
      expect(Math.abs(out.taylor.cv / cv - 1)).toBeLessThan(0.05)
      expect(out.secondary).not.toBeNull()
      expect(Math.abs(out.secondary!.calpha / calpha - 1)).toBeLessThan(0.02)
      expect(out.secondary!.count).toBeGreaterThanOrEqual(3)
    })
  }

  it('needs three readings after t100', () => {
    const readings = [{ minutes: 100, dial: 1 }, { minutes: 1000, dial: 1.2 }]
    expect(secondaryCompressionIndex(readings, 50, basis)).toBeNull()
    const three = [{ minutes: 10, dial: 1 }, { minutes: 100, dial: 1.1 }, { minutes: 1000, dial: 1.2 }]
    // 0.1 mm per cycle × 3.1 / 20 mm = 0.0155.
    expect(secondaryCompressionIndex(three, 10, basis)!.calpha).toBeCloseTo(0.0155, 10)
  })

  it('reports an unusable stage with its reason instead of throwing', () => {
    const out = analyseTimeCurve([{ minutes: 0, dial: 1 }], 10, basis)
    expect(out.ok).toBe(false)
    if (!out.ok) expect(out.reason).toContain('at least 5 readings')
  })
})
