// Drainage groups: a stratum cut into slices consolidates as one layer (Terzaghi 1925: the
// drainage path is set by the stratum's drained faces, never by a slice).
import { describe, expect, it } from 'vitest'
import { consolidationUnits } from '../../shared/geotech/consolidation'
import { computeSettlement, type SettlementInput, type SettlementLayer } from '../../shared/geotech/settlement'
import { createStressEvaluator } from '../../shared/geotech/stress'
import { toSettlementLayers, toStressInput } from '../../shared/site-model/convert'
import { scenarioDefinition } from '../helpers/scenario-definition'

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

const clay = { unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.85, cr: 0.09, e0: 2.1, preconsolidation: { type: 'pop' as const, value: 25 }, cv: 1.2, drainage: 'double' as const, calpha: 0.03 }
const fill: SettlementLayer = { name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false }

function input(layers: SettlementLayer[]): SettlementInput {
  return { layers, groundwater: { waterTableDepth: 1 }, load: { type: 'uniform', pressure: 60 }, sublayers: { maxThickness: 0.25 }, time: { years: [1, 10] }, designLife: 100 }
}

describe('drainage groups', () => {
  it('one clay layer: t50 and t90 give Tv50 = 0.197 and Tv90 = 0.848 (Terzaghi 1925; Das, Principles of Geotechnical Engineering, U–Tv table)', () => {
    const r = computeSettlement(input([fill, { name: 'Clay', thickness: 11.6, ...clay }]))
    const hdr = 11.6 / 2
    expect((r.times!.t90 * clay.cv) / (hdr * hdr)).toBeCloseTo(0.848, 3)
    expect((r.times!.t50 * clay.cv) / (hdr * hdr)).toBeCloseTo(0.197, 3)
  })

  it('the same 11.6 m clay sliced (EST (1/2), 0.25 m slices) or whole gives the same settlement, t50, t90 (1e-9 relative) and end of primary', () => {
    // Same sublayers both ways: 2 × 24 (5.8 m / 0.25 m) and 48; 47 × 1 and 47.
    const whole = computeSettlement({ ...input([fill, { name: 'EST', thickness: 11.6, ...clay }]), sublayers: { count: 48 } })
    const halves = computeSettlement(input([fill, { name: 'EST (1/2)', thickness: 5.8, ...clay, drainageGroup: 'EST' }, { name: 'EST (2/2)', thickness: 5.8, ...clay, drainageGroup: 'EST' }]))
    const slices = Array.from({ length: 47 }, (_, i) => ({ name: `EST (${i + 1}/47)`, thickness: 11.6 / 47, ...clay, drainageGroup: 'EST' }))
    const thin = computeSettlement({ ...input([fill, ...slices]), sublayers: { count: 1 } })
    const wholeThin = computeSettlement({ ...input([fill, { name: 'EST', thickness: 11.6, ...clay }]), sublayers: { count: 47 } })
    for (const [a, b] of [[halves, whole], [thin, wholeThin]] as const) {
      expect(rel(a.settlement, b.settlement)).toBeLessThan(1e-9)
      expect(rel(a.times!.t50, b.times!.t50)).toBeLessThan(1e-9)
      expect(rel(a.times!.t90, b.times!.t90)).toBeLessThan(1e-9)
      a.time!.forEach((p, i) => expect(rel(p.settlement, b.time![i]!.settlement)).toBeLessThan(1e-9))
      // Secondary: the same end of primary (the group's); ep is each slice's own, so it agrees closely, not exactly.
      expect(a.secondary!.layers[0]!.endOfPrimary).toBeCloseTo(b.secondary!.layers[0]!.endOfPrimary, 9)
      expect(rel(a.secondary!.settlement, b.secondary!.settlement)).toBeLessThan(1e-3)
    }
    // Without the group each 0.25 m slice would drain on its own: t90 in days, not decades.
    const ungrouped = computeSettlement({ ...input([fill, ...slices.map(({ drainageGroup: _g, ...s }) => s)]), sublayers: { count: 1 } })
    expect(ungrouped.times!.t90).toBeLessThan(wholeThin.times!.t90 / 1000)
    expect(wholeThin.times!.t90).toBeGreaterThan(20)
  })

  it('groups only consecutive layers; a layer without a group drains on its own', () => {
    const units = consolidationUnits([
      { thickness: 1, cv: 1, drainageGroup: 'A' },
      { thickness: 1, cv: 1, drainageGroup: 'A' },
      { thickness: 2, cv: 1 },
      { thickness: 1, cv: 1, drainageGroup: 'A' },
    ])
    expect(units.map(u => u.members)).toEqual([[0, 1], [2], [3]])
    expect(units.map(u => u.hdr)).toEqual([1, 1, 0.5])
  })

  it('a group\'s cv is the thickness-weighted harmonic mean H / Σ(hᵢ/cvᵢ) (layers in series; common practice), its drainage the first member\'s', () => {
    const [u] = consolidationUnits([
      { thickness: 1, cv: 1, drainage: 'top', drainageGroup: 'G' },
      { thickness: 3, cv: 4, drainage: 'top', drainageGroup: 'G' },
    ])
    // 4 / (1/1 + 3/4) = 16/7 m²/yr; single drainage: Hdr = 4 m.
    expect(u!.cv).toBeCloseTo(16 / 7, 12)
    expect(u!.hdr).toBe(4)
    expect(u!.drainage).toBe('top')
    expect(u!.mixedDrainage).toBe(false)
  })

  it('the model export names each compressible stratum\'s group (its code), so the demo\'s split crust and estuarine clay drain as whole strata', () => {
    const def = scenarioDefinition()
    const ev = createStressEvaluator(toStressInput(def))
    const layers = toSettlementLayers(def, z => ev(z).effectiveStress)
    for (const l of layers) {
      if (l.compressible) expect(l.drainageGroup).toMatch(/^(CRUST|EST|GLA)$/)
      else expect(l.drainageGroup).toBeUndefined()
    }
    // The crust's linear σ'p trend is one piece; with a depth trend of cv the estuarine clay is sliced.
    const sliced = structuredClone(def)
    const est = sliced.strata.find(s => s.code === 'EST')!
    est.compressibility!.trends = { cc: { referenceDepth: 9, value: 0.85, gradient: 0.01, n: 5, r2: 0.8, testDepths: { top: 4, bottom: 14 }, testIds: [] } }
    const ev2 = createStressEvaluator(toStressInput(sliced))
    const slicedLayers = toSettlementLayers(sliced, z => ev2(z).effectiveStress)
    expect(slicedLayers.filter(l => l.drainageGroup === 'EST').length).toBeGreaterThan(40)
    const base = { ...toStressInput(def), load: { type: 'uniform' as const, pressure: 50 }, time: { years: [1] } }
    const a = computeSettlement({ ...base, layers: slicedLayers })
    // Cc changes the settlement, not the time rate: t90 is the unsliced model's.
    const b = computeSettlement({ ...base, layers })
    const estUnsliced = computeSettlement({ ...base, layers: layers.map(l => (l.drainageGroup === 'EST' ? l : { ...l, compressible: false })) })
    const hdr = 11.6 / 2
    expect((estUnsliced.times!.t90 * 1.2) / (hdr * hdr)).toBeCloseTo(0.848, 3)
    expect(a.times!.t90).toBeGreaterThan(0.5 * b.times!.t90)
  })
})
