import { describe, expect, it } from 'vitest'
import {
  CRUST_PRECONSOLIDATION_BASE,
  CRUST_PRECONSOLIDATION_TOP,
  DEMO_BOREHOLES,
  DEMO_CPTS,
  DEMO_PIEZOMETERS,
  DEMO_STRATA,
  DEMO_VANES,
  ESTUARINE_POP,
  GAMMA_W,
  GLACIAL_OCR,
  NOMINAL_BASES,
  SITE_PLAN,
  groundAt,
  groundwaterFor,
  nominalGround,
  stratumIndexAt,
  truePreconsolidation,
} from '../../../shared/demo/site'
import { computeStressProfile } from '../../../shared/geotech/stress'

describe('demo ground model — strata table', () => {
  it('matches the scenario table: depths, unit weights and compressibility', () => {
    expect(DEMO_STRATA.map(s => s.code)).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])
    expect(NOMINAL_BASES).toEqual([1.2, 3.4, 15.0, 21.5, 30])
    expect(DEMO_STRATA.map(s => [s.unitWeight, s.unitWeightSaturated])).toEqual([[19, 20], [18, 18.5], [16, 16], [20.5, 20.5], [20, 20]])
    expect(DEMO_STRATA.map(s => s.compressibility)).toEqual([
      null,
      { cc: 0.35, cr: 0.04, e0: 1.10, cv: 3 },
      { cc: 0.85, cr: 0.09, e0: 2.10, cv: 1.2 },
      { cc: 0.22, cr: 0.03, e0: 0.65, cv: 6 },
      null,
    ])
  })

  it('liquid limits make 0.009(LL − 10) match each clay\'s Cc within 3 %', () => {
    for (const s of DEMO_STRATA.filter(q => q.compressibility)) {
      expect(Math.abs(0.009 * (s.index!.liquidLimit - 10) / s.compressibility!.cc - 1), s.code).toBeLessThan(0.03)
    }
  })
})

describe('demo ground model — groundwater truth', () => {
  const ground = nominalGround()

  it('is hydrostatic from the 1.6 m standing level to 12 m', () => {
    expect(ground.stressAt(1.6).porePressure).toBeCloseTo(0, 9)
    expect(ground.stressAt(1.0).porePressure).toBe(0)
    expect(ground.stressAt(6).porePressure).toBeCloseTo(GAMMA_W * 4.4, 9)
    expect(ground.stressAt(12).porePressure).toBeCloseTo(GAMMA_W * 10.4, 9)
  })

  it('is under-drained toward the sand: u = γw(z − 4.5) at the sand top, linear from 12 m, hydrostatic gradient below', () => {
    const uTop = GAMMA_W * (21.5 - 4.5)
    expect(ground.stressAt(21.5).porePressure).toBeCloseTo(uTop, 9)
    const mid = 0.5 * (12 + 21.5)
    expect(ground.stressAt(mid).porePressure).toBeCloseTo(0.5 * (GAMMA_W * 10.4 + uTop), 9)
    expect(ground.stressAt(21.5).porePressure).toBeLessThan(GAMMA_W * (21.5 - 1.6)) // below hydrostatic
    expect(ground.stressAt(26).porePressure - ground.stressAt(22).porePressure).toBeCloseTo(4 * GAMMA_W, 9)
  })

  it('gives the engine piezometric control points it accepts at any sand depth in range', () => {
    for (const sandTop of [21, 21.5, 22]) {
      const profile = computeStressProfile({ layers: [{ name: 'all', thickness: 30, unitWeight: 18, unitWeightSaturated: 18 }], groundwater: groundwaterFor(sandTop) })
      expect(profile.points.some(p => Math.abs(p.depth - sandTop) < 1e-9)).toBe(true)
    }
  })

  it('hand check of σ\'v0 at 8 m in the nominal profile: 136.9 − 62.8 = 74.1 kPa', () => {
    // σv = 1.2·19 + 0.4·18 + 1.8·18.5 + 4.6·16 = 136.9; u = 9.81·6.4 = 62.78.
    const s = ground.stressAt(8)
    expect(s.totalStress).toBeCloseTo(136.9, 9)
    expect(s.porePressure).toBeCloseTo(62.784, 9)
    expect(s.effectiveStress).toBeCloseTo(74.116, 9)
  })
})

describe('demo ground model — true preconsolidation stress', () => {
  const ground = nominalGround()

  it('crust: linear from 210 kPa at its top to 95 kPa at its base', () => {
    expect(ground.preconsolidationAt(1.2)).toBeCloseTo(CRUST_PRECONSOLIDATION_TOP, 9)
    expect(ground.preconsolidationAt(2.3)).toBeCloseTo(0.5 * (CRUST_PRECONSOLIDATION_TOP + CRUST_PRECONSOLIDATION_BASE), 9)
    expect(ground.preconsolidationAt(3.4 - 1e-9)).toBeCloseTo(CRUST_PRECONSOLIDATION_BASE, 5)
  })

  it('estuarine clay: σ\'v0 + 25 kPa; glacial clay: 2.4·σ\'v0 with an abrupt jump at its top', () => {
    for (const z of [3.4, 6, 10, 14.9]) expect(ground.preconsolidationAt(z)! - ground.stressAt(z).effectiveStress).toBeCloseTo(ESTUARINE_POP, 9)
    for (const z of [15, 18, 21.4]) expect(ground.preconsolidationAt(z)! / ground.stressAt(z).effectiveStress).toBeCloseTo(GLACIAL_OCR, 9)
    expect(ground.preconsolidationAt(15)! - ground.preconsolidationAt(15 - 1e-6)!).toBeGreaterThan(100)
  })

  it('is null in the incompressible fill and sand; a boundary depth belongs to the stratum below', () => {
    expect(ground.preconsolidationAt(0.5)).toBeNull()
    expect(ground.preconsolidationAt(25)).toBeNull()
    expect(stratumIndexAt(3.4, NOMINAL_BASES)).toBe(2)
    expect(truePreconsolidation(1.2, ground.stressAt(1.2))).toBeCloseTo(CRUST_PRECONSOLIDATION_TOP, 9)
  })

  it('uses the local boundaries when given: the crust line spans the local crust', () => {
    const bases = [1.0, 3.0, 15, 21.5, 30]
    const stress = { totalStress: 0, porePressure: 0, effectiveStress: 30, layerIndex: 1 }
    expect(truePreconsolidation(1.0, stress, bases)).toBeCloseTo(CRUST_PRECONSOLIDATION_TOP, 9)
    expect(truePreconsolidation(2.0, stress, bases)).toBeCloseTo(0.5 * (CRUST_PRECONSOLIDATION_TOP + CRUST_PRECONSOLIDATION_BASE), 9)
  })
})

describe('demo ground model — spatial variation', () => {
  const planned = [...DEMO_BOREHOLES, ...DEMO_CPTS, ...DEMO_VANES, ...DEMO_PIEZOMETERS]

  it('ground level stays within +2.5 ± 0.4 m and stratum bases within ±0.5 m (fill ±0.3 m) of nominal', () => {
    const { minEasting, maxEasting, minNorthing, maxNorthing } = SITE_PLAN.yard
    for (let e = minEasting - 30; e <= maxEasting + 30; e += 7.5) {
      for (let n = minNorthing - 30; n <= maxNorthing + 30; n += 7.5) {
        const g = groundAt(e, n)
        expect(Math.abs(g.groundElevation - 2.5)).toBeLessThanOrEqual(0.4 + 0.005)
        DEMO_STRATA.forEach((s, i) => expect(Math.abs(g.bases[i]! - s.nominalBottom)).toBeLessThanOrEqual(s.baseVariation + 0.025))
      }
    }
  })

  it('varies smoothly: neighbouring holes differ, a metre apart hardly at all', () => {
    const a = groundAt(100, 80)
    const b = groundAt(101, 80)
    expect(Math.abs(a.groundElevation - b.groundElevation)).toBeLessThanOrEqual(0.03)
    const bases = DEMO_BOREHOLES.map(p => groundAt(p.easting, p.northing).bases[2]!)
    expect(new Set(bases).size).toBeGreaterThan(2)
  })

  it('is the same on every call (seeded fields)', () => {
    for (const p of planned) {
      const a = groundAt(p.easting, p.northing)
      const b = groundAt(p.easting, p.northing)
      expect(a.bases).toEqual(b.bases)
      expect(a.groundElevation).toBe(b.groundElevation)
    }
  })

  it('logged depths fall on the 0.05 m grid', () => {
    for (const p of planned) {
      for (const b of groundAt(p.easting, p.northing).bases) expect(Math.abs(b * 20 - Math.round(b * 20))).toBeLessThan(1e-9)
    }
  })
})
