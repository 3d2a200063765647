import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import {
  computeSettlement,
  primaryCompression,
  type PreconsolidationModel,
  type SettlementInput,
  type SettlementLayer,
} from '../../../shared/geotech/settlement'
import { degreeOfConsolidation, timeFactorForDegree } from '../../../shared/geotech/consolidation'
import { catchGeotechError } from '../../helpers/geotech'

/*
 * Hand calculations by the 1-D settlement formulas (Terzaghi & Peck; any
 * soil-mechanics text): Δe = Cc·log10(σ'vf/σ'v0) (NC), Cr·log10(σ'vf/σ'v0)
 * (OC), Cr·log10(σ'p/σ'v0) + Cc·log10(σ'vf/σ'p) (OC-NC); Δh = Δe/(1 + e0)·h.
 */


const sand: SettlementLayer = { name: 'Sand', thickness: 2, unitWeight: 18, unitWeightSaturated: 20, compressible: false }

function clay(preconsolidation: PreconsolidationModel, extra: Partial<SettlementLayer> = {}): SettlementLayer {
  return {
    name: 'Clay',
    thickness: 4,
    unitWeight: 17,
    unitWeightSaturated: 17,
    compressible: true,
    cc: 0.4,
    cr: 0.05,
    e0: 1.0,
    preconsolidation,
    ...extra,
  }
}

/** Sand 0–2 m over clay 2–6 m, water table at 2 m, 50 kPa fill, one sublayer: σ'v0(4 m) = 2·18 + 2·17 − 2·9.81 = 50.38 kPa. */
function oneSublayer(preconsolidation: PreconsolidationModel): SettlementInput {
  return {
    layers: [sand, clay(preconsolidation)],
    groundwater: { waterTableDepth: 2 },
    load: { type: 'uniform', pressure: 50 },
    sublayers: { count: 1 },
  }
}

describe('computeSettlement: hand calculations', () => {
  it('NC layer: Δe = 0.4·log10(100.38/50.38) = 0.119756, S = Δe/2·4 = 0.239511 m', () => {
    const r = computeSettlement(oneSublayer({ type: 'ocr', value: 1 }))
    expect(r.settlement).toBeCloseTo(0.239511, 6)
    const row = r.sublayers[0]!
    expect(row.case).toBe('NC')
    expect(row.depth).toBe(4)
    expect(row.effectiveStress).toBeCloseTo(50.38, 10)
    expect(row.finalEffectiveStress).toBeCloseTo(100.38, 10)
    expect(row.voidRatioChange).toBeCloseTo(0.119756, 6)
    expect(row.strain).toBeCloseTo(0.059878, 6)
    expect(row.finalPreconsolidation).toBeCloseTo(100.38, 10)
    expect(r.layers).toEqual([{ name: 'Sand', settlement: 0 }, { name: 'Clay', settlement: r.settlement }])
  })

  it('OC layer staying below σ\'p = 120: Δe = 0.05·log10(100.38/50.38), S = 0.029939 m', () => {
    const r = computeSettlement(oneSublayer({ type: 'constant', value: 120 }))
    expect(r.sublayers[0]!.case).toBe('OC')
    expect(r.settlement).toBeCloseTo(0.029939, 6)
    expect(r.sublayers[0]!.finalPreconsolidation).toBe(120)
  })

  it('OC-NC crossing σ\'p = 80: Δe = 0.05·log10(80/50.38) + 0.4·log10(100.38/80), S = 0.098929 m', () => {
    const r = computeSettlement(oneSublayer({ type: 'constant', value: 80 }))
    expect(r.sublayers[0]!.case).toBe('OC-NC')
    expect(r.settlement).toBeCloseTo(0.098929, 6)
  })

  it('POP and OCR forms give σ\'p from σ\'v0 at mid-depth', () => {
    // POP 29.62 → σ'p = 80 and OCR = 80/50.38 → σ'p = 80: both the OC-NC hand case.
    expect(computeSettlement(oneSublayer({ type: 'pop', value: 29.62 })).settlement).toBeCloseTo(0.098929, 6)
    expect(computeSettlement(oneSublayer({ type: 'ocr', value: 80 / 50.38 })).settlement).toBeCloseTo(0.098929, 6)
  })

  it('linear σ\'p: interpolated at each sublayer mid-depth', () => {
    const r = computeSettlement({ ...oneSublayer({ type: 'linear', top: 60, bottom: 100 }), sublayers: { count: 2 } })
    // Mid-depths 3 m and 5 m are 1/4 and 3/4 down the clay: σ'p = 70 and 90 kPa.
    expect(r.sublayers.map(s => s.preconsolidation)).toEqual([70, 90])
  })

  it('σ\'p below σ\'v0 is raised to σ\'v0 with one warning for the layer', () => {
    const r = computeSettlement({ ...oneSublayer({ type: 'ocr', value: 0.8 }), sublayers: { count: 20 } })
    const nc = computeSettlement({ ...oneSublayer({ type: 'ocr', value: 1 }), sublayers: { count: 20 } })
    expect(r.settlement).toBeCloseTo(nc.settlement, 12)
    expect(r.warnings.filter(w => w.includes('raised'))).toHaveLength(1)
    expect(r.warnings[0]).toContain('Clay')
    for (const s of r.sublayers) expect(s.preconsolidation).toBe(s.effectiveStress)
  })

  it('only compressible layers contribute', () => {
    const input = oneSublayer({ type: 'ocr', value: 1 })
    const withRigid = computeSettlement({
      ...input,
      layers: [...input.layers, { name: 'Gravel', thickness: 5, unitWeight: 20, unitWeightSaturated: 21, compressible: false, cc: 5, cr: 5, e0: 1 }],
    })
    expect(withRigid.settlement).toBeCloseTo(0.239511, 6)
    expect(withRigid.layers[2]).toEqual({ name: 'Gravel', settlement: 0 })
    expect(withRigid.sublayers.every(s => s.layer === 'Clay')).toBe(true)
  })

  it('the result serialises with its sublayer rows (JSON and spread)', () => {
    const r = computeSettlement({ ...oneSublayer({ type: 'constant', value: 80 }), sublayers: { count: 3 } })
    const json = JSON.parse(JSON.stringify(r)) as { sublayers: { case: string, compression: number }[], settlement: number }
    expect(json.sublayers).toHaveLength(3)
    expect(json.sublayers.reduce((s, row) => s + row.compression, 0)).toBeCloseTo(r.settlement, 14)
    expect({ ...r }.sublayers).toEqual(r.sublayers)
  })

  it('primaryCompression is the same per-sublayer formula', () => {
    expect(primaryCompression(0.4, 0.05, 1, 50.38, 80, 100.38, 4)).toBeCloseTo(0.098929, 6)
  })
})

describe('sublayering converges to the exact integral', () => {
  // Clay 0–10 m, water table at the surface, γsat = 18, q0 = 10 kPa in place: σ'v0(z) = 10 + 8.19z; fill 50 kPa; Cc = 0.5, e0 = 1.5.
  const a = 10
  const b = 18 - 9.81
  const H = 10
  const dq = 50
  const cc = 0.5
  const e0 = 1.5
  // ∫₀ᴴ Cc/(1+e0)·log10((a + bz + Δq)/(a + bz)) dz with ∫ln(c + bz)dz = ((c + bz)ln(c + bz) − (c + bz))/b (analytic, common practice).
  const G = (c: number) => ((c + b * H) * Math.log(c + b * H) - c * Math.log(c)) / b - H
  const exact = (cc / ((1 + e0) * Math.LN10)) * (G(a + dq) - G(a))

  function run(sublayers: SettlementInput['sublayers']) {
    return computeSettlement({
      surcharge: a,
      layers: [{ name: 'Soft clay', thickness: H, unitWeight: 18, unitWeightSaturated: 18, compressible: true, cc, cr: 0.05, e0, preconsolidation: { type: 'ocr', value: 1 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: dq },
      sublayers,
    })
  }

  it('the error falls about fourfold each time the sublayers are halved (midpoint rule, second order)', () => {
    expect(exact).toBeCloseTo(0.68983, 5)
    const errors = [1, 2, 4, 8, 16, 32, 64].map(count => Math.abs(run({ count }).settlement - exact) / exact)
    for (let i = 1; i < errors.length; i++) {
      expect(errors[i]!).toBeLessThan(errors[i - 1]!)
    }
    for (let i = 3; i < errors.length; i++) {
      const ratio = errors[i - 1]! / errors[i]!
      expect(ratio).toBeGreaterThan(3.5)
      expect(ratio).toBeLessThan(4.5)
    }
    expect(errors[0]!).toBeGreaterThan(0.1)
  })

  it('the default 0.25 m sublayers are within 0.03 % of the integral', () => {
    const r = run(undefined)
    expect(r.sublayers).toHaveLength(40)
    expect(Math.abs(r.settlement - exact) / exact).toBeLessThan(3e-4)
  })

  it('the convergence report is the result with every sublayer halved', () => {
    const r = run({ count: 8 })
    const twice = run({ count: 16 })
    expect(r.convergence!.halved).toBeCloseTo(twice.settlement, 14)
    expect(r.convergence!.relativeChange).toBeCloseTo(Math.abs(twice.settlement - r.settlement) / r.settlement, 14)
    // And it shrinks as the sublayers thin.
    expect(run({ maxThickness: 0.1 }).convergence!.relativeChange).toBeLessThan(r.convergence!.relativeChange)
  })

  it('a many-run caller may skip the convergence report; the settlement is unchanged', () => {
    const input = {
      layers: [{ name: 'Clay', thickness: 6, unitWeight: 17, unitWeightSaturated: 17, compressible: true, cc: 0.4, cr: 0.04, e0: 1.3, preconsolidation: { type: 'pop' as const, value: 20 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform' as const, pressure: 80 },
      sublayers: { count: 12 },
    }
    const full = computeSettlement(input)
    const quick = computeSettlement(input, { convergence: false })
    expect(quick.convergence).toBeNull()
    expect(quick.settlement).toBe(full.settlement)
  })

  it('relativeChange is 0 when there is no settlement', () => {
    const r = computeSettlement({
      layers: [{ name: 'Gravel', thickness: 5, unitWeight: 20, unitWeightSaturated: 21, compressible: false }],
      groundwater: { waterTableDepth: 1 },
      load: { type: 'uniform', pressure: 100 },
    })
    expect(r.settlement).toBe(0)
    expect(r.convergence).toEqual({ halved: 0, relativeChange: 0 })
  })
})

describe('finite loads', () => {
  it('uses Δσ under the plan point at each mid-depth', () => {
    const input: SettlementInput = {
      ...oneSublayer({ type: 'ocr', value: 1 }),
      load: { type: 'rectangle', width: 4, length: 4, pressure: 100 },
    }
    const r = computeSettlement(input)
    // Centre of a 4 × 4 m rectangle at z = 4 m: 4·q·I(0.5, 0.5) = 400·0.0840 = 33.6 kPa (Newmark 1935 table, memory).
    expect(r.sublayers[0]!.stressIncrease).toBeCloseTo(33.6, 1)
    expect(r.settlement).toBeCloseTo((0.4 / 2) * 4 * Math.log10((50.38 + r.sublayers[0]!.stressIncrease) / 50.38), 12)
  })
})

describe('time rate', () => {
  const base: SettlementInput = {
    layers: [sand, clay({ type: 'ocr', value: 1 }, { cv: 1.2 })],
    groundwater: { waterTableDepth: 2 },
    load: { type: 'uniform', pressure: 50 },
  }

  it('a double-drained layer reaches 50 % at Tv ≈ 0.197 and 90 % at Tv ≈ 0.848', () => {
    // Hdr = 2 m, cv = 1.2 m²/yr: t = Tv·4/1.2 (Das table values 0.197, 0.848, memory).
    const t50 = (0.197 * 4) / 1.2
    const t90 = (0.848 * 4) / 1.2
    const r = computeSettlement({ ...base, time: { years: [0, t50, t90] } })
    expect(r.time![0]!.degree).toBe(0)
    expect(Math.abs(r.time![1]!.degree - 0.5)).toBeLessThan(0.001)
    expect(Math.abs(r.time![2]!.degree - 0.9)).toBeLessThan(0.001)
    expect(r.time![2]!.settlement).toBeCloseTo(r.time![2]!.degree * r.settlement, 14)
    expect(Math.abs(r.times!.t50 - t50)).toBeLessThan(0.002)
    expect(Math.abs(r.times!.t90 - t90)).toBeLessThan(0.002)
  })

  it('single drainage doubles the drainage path: four times the time', () => {
    const dbl = computeSettlement(base)
    const top = computeSettlement({ ...base, layers: [sand, clay({ type: 'ocr', value: 1 }, { cv: 1.2, drainage: 'top' })] })
    expect(top.times!.t50 / dbl.times!.t50).toBeCloseTo(4, 6)
  })

  it('two layers: S(t) = Σ Uᵢ(t)·Sᵢ', () => {
    const second: SettlementLayer = { ...clay({ type: 'ocr', value: 1 }, { cv: 0.3, drainage: 'bottom' }), name: 'Deep clay', thickness: 3 }
    const r = computeSettlement({ ...base, layers: [...base.layers, second], time: { years: [1, 5] } })
    const s1 = r.layers[1]!.settlement
    const s2 = r.layers[2]!.settlement
    for (const row of r.time!) {
      const u1 = degreeOfConsolidation((1.2 * row.years) / 4)
      const u2 = degreeOfConsolidation((0.3 * row.years) / 9)
      expect(row.settlement).toBeCloseTo(u1 * s1 + u2 * s2, 12)
    }
  })

  it('requires cv on every compressible layer for a time rate, naming the layer', () => {
    const error = catchGeotechError(() => computeSettlement({ ...base, layers: [sand, clay({ type: 'ocr', value: 1 })], time: { years: [1] } }))
    expect(error.code).toBe('cv-missing')
    expect(error.message).toContain('Clay')
  })

  it('secondary compression over the design life', () => {
    const r = computeSettlement({ ...base, layers: [sand, clay({ type: 'ocr', value: 1 }, { cv: 1.2, calpha: 0.016 })], designLife: 50 })
    // End of primary at U = 95 %: tp = 1.129·4/1.2 = 3.763 yr (Das table, memory).
    const layer = r.secondary!.layers[0]!
    expect(layer.endOfPrimary).toBeCloseTo(3.763, 2)
    // Δh = Cα/(1 + ep)·H·log10(t/tp), ep = e0 − S/H·(1 + e0) (Mesri 1973; common practice).
    const ep = 1 - (r.settlement / 4) * 2
    expect(layer.settlement).toBeCloseTo((0.016 / (1 + ep)) * 4 * Math.log10(50 / (timeFactorForDegree(0.95) * 4 / 1.2)), 12)
    expect(layer.settlement).toBeGreaterThan(0.03)
    expect(layer.settlement).toBeLessThan(0.04)
  })
})

describe('validation names the layer', () => {
  const cases: [string, Partial<SettlementLayer>, string][] = [
    ['e0 ≤ 0', { e0: 0 }, 'void-ratio-not-positive'],
    ['negative Cc', { cc: -0.1 }, 'compression-index-negative'],
    ['negative Cr', { cr: -0.01 }, 'compression-index-negative'],
    ['missing Cc', { cc: undefined }, 'compressibility-missing'],
    ['missing e0', { e0: undefined }, 'compressibility-missing'],
    ['negative σ\'p', { preconsolidation: { type: 'constant', value: -5 } }, 'preconsolidation-negative'],
    ['negative σ\'p from POP', { preconsolidation: { type: 'pop', value: -100 } }, 'preconsolidation-negative'],
  ]
  for (const [label, change, code] of cases) {
    it(label, () => {
      const error = catchGeotechError(() => computeSettlement({
        ...oneSublayer({ type: 'ocr', value: 1 }),
        layers: [sand, { ...clay({ type: 'ocr', value: 1 }), ...change }],
      }))
      expect(error.code).toBe(code)
      expect(error.message).toContain('"Clay"')
    })
  }
})

describe('settlement properties (fast-check)', () => {
  const params = fc.record({
    cc: fc.double({ min: 0.05, max: 1.5, noNaN: true }),
    crRatio: fc.double({ min: 0, max: 1, noNaN: true }),
    e0: fc.double({ min: 0.4, max: 3, noNaN: true }),
    thickness: fc.double({ min: 0.5, max: 15, noNaN: true }),
    pop: fc.double({ min: 0, max: 150, noNaN: true }),
  })

  function profile(p: { cc: number, crRatio: number, e0: number, thickness: number, pop: number }, load: SettlementInput['load'], preconsolidation?: PreconsolidationModel): SettlementInput {
    return {
      layers: [
        sand,
        { name: 'Clay', thickness: p.thickness, unitWeight: 17, unitWeightSaturated: 17, compressible: true, cc: p.cc, cr: p.cc * p.crRatio, e0: p.e0, preconsolidation: preconsolidation ?? { type: 'pop', value: p.pop } },
      ],
      groundwater: { waterTableDepth: 1 },
      load,
      sublayers: { maxThickness: 0.5 },
    }
  }

  it('settlement is monotone in the load', () => {
    fc.assert(
      fc.property(params, fc.double({ min: 0, max: 300, noNaN: true }), fc.double({ min: 0, max: 300, noNaN: true }), (p, q1, q2) => {
        const [lo, hi] = q1 <= q2 ? [q1, q2] : [q2, q1]
        const sLo = computeSettlement(profile(p, { type: 'uniform', pressure: lo })).settlement
        const sHi = computeSettlement(profile(p, { type: 'uniform', pressure: hi })).settlement
        expect(sHi).toBeGreaterThanOrEqual(sLo - 1e-12)
        expect(sLo).toBeGreaterThanOrEqual(0)
      }),
    )
  })

  it('settlement is monotone in the load under a finite rectangle too', () => {
    fc.assert(
      fc.property(params, fc.double({ min: 0, max: 300, noNaN: true }), fc.double({ min: 1.01, max: 3, noNaN: true }), (p, q, k) => {
        const load = (pressure: number) => ({ type: 'rectangle' as const, width: 6, length: 9, pressure, at: { x: 1, y: 2 } })
        const s1 = computeSettlement(profile(p, load(q))).settlement
        const s2 = computeSettlement(profile(p, load(q * k))).settlement
        expect(s2).toBeGreaterThanOrEqual(s1 - 1e-12)
      }),
    )
  })

  it('with Cr = Cc the settlement does not depend on σ\'p', () => {
    const pcArb: fc.Arbitrary<PreconsolidationModel> = fc.oneof(
      fc.double({ min: 0.5, max: 6, noNaN: true }).map(value => ({ type: 'ocr' as const, value })),
      fc.double({ min: -20, max: 300, noNaN: true }).map(value => ({ type: 'pop' as const, value })),
      fc.double({ min: 1, max: 500, noNaN: true }).map(value => ({ type: 'constant' as const, value })),
      fc.tuple(fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true })).map(([top, bottom]) => ({ type: 'linear' as const, top, bottom })),
    )
    fc.assert(
      fc.property(params, pcArb, fc.double({ min: 1, max: 300, noNaN: true }), (p, pc, q) => {
        const same = { ...p, crRatio: 1 }
        const reference = computeSettlement(profile(same, { type: 'uniform', pressure: q }, { type: 'ocr', value: 1 })).settlement
        const other = computeSettlement(profile(same, { type: 'uniform', pressure: q }, pc)).settlement
        expect(Math.abs(other - reference)).toBeLessThanOrEqual(1e-12 + 1e-9 * reference)
      }),
    )
  })
})
