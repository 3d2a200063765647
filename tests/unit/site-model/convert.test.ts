import { describe, expect, it } from 'vitest'
import { computeSettlement } from '../../../shared/geotech/settlement'
import { createStressEvaluator } from '../../../shared/geotech/stress'
import { toSettlementLayers, toStressInput, trendPreconsolidation, ModelIncompleteError } from '../../../shared/site-model/convert'
import { SITE_MODEL_SCHEMA_VERSION, type SiteModelDefinition } from '../../../shared/site-model/definition'
import { sublayerTable } from '../../../shared/site-model/sublayers'

const comp = { cc: 0.8, cr: 0.08, e0: 2, drainage: 'double' as const, source: 'manual' as const }
const trend = (model: 'constant' | 'linear' | 'pop' | 'ocr' | 'crust', parameters: Record<string, number>, extra = {}) => ({ model, logSpace: false, parameters, n: 5, r2: 0.9, rmse: 1, aic: 1, aicc: 1, includedPointIds: [], excludedPointIds: [], ...extra })

function def(strata: SiteModelDefinition['strata']): SiteModelDefinition {
  return { schemaVersion: SITE_MODEL_SCHEMA_VERSION, surcharge: 0, gammaW: 9.81, groundwater: { waterTableDepth: 1, piezometers: [] }, strata, flagsInForce: [] }
}

const fill = { code: 'F', name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false, cptFactor: 0.33 }

describe('site model → engine inputs', () => {
  it('maps constant, POP, OCR and linear trends one to one (linear by its values at the stratum top and bottom)', () => {
    const d = def([
      fill,
      { code: 'A', name: 'A', thickness: 2, unitWeight: 17, unitWeightSaturated: 17, compressible: true, compressibility: comp, trend: trend('pop', { pop: 25 }), cptFactor: 0.33 },
      { code: 'B', name: 'B', thickness: 2, unitWeight: 17, unitWeightSaturated: 17, compressible: true, compressibility: comp, trend: trend('ocr', { ocr: 2 }), cptFactor: 0.33 },
      { code: 'C', name: 'C', thickness: 2, unitWeight: 17, unitWeightSaturated: 17, compressible: true, compressibility: comp, trend: trend('linear', { intercept: 100, gradient: 10 }), cptFactor: 0.33 },
    ])
    const layers = toSettlementLayers(d, () => 50)
    expect(layers.map(l => l.preconsolidation ?? null)).toEqual([null, { type: 'pop', value: 25 }, { type: 'ocr', value: 2 }, { type: 'linear', top: 100 + 10 * 5, bottom: 100 + 10 * 7 }])
    expect(layers.map(l => l.thickness)).toEqual([1, 2, 2, 2])
  })

  it('splits a crust trend at its breakpoint: linear above, the model below as it is; σ\'v0 is unchanged by the split', () => {
    const crust = trend('crust', { breakpointDepth: 3, crustGradient: -40, valueAtBreakpoint: 120, pop: 30 }, { crustBelow: 'pop' })
    const d = def([fill, { code: 'K', name: 'Crust', thickness: 4, unitWeight: 18, unitWeightSaturated: 18.5, compressible: true, compressibility: comp, trend: crust, cptFactor: 0.33 }])
    const ev = createStressEvaluator(toStressInput(d))
    const layers = toSettlementLayers(d, z => ev(z).effectiveStress)
    expect(layers.map(l => [l.name, l.thickness])).toEqual([['Fill', 1], ['Crust (1/2)', 2], ['Crust (2/2)', 2]])
    // Above the breakpoint σ'p = 120 − 40 (z − 3): 200 kPa at 1 m, 120 kPa at 3 m.
    expect(layers[1]!.preconsolidation).toEqual({ type: 'linear', top: expect.closeTo(200, 6), bottom: expect.closeTo(120, 6) })
    expect(layers[2]!.preconsolidation).toEqual({ type: 'pop', value: 30 })
    const split = createStressEvaluator({ ...toStressInput(d), layers: layers.map(l => ({ name: l.name, thickness: l.thickness, unitWeight: l.unitWeight, unitWeightSaturated: l.unitWeightSaturated })) })
    for (const z of [0.5, 2, 3.2, 4.9]) expect(split(z).effectiveStress).toBeCloseTo(ev(z).effectiveStress, 12)
  })

  it('follows a hand-drawn trend through its knots', () => {
    const s = { code: 'M', name: 'M', thickness: 4, unitWeight: 17, unitWeightSaturated: 17, compressible: true, compressibility: comp, cptFactor: 0.33, trend: { ...trend('constant', {}), manual: { knots: [{ depth: 1, preconsolidation: 100 }, { depth: 3, preconsolidation: 60 }, { depth: 5, preconsolidation: 80 }], reason: 'follows the CPT profile' } } }
    expect(trendPreconsolidation(s, 2, 40)).toBeCloseTo(80, 12)
    expect(trendPreconsolidation(s, 4, 40)).toBeCloseTo(70, 12)
    const layers = toSettlementLayers(def([fill, s]), () => 40)
    expect(layers.slice(1).map(l => [l.thickness, l.preconsolidation])).toEqual([[2, { type: 'linear', top: expect.closeTo(100, 6), bottom: expect.closeTo(60, 6) }], [2, { type: 'linear', top: expect.closeTo(60, 6), bottom: expect.closeTo(80, 6) }]])
  })

  it('refuses a compressible stratum without compressibility or trend', () => {
    const d = def([fill, { code: 'X', name: 'Clay', thickness: 2, unitWeight: 17, unitWeightSaturated: 17, compressible: true, cptFactor: 0.33 }])
    expect(() => toSettlementLayers(d, () => 10)).toThrow(ModelIncompleteError)
  })

  it('the sublayer table matches the settlement engine at every mid-depth (σ\'v0 and σ\'p)', () => {
    const d = def([fill, { code: 'A', name: 'Soft clay', thickness: 6, unitWeight: 16, unitWeightSaturated: 16, compressible: true, compressibility: comp, trend: trend('pop', { pop: 25 }), cptFactor: 0.33 }])
    const { rows, layers } = sublayerTable(d, 0.5)
    const s = computeSettlement({ ...toStressInput(d), layers, load: { type: 'uniform', pressure: 80 }, sublayers: { maxThickness: 0.5 } })
    expect(rows).toHaveLength(12)
    expect(s.sublayers).toHaveLength(12)
    rows.forEach((r, i) => {
      expect(r.depth).toBeCloseTo(s.sublayers[i]!.depth, 12)
      expect(r.effectiveStress).toBeCloseTo(s.sublayers[i]!.effectiveStress, 12)
      expect(r.preconsolidation).toBeCloseTo(s.sublayers[i]!.preconsolidation, 12)
      expect(r.pop).toBeCloseTo(25, 12)
    })
  })
})
