import { describe, expect, it } from 'vitest'
import { cptDerivationDefault, cptDerivationOn, isFineGrainedUscs } from '../../../shared/strata/cpt-derivation'

describe('fine-grained USCS symbols (ASTM D2487 major divisions: C, M, O and PT)', () => {
  it.each(['CL', 'CH', 'ML', 'MH', 'OL', 'OH', 'PT', 'CL-ML', ' ch '])('%s is fine-grained', (s) => {
    expect(isFineGrainedUscs(s)).toBe(true)
  })

  it.each(['GW', 'GP', 'GM', 'GC', 'SW', 'SP', 'SM', 'SC', 'SC-SM', 'GC-GM', 'SP-SM', 'SW-SC', 'GW-GM', '', 'XX', 'fill'])('%s is not', (s) => {
    expect(isFineGrainedUscs(s)).toBe(false)
  })
})

describe('the default of "derive σ\'p from CPT and vane" per stratum', () => {
  it('is on for a clay stratum (the demo crust: CL and CH)', () => {
    const d = cptDerivationDefault([{ uscs: 'CL', thickness: 1.2 }, { uscs: 'CH', thickness: 0.9 }, { uscs: 'CL', thickness: 0.4 }])
    expect(d).toEqual({ on: true, reason: 'fine-grained', loggedThickness: 2.5, fineThickness: 2.5, symbols: ['CL', 'CH'] })
  })

  it('is off for fill logged as gravel over sand, and for sand', () => {
    expect(cptDerivationDefault([{ uscs: 'GW', thickness: 0.4 }, { uscs: 'SW', thickness: 0.8 }])).toMatchObject({ on: false, reason: 'coarse-grained', symbols: ['SW', 'GW'] })
    expect(cptDerivationDefault([{ uscs: 'SP', thickness: 3 }, { uscs: 'SM', thickness: 5 }]).on).toBe(false)
  })

  it('goes by logged thickness: half or more fine-grained is on, less is off', () => {
    expect(cptDerivationDefault([{ uscs: 'CH', thickness: 2 }, { uscs: 'SP', thickness: 2 }]).on).toBe(true)
    expect(cptDerivationDefault([{ uscs: 'CH', thickness: 1.9 }, { uscs: 'SP', thickness: 2 }]).on).toBe(false)
    // Many thin clay partings do not outweigh one thick sand bed.
    expect(cptDerivationDefault([...Array.from({ length: 5 }, () => ({ uscs: 'CL', thickness: 0.1 })), { uscs: 'SM', thickness: 4 }]).on).toBe(false)
  })

  it('ignores intervals without a valid symbol; none at all leaves it on for the engineer to decide', () => {
    expect(cptDerivationDefault([{ uscs: null, thickness: 3 }, { uscs: 'SP', thickness: 1 }])).toMatchObject({ on: false, loggedThickness: 1 })
    expect(cptDerivationDefault([])).toEqual({ on: true, reason: 'no-symbols', loggedThickness: 0, fineThickness: 0, symbols: [] })
    expect(cptDerivationDefault([{ uscs: 'ZZ', thickness: 2 }, { uscs: 'CL', thickness: Number.NaN }, { uscs: 'CL', thickness: 0 }]).reason).toBe('no-symbols')
  })

  it('a stored override wins; null follows the default', () => {
    const sand = cptDerivationDefault([{ uscs: 'SP', thickness: 2 }])
    expect(cptDerivationOn(null, sand)).toBe(false)
    expect(cptDerivationOn(true, sand)).toBe(true)
    const clay = cptDerivationDefault([{ uscs: 'CH', thickness: 2 }])
    expect(cptDerivationOn(false, clay)).toBe(false)
    expect(cptDerivationOn(null, clay)).toBe(true)
  })
})
