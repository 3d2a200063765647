import { describe, expect, it } from 'vitest'
import { diffDefinitions } from '../../../shared/site-model/diff'

describe('diffDefinitions: what changed between two definitions', () => {
  it('names each changed leaf by its dotted path, keys in order', () => {
    const a = { surcharge: 0, groundwater: { waterTableDepth: 1.5, piezometers: [] }, gammaW: 9.81 }
    const b = { surcharge: 10, groundwater: { waterTableDepth: 2.0, piezometers: [] }, gammaW: 9.81 }
    expect(diffDefinitions(a, b)).toEqual([
      { path: 'groundwater.waterTableDepth', a: 1.5, b: 2.0 },
      { path: 'surcharge', a: 0, b: 10 },
    ])
  })

  it('compares lists item by item, an item missing on one side as null', () => {
    const a = { strata: [{ code: 'FILL', thickness: 1.2 }, { code: 'CLAY', thickness: 6 }] }
    const b = { strata: [{ code: 'FILL', thickness: 1.4 }] }
    expect(diffDefinitions(a, b)).toEqual([
      { path: 'strata[0].thickness', a: 1.2, b: 1.4 },
      { path: 'strata[1]', a: { code: 'CLAY', thickness: 6 }, b: null },
    ])
  })

  it('summarises point id lists as counts added and removed', () => {
    expect(diffDefinitions({ excludedPointIds: ['p1', 'p2', 'p3'] }, { excludedPointIds: ['p2', 'p3', 'p4', 'p5'] }))
      .toEqual([{ path: 'excludedPointIds', a: '3 points', b: '4 points (+2 −1)' }])
    expect(diffDefinitions({ excludedPointIds: ['p1', 'p2'] }, { excludedPointIds: ['p2', 'p1'] })).toEqual([])
  })

  it('reports a list on one side and a record on the other as one change of the whole value', () => {
    // An empty list against an empty record is a change, not "nothing changed".
    expect(diffDefinitions({ trend: [] }, { trend: {} })).toEqual([{ path: 'trend', a: [], b: {} }])
    expect(diffDefinitions({ trend: [2, 3] }, { trend: { 0: 2, 1: 3 } })).toEqual([{ path: 'trend', a: [2, 3], b: { 0: 2, 1: 3 } }])
    expect(diffDefinitions({ trend: { slope: 2 } }, { trend: [2] })).toEqual([{ path: 'trend', a: { slope: 2 }, b: [2] }])
  })

  it('finds nothing between equal values, and a value against a missing one as null', () => {
    expect(diffDefinitions({ a: [1, { b: 2 }] }, { a: [1, { b: 2 }] })).toEqual([])
    expect(diffDefinitions({ cv: 2 }, {})).toEqual([{ path: 'cv', a: 2, b: null }])
  })
})
