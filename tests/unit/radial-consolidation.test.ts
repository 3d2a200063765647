// Radial consolidation towards vertical drains: Hansbo (1981), Barron (1948), Carrillo (1942).
// Where a reference value is worked out by hand from the published closed form, the test says so.
import { describe, expect, it } from 'vitest'
import { degreeOfConsolidation, timeFactor } from '../../shared/geotech/consolidation'
import { GeotechError } from '../../shared/geotech/errors'
import {
  barronIdealMu, combinedDegree, degreeWithDrains, DRAIN_SPACING_SEARCH, drainSpacingFor, hansboMu,
  influenceDiameter, radialDegree, radialTimeFactor, wellResistanceTerm,
} from '../../shared/geotech/radial-consolidation'

/**
 * μ by quadrature of the equal-strain excess pore pressure around one drain (the derivation of
 * Barron 1948, with Hansbo's 1981 smear zone of permeability ks out to rs): the radial flow
 * towards the drain gives ∂u/∂r = (γw ε̇ /(2k(r)))·(re²/r − r); μ = ū·8kh/(γw ε̇ De²), ū the
 * area average. γw ε̇ cancels; here it is 1. Independent of the closed forms under test.
 */
function muByQuadrature(n: number, s: number, kr: number, steps = 200_000): number {
  const rw = 1
  const rs = s * rw
  const re = n * rw
  const kh = 1
  const k = (r: number) => (r < rs ? kh / kr : kh)
  // u(r) by integrating du/dr from the drain (u = 0 at rw, no well resistance), midpoint rule.
  let u = 0
  let weighted = 0
  const dr = (re - rw) / steps
  for (let i = 0; i < steps; i++) {
    const r = rw + (i + 0.5) * dr
    const dudr = (1 / (2 * k(r))) * (re * re / r - r)
    const uMid = u + dudr * dr / 2
    weighted += uMid * 2 * Math.PI * r * dr
    u += dudr * dr
  }
  const ubar = weighted / (Math.PI * (re * re - rw * rw))
  return (ubar * 8 * kh) / (4 * re * re)
}

describe('influence diameter (Barron 1948; Hansbo 1981)', () => {
  it('De = 1.05 s triangular, 1.128 s square', () => {
    expect(influenceDiameter('triangular', 1.5)).toBeCloseTo(1.575, 12)
    expect(influenceDiameter('square', 1.5)).toBeCloseTo(1.692, 12)
  })
  it('matches the circle of equal area to the drain\'s hexagon or square to 0.1 % (geometry)', () => {
    // Hexagon of a triangular grid: area (√3/2)s²; square: s².
    expect(influenceDiameter('triangular', 1) / Math.sqrt((2 * Math.sqrt(3)) / Math.PI)).toBeCloseTo(1, 3)
    expect(influenceDiameter('square', 1) / Math.sqrt(4 / Math.PI)).toBeCloseTo(1, 3)
  })
  it('refuses a spacing ≤ 0', () => {
    expect(() => influenceDiameter('square', 0)).toThrow(GeotechError)
  })
})

describe('Barron (1948) ideal drain', () => {
  it('F(20) = 400/399·ln 20 − 1199/1600 = 2.25387 (worked by hand from Barron 1948\'s closed form)', () => {
    expect(barronIdealMu(20)).toBeCloseTo(2.25387, 4)
  })
  it('F(5) = 25/24·ln 5 − 74/100 = 0.93650 (worked by hand from Barron 1948\'s closed form)', () => {
    expect(barronIdealMu(5)).toBeCloseTo(0.93650, 4)
  })
  it('agrees with quadrature of the equal-strain pore pressure (Barron 1948\'s derivation) to 1e-5', () => {
    for (const n of [5, 20, 50]) expect(barronIdealMu(n)).toBeCloseTo(muByQuadrature(n, 1, 1), 5)
  })
  it('tends to ln n − 0.75 (Hansbo 1981 without smear) for large n', () => {
    expect(barronIdealMu(100) - hansboMu({ n: 100, smearRatio: 1, permeabilityRatio: 1 })).toBeLessThan(1e-3)
    expect(barronIdealMu(100) - hansboMu({ n: 100, smearRatio: 1, permeabilityRatio: 1 })).toBeGreaterThan(0)
  })
})

describe('Hansbo (1981) μ with smear and well resistance', () => {
  it('n = 20, s = 2, kh/ks = 3: ln 10 + 3 ln 2 − 0.75 = 3.63203 (worked by hand from Hansbo 1981\'s formula)', () => {
    expect(hansboMu({ n: 20, smearRatio: 2, permeabilityRatio: 3 })).toBeCloseTo(3.63203, 4)
  })
  it('no smear (s = 1 or kh/ks = 1 at s = 1) is ln n − 0.75', () => {
    expect(hansboMu({ n: 30, smearRatio: 1, permeabilityRatio: 5 })).toBeCloseTo(Math.log(30) - 0.75, 12)
  })
  it('the simplified form agrees with quadrature of the pore pressure with a smear zone within 0.5 % for n ≥ 20', () => {
    for (const [n, s, kr] of [[20, 2, 3], [30, 3, 3], [40, 2, 5]] as const) {
      const exact = muByQuadrature(n, s, kr)
      expect(Math.abs(hansboMu({ n, smearRatio: s, permeabilityRatio: kr }) - exact) / exact).toBeLessThan(0.005)
    }
  })
  it('adds the well resistance term: (2/3)π l² kh/qw, l = 10 m, kh = 0.1 m/yr, qw = 100 m³/yr → 0.20944 (worked by hand from Hansbo 1981)', () => {
    const fr = wellResistanceTerm({ kh: 0.1, dischargeCapacity: 100, drainLength: 10 })
    expect(fr).toBeCloseTo(0.20944, 5)
    expect(hansboMu({ n: 20, smearRatio: 2, permeabilityRatio: 3, wellResistance: fr })).toBeCloseTo(3.63203 + 0.20944, 4)
  })
  it('refuses drains closer than their smear zones, n ≤ 1, s < 1 and kh/ks < 1', () => {
    expect(() => hansboMu({ n: 2, smearRatio: 3, permeabilityRatio: 2 })).toThrow(/smear zone/)
    expect(() => hansboMu({ n: 1, smearRatio: 1, permeabilityRatio: 1 })).toThrow(GeotechError)
    expect(() => hansboMu({ n: 20, smearRatio: 0.5, permeabilityRatio: 1 })).toThrow(GeotechError)
    expect(() => hansboMu({ n: 20, smearRatio: 2, permeabilityRatio: 0.5 })).toThrow(GeotechError)
  })
})

describe('radial degree (Hansbo 1981) and Carrillo (1942)', () => {
  it('Ur = 1 − exp(−8 Th/μ): 90 % at Th = μ·ln 10 / 8', () => {
    const mu = 2.5
    expect(radialDegree((mu * Math.log(10)) / 8, mu)).toBeCloseTo(0.9, 12)
    expect(radialDegree(0, mu)).toBe(0)
  })
  it('Th = ch t / De²', () => {
    expect(radialTimeFactor(2, 0.5, 1.575)).toBeCloseTo(1 / (1.575 * 1.575), 12)
  })
  it('U = 1 − (1 − Uv)(1 − Ur): Uv = 0.3, Ur = 0.6 → 0.72 (Carrillo 1942)', () => {
    expect(combinedDegree(0.3, 0.6)).toBeCloseTo(0.72, 12)
    expect(combinedDegree(0, 0.6)).toBeCloseTo(0.6, 12)
    expect(combinedDegree(1, 0)).toBe(1)
    expect(() => combinedDegree(1.2, 0)).toThrow(GeotechError)
  })
})

describe('drain spacing for a target degree', () => {
  const base = {
    pattern: 'triangular' as const, targetDegree: 0.9, years: 0.5, ch: 1.2, cv: 1.2, drainagePath: 5.8,
    diameter: 0.052, smearRatio: 3, permeabilityRatio: 3,
  }

  it('finds the widest spacing (to 0.05 m, rounded down) that reaches U = 90 % at 6 months', () => {
    const s = drainSpacingFor(base)!
    expect(s).not.toBeNull()
    expect(Math.abs(s / 0.05 - Math.round(s / 0.05))).toBeLessThan(1e-9)
    expect(degreeWithDrains({ ...base, spacing: s })).toBeGreaterThanOrEqual(0.9)
    expect(degreeWithDrains({ ...base, spacing: s + 0.05 })).toBeLessThan(0.9)
  })

  it('agrees with solving Ur directly (Hansbo 1981; Uv by Terzaghi 1925, combined by Carrillo 1942)', () => {
    const s = drainSpacingFor(base)!
    const uv = degreeOfConsolidation(timeFactor(base.cv, base.years, base.drainagePath))
    const urNeeded = 1 - (1 - 0.9) / (1 - uv)
    // At s, Ur ≥ urNeeded; at s + 0.05, below.
    const ur = (sp: number) => {
      const de = influenceDiameter('triangular', sp)
      return radialDegree(radialTimeFactor(base.ch, base.years, de), hansboMu({ n: de / base.diameter, smearRatio: 3, permeabilityRatio: 3 }))
    }
    expect(ur(s)).toBeGreaterThanOrEqual(urNeeded)
    expect(ur(s + 0.05)).toBeLessThan(urNeeded)
  })

  it('a square pattern needs a closer spacing than a triangular one (De = 1.128 s vs 1.05 s)', () => {
    expect(drainSpacingFor({ ...base, pattern: 'square' })!).toBeLessThan(drainSpacingFor(base)!)
  })

  it('well resistance makes the spacing closer', () => {
    const withWell = drainSpacingFor({ ...base, dischargeCapacity: 50, drainLength: 15, kh: 0.05 })!
    expect(withWell).toBeLessThan(drainSpacingFor(base)!)
  })

  it('null when no spacing in the range reaches the target; the widest spacing when even it does', () => {
    expect(drainSpacingFor({ ...base, targetDegree: 0.999, years: 0.01 })).toBeNull()
    expect(drainSpacingFor({ ...base, years: 200 })).toBe(DRAIN_SPACING_SEARCH.max)
  })
})
