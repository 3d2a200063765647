import { describe, expect, it } from 'vitest'
import { describeChanges } from '../../../shared/site-model/change-words'
import { trendParameterLabel } from '../../../shared/site-model/trend-words'
import { SiteModelDefinitionSchema, type SiteModelDefinition, type StratumTrend } from '../../../shared/site-model/definition'

const trend = (t: Partial<StratumTrend>): StratumTrend => ({ model: 'pop', logSpace: false, parameters: { pop: 26.7 }, n: 3, r2: 0.41, rmse: 4, aic: 10, aicc: 12, includedPointIds: ['a', 'b', 'c'], excludedPointIds: [], ...t })

function site(): SiteModelDefinition {
  return SiteModelDefinitionSchema.parse({
    schemaVersion: 2,
    groundwater: { waterTableDepth: 1.57, piezometers: [] },
    strata: [
      { code: 'MG', name: 'Made ground', thickness: 1.2, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
      { code: 'EST', name: 'Estuarine clay', thickness: 11.6, unitWeight: 16, unitWeightSaturated: 16, compressible: true, trend: trend({}), compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double', source: 'manual' } },
    ],
  })
}

/** The demo site, and a copy changed by `edit`. */
function edited(edit: (b: SiteModelDefinition) => void): [SiteModelDefinition, SiteModelDefinition] {
  const b = site()
  edit(b)
  return [site(), b]
}

describe('describeChanges: two definitions in words', () => {
  it('says nothing when nothing changed', () => {
    expect(describeChanges(site(), site())).toEqual([])
  })

  /** The water table, a unit weight and the trend's POP each moved a little. */
  const smallEdits = () => edited((b) => {
    b.groundwater.waterTableDepth = 1.6
    b.strata[1]!.unitWeight = 16.2
    b.strata[1]!.trend = trend({ parameters: { pop: 25.9 } })
  })

  it('reads as a reviewer would say it, in SI', () => {
    expect(describeChanges(...smallEdits())).toEqual([
      'water table 1.57 → 1.60 m',
      'EST unit weight 16.0 → 16.2 kN/m³',
      'EST trend: constant POP 26.7 → 25.9 kPa',
    ])
  })

  it('converts to the project\'s US units (1 m = 3.2808 ft; 1 kPa = 20.885 psf; 1 kN/m³ = 6.366 pcf, NIST SP 811)', () => {
    // 1.57 m = 5.15 ft, 1.60 m = 5.25 ft; 16.0 kN/m³ = 101.9 pcf, 16.2 = 103.1 pcf; 26.7 kPa = 558 psf, 25.9 kPa = 541 psf.
    expect(describeChanges(...smallEdits(), { units: 'US' })).toEqual([
      'water table 5.15 → 5.25 ft',
      'EST unit weight 101.9 → 103.1 pcf',
      'EST trend: constant POP 558 → 541 psf',
    ])
  })

  it('names a new model form, points taken out, compressibility and a kept problem trend', () => {
    const [a, b] = edited((b) => {
      b.strata[1]!.trend = trend({ model: 'linear', parameters: { intercept: 12, gradient: 3.1 }, includedPointIds: ['a', 'b'], r2: 0.41, acceptedDespite: { problems: ['below-effective-stress'], reason: 'Underconsolidated under recent fill.' } })
      b.strata[1]!.compressibility!.cc = 0.9
      b.strata[1]!.compressibility!.drainage = 'top'
    })
    expect(describeChanges(a, b)).toEqual([
      'EST Cc 0.850 → 0.900',
      'EST drains through top and base → top only',
      'EST trend: constant POP 26.7 kPa → σ\'p linear in depth (σ\'p at 0 m 12.0 kPa, gradient 3.10 kPa/m)',
      'EST trend fitted on 3 → 2 points (0 taken in, 1 left out)',
      'EST trend kept despite σ\'p below σ\'v0: “Underconsolidated under recent fill.”',
    ])
  })

  it('pairs strata by code: a band added on top is one change, not every band below', () => {
    const [a, b] = edited(b => b.strata.unshift({ ...b.strata[0]!, code: 'FILL', name: 'New fill', thickness: 2 }))
    expect(describeChanges(a, b)).toEqual(['strata MG, EST → FILL, MG, EST', 'FILL added: 2.00 m thick'])
    expect(describeChanges(b, a)).toEqual(['strata FILL, MG, EST → MG, EST', 'FILL removed (was 2.00 m thick)'])
  })

  it('says when a trend is fitted, removed or drawn by hand', () => {
    const [a, b] = edited((b) => {
      delete b.strata[1]!.trend
    })
    expect(describeChanges(a, b)).toEqual(['EST trend removed (was constant POP 26.7 kPa)'])
    expect(describeChanges(b, a)).toEqual(['EST trend: constant POP 26.7 kPa, new'])
    const c = site()
    c.strata[1]!.trend = trend({ model: 'linear', parameters: {}, r2: null, manual: { knots: [{ depth: 2, preconsolidation: 40 }, { depth: 12, preconsolidation: 90 }], reason: 'Through the lab values.' } })
    expect(describeChanges(a, c)).toEqual(['EST trend: constant POP 26.7 kPa → drawn by hand (2 knots)'])
  })
})

// On a US project the trend's words follow the units, its depth label included
// (26.7 kPa = 557.6 psf, 12 kPa = 250.6 psf, 3.10 kPa/m = 19.73 psf/ft; 1 psf = 0.047880 kPa, 1 ft = 0.3048 m, NIST SP 811, 2008, App. B.8).
describe('trend words in US units', () => {
  it('labels the linear trend\'s intercept at 0 ft, in psf or tsf as the project chose', () => {
    expect(trendParameterLabel('intercept', 'ft')).toBe('σ\'p at 0 ft')
    expect(trendParameterLabel('intercept')).toBe('σ\'p at 0 m')
    expect(trendParameterLabel('pop', 'ft')).toBe('POP')
    const a = site()
    const b = site()
    b.strata[1]!.trend = trend({ model: 'linear', parameters: { intercept: 12, gradient: 3.1 } })
    const line = describeChanges(a, b, { units: 'US' }).find(l => l.startsWith('EST trend:'))
    expect(line).toBe('EST trend: constant POP 558 psf → σ\'p linear in depth (σ\'p at 0 ft 251 psf, gradient 19.73 psf/ft)')
    const tsf = describeChanges(a, b, { units: 'US', convert: { usStress: 'tsf' } }).find(l => l.startsWith('EST trend:'))
    expect(tsf).toBe('EST trend: constant POP 0.28 tsf → σ\'p linear in depth (σ\'p at 0 ft 0.13 tsf, gradient 0.01 tsf/ft)')
  })
})

