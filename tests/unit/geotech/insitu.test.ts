import { mean, median } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { expectGeotechError } from '../../helpers/geotech'
import {
  ccFromLiquidLimit,
  checkCompressionIndex,
  correctCone,
  CPT_ROW_STATUS,
  cptPreconsolidation,
  cptProfile,
  frictionRatio,
  netConeResistance,
  porePressureRatio,
  resamplePreconsolidation,
  vaneCorrectionFactor,
  vanePreconsolidation,
} from '../../../shared/geotech/insitu'


describe('CPTu single readings — hand calculations', () => {
  // One reading in soft clay: qc = 500 kPa, u2 = 300 kPa, a = 0.8 (the demo soundings' cone),
  // σv0 = 100 kPa, u0 = 80 kPa, fs = 8 kPa.
  it('qt = qc + u2(1 − a) (Campanella, Gillespie & Robertson 1982 — memory): 500 + 300·0.2 = 560 kPa', () => {
    expect(correctCone({ qc: 500, u2: 300, areaRatio: 0.8 })).toBeCloseTo(560, 12)
    expect(correctCone({ qc: 500, u2: 300, areaRatio: 1 })).toBe(500)
  })

  it('qnet = qt − σv0: 560 − 100 = 460 kPa', () => {
    expect(netConeResistance(560, 100)).toBe(460)
  })

  it('Rf = fs/qt·100: 8/560·100 = 1.4286 %', () => {
    expect(frictionRatio(8, 560)).toBeCloseTo(1.428571, 6)
  })

  it('Bq = (u2 − u0)/(qt − σv0) (Senneset & Janbu 1985 — memory): 220/460 = 0.4783', () => {
    expect(porePressureRatio({ u2: 300, u0: 80, qt: 560, totalStress: 100 })).toBeCloseTo(0.478261, 6)
  })

  it('σ\'p = 0.33·qnet (Mayne 1995; Kulhawy & Mayne 1990 — memory): 0.33·460 = 151.8 kPa', () => {
    expect(cptPreconsolidation(460)).toBeCloseTo(151.8, 10)
    expect(cptPreconsolidation(460, 0.25)).toBeCloseTo(115, 10)
  })

  it('rejects unusable readings', () => {
    expectGeotechError(() => correctCone({ qc: 500, u2: 300, areaRatio: 0 }), 'area-ratio-out-of-range')
    expectGeotechError(() => correctCone({ qc: 500, u2: 300, areaRatio: 1.2 }), 'area-ratio-out-of-range')
    expectGeotechError(() => correctCone({ qc: -1, u2: 0, areaRatio: 0.8 }), 'cone-resistance-negative')
    expectGeotechError(() => netConeResistance(90, 100), 'net-cone-resistance-not-positive')
    expectGeotechError(() => cptPreconsolidation(460, 0), 'cone-factor-not-positive')
    expectGeotechError(() => frictionRatio(-2, 560), 'sleeve-friction-negative')
    expectGeotechError(() => correctCone({ qc: Number.NaN, u2: 0, areaRatio: 0.8 }), 'value-not-finite')
  })
})

describe('cptProfile — whole sounding', () => {
  // Hydrostatic profile, water table 1.6 m, γsat = 16 kN/m³ below it and 18 above (demo-site like).
  const stressAt = (z: number) => {
    const totalStress = z <= 1.6 ? 18 * z : 18 * 1.6 + 16 * (z - 1.6)
    const porePressure = Math.max(0, 9.81 * (z - 1.6))
    return { totalStress, porePressure }
  }
  const n = 500
  const depth = new Float64Array(n)
  const qc = new Float64Array(n)
  const fs = new Float64Array(n)
  const u2 = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const z = 0.02 * (i + 1)
    depth[i] = z
    qc[i] = 300 + 40 * z
    fs[i] = 5 + 0.5 * z
    u2[i] = 9.81 * Math.max(0, z - 1.6) + 150 + 10 * z
  }

  it('agrees row by row with the single-reading functions', () => {
    const k = (z: number) => (z < 3.4 ? 0.5 : 0.33)
    const profile = cptProfile({ depth, qc, fs, u2, areaRatio: 0.8, stressAt, k })
    expect(profile.flaggedRows).toBe(0)
    for (const i of [0, 100, 169, 170, 499]) {
      const z = depth[i]!
      const s = stressAt(z)
      const qt = correctCone({ qc: qc[i]!, u2: u2[i]!, areaRatio: 0.8 })
      const qnet = netConeResistance(qt, s.totalStress)
      expect(profile.qt[i]).toBeCloseTo(qt, 10)
      expect(profile.qnet[i]).toBeCloseTo(qnet, 10)
      expect(profile.frictionRatio[i]).toBeCloseTo(frictionRatio(fs[i]!, qt), 10)
      expect(profile.porePressureRatio[i]).toBeCloseTo(porePressureRatio({ u2: u2[i]!, u0: s.porePressure, qt, totalStress: s.totalStress }), 10)
      expect(profile.preconsolidation[i]).toBeCloseTo(cptPreconsolidation(qnet, k(z)), 10)
      expect(profile.ocr[i]).toBeCloseTo(cptPreconsolidation(qnet, k(z)) / (s.totalStress - s.porePressure), 10)
    }
  })

  it('accepts plain arrays and a constant k', () => {
    const profile = cptProfile({ depth: [1, 2], qc: [400, 450], fs: [5, 6], u2: [100, 120], areaRatio: 0.8, stressAt, k: 0.3 })
    const qt = 400 + 100 * 0.2
    expect(profile.preconsolidation[0]).toBeCloseTo(0.3 * (qt - 18), 10)
  })

  it('flags noisy rows without aborting the sounding', () => {
    const profile = cptProfile({
      depth: [0.5, 1, 1.5, 2],
      qc: [5, 400, Number.NaN, 400],
      fs: [1, 5, 5, 5],
      u2: [0, 50, 50, 50],
      areaRatio: 0.8,
      stressAt: z => (z === 2 ? { totalStress: 30, porePressure: 35 } : stressAt(z)),
    })
    expect(Array.from(profile.status)).toEqual([
      CPT_ROW_STATUS.netResistanceNotPositive,
      CPT_ROW_STATUS.ok,
      CPT_ROW_STATUS.readingNotFinite,
      CPT_ROW_STATUS.effectiveStressNotPositive,
    ])
    expect(profile.flaggedRows).toBe(3)
    expect(Number.isNaN(profile.preconsolidation[0]!)).toBe(true)
    expect(Number.isNaN(profile.qt[2]!)).toBe(true)
    expect(profile.preconsolidation[3]).toBeCloseTo(0.33 * (410 - 30), 10)
    expect(Number.isNaN(profile.ocr[3]!)).toBe(true)
  })

  it('rejects mismatched arrays, depths that do not increase and a bad cone factor', () => {
    expectGeotechError(() => cptProfile({ depth: [1, 2], qc: [1], fs: [1, 1], u2: [1, 1], areaRatio: 0.8, stressAt }), 'array-length-mismatch')
    expectGeotechError(() => cptProfile({ depth: [1, 1], qc: [400, 400], fs: [1, 1], u2: [1, 1], areaRatio: 0.8, stressAt }), 'depth-not-increasing')
    expectGeotechError(() => cptProfile({ depth: [1, 2], qc: [400, 400], fs: [1, 1], u2: [1, 1], areaRatio: 0.8, stressAt, k: () => -1 }), 'cone-factor-not-positive')
  })
})

describe('resamplePreconsolidation', () => {
  // 0.02 m rows from 0.02 to 1.00 m with one shell spike at 0.40 m (inside window [0.25, 0.50)).
  const depth = Array.from({ length: 50 }, (_, i) => Number((0.02 * (i + 1)).toFixed(2)))
  const values = depth.map(z => (z === 0.4 ? 900 : 100 + 20 * z))

  it('gives the window median (simple-statistics median on the same rows) and resists the spike', () => {
    const points = resamplePreconsolidation(depth, values, { spacing: 0.25 })
    expect(points.map(p => p.count)).toEqual([12, 12, 13, 12, 1])
    const window = (lo: number, hi: number) => depth.map((z, i) => [z, values[i]!] as const).filter(([z]) => z >= lo - 1e-12 && z < hi - 1e-12)
    const second = window(0.25, 0.5)
    expect(points[1]!.preconsolidation).toBeCloseTo(median(second.map(([, v]) => v)), 12)
    expect(points[1]!.depth).toBeCloseTo(mean(second.map(([z]) => z)), 12)
    expect(points[1]!.preconsolidation).toBeLessThan(120)
    expect(points[4]!.depth).toBeCloseTo(1.0, 12)
  })

  it('gives the window mean on request, which the spike drags up', () => {
    const points = resamplePreconsolidation(depth, values, { spacing: 0.25, statistic: 'mean' })
    const second = depth.map((z, i) => [z, values[i]!] as const).filter(([z]) => z >= 0.25 && z < 0.5).map(([, v]) => v)
    expect(points[1]!.preconsolidation).toBeCloseTo(mean(second), 10)
    expect(points[1]!.preconsolidation).toBeGreaterThan(150)
  })

  it('skips NaN rows and drops empty windows', () => {
    const points = resamplePreconsolidation([0.1, 0.2, 0.6, 0.7, 1.6], [Number.NaN, 50, 60, Number.NaN, 70], { spacing: 0.5 })
    expect(points).toEqual([
      { depth: 0.2, preconsolidation: 50, count: 1 },
      { depth: 0.6, preconsolidation: 60, count: 1 },
      { depth: 1.6, preconsolidation: 70, count: 1 },
    ])
  })

  it('rejects a non-positive spacing', () => {
    expectGeotechError(() => resamplePreconsolidation([1], [1], { spacing: 0 }), 'spacing-not-positive')
  })
})

describe('field vane', () => {
  // μ = 1.7 − 0.54·log10(PI), Azzouz, Baligh & Ladd (1983) fit of Bjerrum's (1972) curve (memory).
  it.each([
    [20, 1.7 - 0.54 * 1.30103], // 0.99744: Bjerrum's curve is close to 1 at PI ≈ 20
    [40, 1.7 - 0.54 * 1.60206], // 0.83489
    [100, 1.7 - 0.54 * 2], // 0.62
  ])('μ(PI = %d) from the closed form', (pi, expected) => {
    expect(vaneCorrectionFactor(pi)).toBeCloseTo(expected, 5)
  })

  it('σ\'p = μ·su/0.22 (Mesri 1975 — memory): su = 20 kPa, PI = 40 → 75.9 kPa', () => {
    const out = vanePreconsolidation(20, { pi: 40 })
    expect(out.mu).toBeCloseTo(0.83489, 5)
    expect(out.correctedStrength).toBeCloseTo(16.6978, 4)
    expect(out.preconsolidation).toBeCloseTo(75.899, 3)
    expect(out.warnings).toEqual([])
  })

  it('uses a given μ and ratio, and warns outside the curve\'s PI range', () => {
    expect(vanePreconsolidation(22, { pi: 40, mu: 1, ratio: 0.25 }).preconsolidation).toBeCloseTo(88, 10)
    expect(vanePreconsolidation(20, { pi: 150 }).warnings).toHaveLength(1)
  })

  it('rejects non-positive strength or PI', () => {
    expectGeotechError(() => vanePreconsolidation(0, { pi: 40 }), 'vane-strength-not-positive')
    expectGeotechError(() => vaneCorrectionFactor(0), 'plasticity-index-not-positive')
  })
})

describe('Cc from the liquid limit (Terzaghi & Peck 1967, after Skempton 1944)', () => {
  it('Cc = 0.009(LL − 10): LL = 60 → 0.45, LL = 104.4 → 0.85', () => {
    expect(ccFromLiquidLimit(60)).toBeCloseTo(0.45, 12)
    expect(ccFromLiquidLimit(104.4)).toBeCloseTo(0.8496, 12)
  })

  it('flags a measured Cc more than a factor of two off the estimate', () => {
    expect(checkCompressionIndex(0.6, 60).flagged).toBe(false) // ratio 1.33
    expect(checkCompressionIndex(0.9, 60).flagged).toBe(false) // ratio 2.0, on the limit
    expect(checkCompressionIndex(0.95, 60).flagged).toBe(true) // ratio 2.11
    const low = checkCompressionIndex(0.2, 60) // ratio 0.44
    expect(low.flagged).toBe(true)
    expect(low.ratio).toBeCloseTo(0.2 / 0.45, 12)
    expect(low.message).toContain('less than')
  })

  it('rejects LL ≤ 10', () => {
    expectGeotechError(() => ccFromLiquidLimit(10), 'liquid-limit-out-of-range')
  })
})
