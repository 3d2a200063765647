import { describe, expect, it } from 'vitest'
import { checkMapping, suggestMapping, validateRows, type ImportContext } from '../../../shared/imports/targets'

const ctx = (): ImportContext => ({ points: new Map([['BH-01', { finalDepth: 20 }]]), samples: new Set(['BH-01/U1']), strata: new Set(['EST']) })

describe('import mapping', () => {
  it('suggests a mapping from header spellings, ignoring case and punctuation', () => {
    expect(suggestMapping('cpt', ['Depth (m)', 'QC (kPa)', 'fs (kPa)', 'U2 (kPa)'])).toEqual({ depth: 'Depth (m)', qc: 'QC (kPa)', fs: 'fs (kPa)', u2: 'U2 (kPa)' })
    expect(suggestMapping('intervals', ['Hole', 'From', 'To', 'Field description'])).toEqual({ point: 'Hole', top: 'From', bottom: 'To', description: 'Field description' })
  })

  it('names each required field left unmapped and each mapped column missing from the file', () => {
    expect(checkMapping('intervals', ['point', 'top'], { point: 'point', top: 'top', description: 'desc' })).toEqual([
      'Bottom (m) is required: choose the column that holds it.',
      'Column "desc" (for Description) is not in the file.',
    ])
  })
})

describe('validateRows', () => {
  const headers = ['point', 'top', 'bottom', 'uscs']
  const mapping = { point: 'point', top: 'top', bottom: 'bottom', uscs: 'uscs' }

  it('parses numbers with a decimal comma or spaces, and upper-cases USCS symbols', () => {
    const r = validateRows('intervals', headers, [['BH-01', '0', '1,5', 'gw'], ['BH-01', ' 1.5 ', '3', 'ch']], mapping, ctx())
    expect(r.errors).toEqual([])
    expect(r.records).toEqual([
      { point: 'BH-01', top: 0, bottom: 1.5, uscs: 'GW', description: null, stratum: null, moisture: null, consistency: null },
      { point: 'BH-01', top: 1.5, bottom: 3, uscs: 'CH', description: null, stratum: null, moisture: null, consistency: null },
    ])
  })

  it('uses the file\'s own row numbers when blank lines were skipped', () => {
    const r = validateRows('intervals', headers, [['BH-01', '0', '2', ''], ['BH-01', '1', '3', '']], mapping, ctx(), [2, 5])
    expect(r.errors).toEqual([{ row: 5, column: 'top', message: 'BH-01: Overlaps the interval 0–2 m (file row 2).' }])
  })

  it('flags an empty required cell, an unknown point and a stratum that is not defined', () => {
    const r = validateRows('intervals', [...headers, 'stratum'], [['', '0', '1', '', ''], ['BH-07', '0', '1', '', 'XYZ']], { ...mapping, stratum: 'stratum' }, ctx())
    expect(r.errors.map(e => [e.row, e.column, e.message])).toEqual([
      [2, 'point', 'Point is empty.'],
      [3, 'point', 'Point BH-07 is not in this project.'],
      [3, 'stratum', 'Stratum XYZ is not defined in this project.'],
    ])
  })

  it('requires CPT depths to increase and stay within the hole', () => {
    const r = validateRows('cpt', ['z', 'qc', 'fs', 'u2'], [['1', '1', '1', '1'], ['1', '1', '1', '1'], ['25', '1', '1', '1']], { depth: 'z', qc: 'qc', fs: 'fs', u2: 'u2' }, { ...ctx(), cptFinalDepth: 22 })
    expect(r.errors.map(e => e.row)).toEqual([3, 4])
  })

  it('refuses a plastic limit above the liquid limit and a sample that is not logged', () => {
    const r = validateRows('index-tests', ['point', 'sample', 'LL', 'PL'], [['BH-01', 'U1', '40', '55'], ['BH-01', 'U9', '60', '25']], { point: 'point', sample: 'sample', liquidLimit: 'LL', plasticLimit: 'PL' }, ctx())
    expect(r.errors.map(e => [e.row, e.column])).toEqual([[2, 'PL'], [3, 'sample']])
  })
})
