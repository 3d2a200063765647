import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { computeStressProfile, createStressEvaluator, type StressProfileInput } from '../../../shared/geotech/stress'
import { catchGeotechError } from '../../helpers/geotech'

/*
 * Hand calculations (common practice): σv = q0 + Σγ·h with γ above and γsat
 * below the water table, u = γw·(z − zw) or the piezometric line, σ'v0 = σv − u
 * (Terzaghi 1925/1936). γw = 9.81 kN/m³.
 */


const twoLayers: StressProfileInput = {
  layers: [
    { name: 'Silty sand', thickness: 4, unitWeight: 18, unitWeightSaturated: 20 },
    { name: 'Clay', thickness: 6, unitWeight: 19, unitWeightSaturated: 19 },
  ],
  groundwater: { waterTableDepth: 2 },
}

function pointAt(profile: ReturnType<typeof computeStressProfile>, depth: number) {
  const p = profile.points.find(q => Math.abs(q.depth - depth) < 1e-12)
  if (!p) throw new Error(`no point at ${depth}`)
  return p
}

/** The stresses at `depth` equal the hand values given, to 10 decimals. */
function expectAt(profile: ReturnType<typeof computeStressProfile>, depth: number, expected: Partial<Record<'totalStress' | 'porePressure' | 'effectiveStress', number>>) {
  const p = pointAt(profile, depth)
  for (const [key, value] of Object.entries(expected)) expect(p[key as keyof typeof expected], `${key} at ${depth} m`).toBeCloseTo(value, 10)
}

describe('computeStressProfile: hand calculations', () => {
  it('two layers with the water table inside the first', () => {
    const profile = computeStressProfile(twoLayers)
    expect(profile.points.map(p => p.depth)).toEqual([0, 2, 4, 10])
    // z = 2: σv = 2·18 = 36, u = 0.
    expectAt(profile, 2, { totalStress: 36 })
    expect(pointAt(profile, 2).porePressure).toBe(0)
    // z = 4: σv = 36 + 2·20 = 76, u = 2·9.81 = 19.62, σ' = 56.38.
    expectAt(profile, 4, { totalStress: 76, porePressure: 19.62, effectiveStress: 56.38 })
    // z = 10: σv = 76 + 6·19 = 190, u = 8·9.81 = 78.48, σ' = 111.52.
    expectAt(profile, 10, { totalStress: 190, porePressure: 78.48, effectiveStress: 111.52 })
    expect(profile.warnings).toEqual([])
  })

  it('a layer straddling the water table splits there: γ above, γsat below', () => {
    const profile = computeStressProfile({
      layers: [{ name: 'Crust', thickness: 3, unitWeight: 16, unitWeightSaturated: 21 }],
      groundwater: { waterTableDepth: 2.6 },
    })
    expect(profile.points.map(p => p.depth)).toEqual([0, 2.6, 3])
    // σv(3) = 2.6·16 + 0.4·21 = 50; u(3) = 0.4·9.81 = 3.924.
    expectAt(profile, 2.6, { totalStress: 41.6 })
    expectAt(profile, 3, { totalStress: 50, effectiveStress: 46.076 })
  })

  it('requested depths are interpolated and merged with breakpoints', () => {
    const profile = computeStressProfile({ ...twoLayers, depths: [7.5, 3, 4, 1] })
    expect(profile.points.map(p => p.depth)).toEqual([0, 1, 2, 3, 4, 7.5, 10])
    // z = 3: σv = 36 + 20 = 56, u = 9.81. z = 7.5: σv = 76 + 3.5·19 = 142.5, u = 5.5·9.81 = 53.955.
    expectAt(profile, 3, { totalStress: 56, porePressure: 9.81 })
    expectAt(profile, 7.5, { totalStress: 142.5 })
    expect(pointAt(profile, 7.5).effectiveStress).toBeCloseTo(142.5 - 53.955, 10)
    expectAt(profile, 1, { effectiveStress: 18 })
  })

  it('a surcharge adds to σv and σ\'v0 everywhere', () => {
    const profile = computeStressProfile({ ...twoLayers, surcharge: 15 })
    expect(pointAt(profile, 0).totalStress).toBe(15)
    expect(pointAt(profile, 0).effectiveStress).toBe(15)
    expectAt(profile, 10, { effectiveStress: 126.52 })
  })

  it('boundary rule: a boundary point is in the layer below, the base in the last layer', () => {
    const profile = computeStressProfile(twoLayers)
    expect(pointAt(profile, 0).layer).toBe('Silty sand')
    expect(pointAt(profile, 2).layer).toBe('Silty sand')
    expect(pointAt(profile, 4).layer).toBe('Clay')
    expect(pointAt(profile, 10).layer).toBe('Clay')
    const ev = createStressEvaluator(twoLayers)
    expect(ev(4).layerIndex).toBe(1)
    expect(ev(3.999).layerIndex).toBe(0)
    expect(ev(10).layerIndex).toBe(1)
  })

  it('under-drainage: u linear between piezometers, hydrostatic gradient below the last', () => {
    const input: StressProfileInput = {
      layers: [
        { name: 'Soft clay', thickness: 12, unitWeight: 17, unitWeightSaturated: 17 },
        { name: 'Stiff clay', thickness: 12, unitWeight: 18, unitWeightSaturated: 18 },
      ],
      groundwater: {
        waterTableDepth: 2,
        // 12 m: hydrostatic 10·9.81 = 98.1; 20 m: piezometric level 8 m, 12·9.81 = 117.72 (under-drained).
        piezometers: [{ depth: 20, porePressure: 117.72 }, { depth: 12, porePressure: 98.1 }],
      },
      depths: [7, 16, 24],
    }
    const profile = computeStressProfile(input)
    expect(profile.points.map(p => p.depth)).toEqual([0, 2, 7, 12, 16, 20, 24])
    // z = 7: hydrostatic part, u = 5·9.81 = 49.05.
    expectAt(profile, 7, { porePressure: 49.05 })
    // z = 16: u = (98.1 + 117.72)/2 = 107.91 < hydrostatic 137.34; σv = 2·17 + 10·17 + 4·18 = 276.
    expectAt(profile, 16, { porePressure: 107.91, totalStress: 276, effectiveStress: 168.09 })
    // z = 24: u = 117.72 + 4·9.81 = 156.96; σv = 204 + 12·18 = 420.
    expectAt(profile, 24, { porePressure: 156.96, effectiveStress: 263.04 })
  })

  it('perched water table: u returns to 0 below the aquitard', () => {
    const input: StressProfileInput = {
      layers: [
        { name: 'Upper sand', thickness: 3, unitWeight: 18, unitWeightSaturated: 20 },
        { name: 'Aquitard clay', thickness: 2, unitWeight: 19, unitWeightSaturated: 19 },
        { name: 'Lower sand', thickness: 7, unitWeight: 17, unitWeightSaturated: 20 },
      ],
      groundwater: {
        waterTableDepth: 1,
        piezometers: [
          { depth: 3, porePressure: 19.62 },
          { depth: 5, porePressure: 0 },
          { depth: 8, porePressure: 0 },
        ],
      },
      depths: [4, 6, 10],
    }
    const profile = computeStressProfile(input)
    expectAt(profile, 3, { porePressure: 19.62 })
    expectAt(profile, 4, { porePressure: 9.81 })
    expect(pointAt(profile, 5).porePressure).toBe(0)
    expect(pointAt(profile, 6).porePressure).toBe(0)
    expect(pointAt(profile, 8).porePressure).toBe(0)
    // Below the last control point: hydrostatic gradient from 0 at 8 m, u(10) = 19.62, u(12) = 39.24.
    expectAt(profile, 10, { porePressure: 19.62 })
    expectAt(profile, 12, { porePressure: 39.24 })
    // σv: 18 + 2·20 + 2·19 + 7·20 = 236 (γsat below the table depth).
    expectAt(profile, 12, { totalStress: 236, effectiveStress: 196.76 })
  })

  it('artesian uplift: σ\'v0 reaching zero is an error at that depth', () => {
    const input: StressProfileInput = {
      layers: [
        { name: 'Clay cap', thickness: 4, unitWeight: 18, unitWeightSaturated: 18 },
        { name: 'Confined sand', thickness: 6, unitWeight: 20, unitWeightSaturated: 20 },
      ],
      // σv(4) = 72 kPa but u(4) = 80 kPa: σ' = 18 − 8.667(z − 1) is zero at z = 1 + 18/26·3 = 3.0769 m.
      groundwater: { waterTableDepth: 1, piezometers: [{ depth: 4, porePressure: 80 }] },
    }
    const error = catchGeotechError(() => computeStressProfile(input))
    expect(error.code).toBe('effective-stress-not-positive')
    expect(error.depth).toBeCloseTo(3.076923, 6)
    expect(error.message).toContain('3.077 m')
    expect(error.message).toContain('Clay cap')
    expect(catchGeotechError(() => createStressEvaluator(input)).code).toBe('effective-stress-not-positive')
  })

  it('accepts a zero reading at the water table and a piezometer below the base', () => {
    const profile = computeStressProfile({
      ...twoLayers,
      // Aquifer piezometer at 14 m (below the 10 m base) reads 9.81·9 = 88.29: under-drained, linear from 0 at 2 m.
      groundwater: { waterTableDepth: 2, piezometers: [{ depth: 2, porePressure: 0 }, { depth: 14, porePressure: 88.29 }] },
    })
    expect(profile.points.map(p => p.depth)).toEqual([0, 2, 4, 10])
    // u(10) = 88.29·8/12 = 58.86 kPa.
    expectAt(profile, 10, { porePressure: 58.86 })
  })

  it('a water table below the base gives a dry profile and a warning', () => {
    const profile = computeStressProfile({ ...twoLayers, groundwater: { waterTableDepth: 15 } })
    expect(profile.warnings).toHaveLength(1)
    expect(profile.warnings[0]).toContain('15 m')
    for (const p of profile.points) expect(p.porePressure).toBe(0)
    // Dry: 4·18 + 6·19 = 186.
    expectAt(profile, 10, { totalStress: 186 })
  })
})

describe('computeStressProfile: invalid input', () => {
  it('rejects zero or negative thickness, naming the layer', () => {
    const error = catchGeotechError(() => computeStressProfile({
      ...twoLayers,
      layers: [twoLayers.layers[0]!, { ...twoLayers.layers[1]!, thickness: 0 }],
    }))
    expect(error.code).toBe('layer-thickness-not-positive')
    expect(error.message).toContain('Clay')
    expect(error.depth).toBe(4)
  })

  it('rejects a negative unit weight', () => {
    const error = catchGeotechError(() => computeStressProfile({
      ...twoLayers,
      layers: [{ ...twoLayers.layers[0]!, unitWeight: -1 }, twoLayers.layers[1]!],
    }))
    expect(error.code).toBe('unit-weight-negative')
    expect(error.message).toContain('Silty sand')
  })

  it('rejects depths below the base or above the surface', () => {
    expect(catchGeotechError(() => computeStressProfile({ ...twoLayers, depths: [10.5] })).code).toBe('depth-outside-profile')
    expect(catchGeotechError(() => computeStressProfile({ ...twoLayers, depths: [-1] })).code).toBe('depth-outside-profile')
    expect(catchGeotechError(() => createStressEvaluator(twoLayers)(10.01)).code).toBe('depth-outside-profile')
  })

  it('rejects a piezometer above the water table', () => {
    const error = catchGeotechError(() => computeStressProfile({
      ...twoLayers,
      groundwater: { waterTableDepth: 2, piezometers: [{ depth: 1, porePressure: 5 }] },
    }))
    expect(error.code).toBe('piezometer-above-water-table')
  })
})

describe('createStressEvaluator', () => {
  it('returns exactly the profile values at every point', () => {
    const input: StressProfileInput = { ...twoLayers, depths: [0.3, 2.7, 5.55, 9.99] }
    const profile = computeStressProfile(input)
    const ev = createStressEvaluator(input)
    for (const p of profile.points) {
      const v = ev(p.depth)
      expect(v.totalStress).toBe(p.totalStress)
      expect(v.porePressure).toBe(p.porePressure)
      expect(v.effectiveStress).toBe(p.effectiveStress)
      expect(v.layerIndex).toBe(p.layerIndex)
    }
  })

  it('evaluates 100 000 depths consistently with the profile', () => {
    const ev = createStressEvaluator(twoLayers)
    let maxError = 0
    for (let i = 0; i <= 100_000; i++) {
      const z = (10 * i) / 100_000
      // Hand formula for this profile.
      const total = z <= 2 ? 18 * z : z <= 4 ? 36 + 20 * (z - 2) : 76 + 19 * (z - 4)
      const u = z <= 2 ? 0 : 9.81 * (z - 2)
      maxError = Math.max(maxError, Math.abs(ev(z).effectiveStress - (total - u)))
    }
    expect(maxError).toBeLessThan(1e-9)
  })
})

describe('stress profile properties (fast-check)', () => {
  it('the evaluator equals the profile at any requested depth', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { minLength: 1, maxLength: 30 }), (depths) => {
        const input: StressProfileInput = { ...twoLayers, groundwater: { waterTableDepth: 2, piezometers: [{ depth: 7, porePressure: 40 }] }, depths }
        const ev = createStressEvaluator(input)
        for (const p of computeStressProfile(input).points) {
          expect(ev(p.depth).effectiveStress).toBe(p.effectiveStress)
        }
      }),
    )
  })

  const layerArb = fc.record({
    thickness: fc.double({ min: 0.1, max: 8, noNaN: true }),
    unitWeight: fc.double({ min: 12, max: 22, noNaN: true }),
    unitWeightSaturated: fc.double({ min: 10, max: 23, noNaN: true }),
  })

  it('σv and σ\'v0 are non-decreasing with depth under hydrostatic water (γsat ≥ γw)', () => {
    fc.assert(
      fc.property(
        fc.array(layerArb, { minLength: 1, maxLength: 6 }),
        fc.double({ min: 0, max: 1.2, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 20 }),
        (layers, wtFraction, surcharge, fractions) => {
          const named = layers.map((l, i) => ({ ...l, name: `L${i}` }))
          const base = named.reduce((s, l) => s + l.thickness, 0)
          const input: StressProfileInput = {
            surcharge,
            layers: named,
            groundwater: { waterTableDepth: wtFraction * base },
            depths: fractions.map(f => f * base * 0.999999),
          }
          const points = computeStressProfile(input).points
          for (let i = 1; i < points.length; i++) {
            expect(points[i]!.depth).toBeGreaterThan(points[i - 1]!.depth)
            expect(points[i]!.totalStress).toBeGreaterThanOrEqual(points[i - 1]!.totalStress - 1e-9)
            expect(points[i]!.effectiveStress).toBeGreaterThanOrEqual(points[i - 1]!.effectiveStress - 1e-9)
          }
        },
      ),
    )
  })
})
