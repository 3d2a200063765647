import { describe, expect, it } from 'vitest'
import { checkMapping, checkUnits, fieldName, suggestMapping, suggestUnits, TARGET_FIELDS, unitSources, validateRows, type ImportContext } from '../../../shared/imports/targets'

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

// Numeric columns in the file's own units: 1 ft = 0.3048 m, 1 psf = 0.047880 kPa, 1 tsf = 2000 psf, 1 pcf = 0.157087 kN/m³
// (NIST SP 811, 2008, App. B.8).
describe('units of the numeric columns', () => {
  it('offers the unit a header names in brackets, else the project\'s units', () => {
    const mapping = suggestMapping('groundwater', ['Hole', 'Kind', 'Date', 'Depth (ft)', 'u (kPa)'])
    expect(mapping).toMatchObject({ point: 'Hole', depth: 'Depth (ft)' })
    expect(suggestUnits('groundwater', { ...mapping, pressure: 'u (kPa)' }, 'US', 'tsf')).toEqual({ depth: 'ft', pressure: 'kPa' })
    expect(suggestUnits('groundwater', { depth: 'Depth', pressure: 'u' }, 'US', 'tsf')).toEqual({ depth: 'ft', pressure: 'tsf' })
    expect(suggestUnits('index-tests', {}, 'US')).toEqual({ bulkUnitWeight: 'pcf' })
    expect(suggestUnits('points', {}, 'SI')).toEqual({ easting: 'm', northing: 'm', groundElevation: 'm', finalDepth: 'm' })
    expect(fieldName(TARGET_FIELDS.points.find(f => f.key === 'finalDepth')!)).toBe('Final depth')
  })

  it('reads a US cone file without units in its headings as tsf (qc, fs) and psi (u2), and says where each unit came from', () => {
    const mapping = { depth: 'Depth (ft)', qc: 'qc', fs: 'fs (MPa)', u2: 'u2' }
    // A US project that shows psf still reads cone data as US sounding logs give it (common practice).
    const units = suggestUnits('cpt', mapping, 'US', 'psf')
    expect(units).toEqual({ depth: 'ft', qc: 'tsf', fs: 'MPa', u2: 'psi' })
    expect(suggestUnits('cpt', { depth: 'Depth', qc: 'qc', fs: 'fs', u2: 'u2' }, 'SI')).toEqual({ depth: 'm', qc: 'kPa', fs: 'kPa', u2: 'kPa' })
    expect(unitSources('cpt', mapping, units, 'US', 'psf')).toEqual({ depth: 'heading', qc: 'default', fs: 'heading', u2: 'default' })
    expect(unitSources('cpt', mapping, { ...units, qc: 'MPa', u2: 'kPa' }, 'US', 'psf', { u2: 'kPa' })).toMatchObject({ qc: 'chosen', u2: 'saved' })
    // Each can be chosen per column: psi is read at 144 psf (1 psi = 6.894757 kPa, NIST SP 811, 2008, App. B.8).
    expect(checkUnits('cpt', { qc: 'MPa', fs: 'psf', u2: 'psi' }, mapping)).toEqual([])
    const r = validateRows('cpt', ['Depth (ft)', 'qc', 'fs (MPa)', 'u2'], [['1', '10', '0.05', '20']], mapping, { ...ctx(), cptFinalDepth: 30 }, undefined, units)
    expect(r.errors).toEqual([])
    expect(r.records[0]!.qc).toBeCloseTo(957.6052, 3)
    expect(r.records[0]!.fs).toBeCloseTo(50, 9)
    expect(r.records[0]!.u2).toBeCloseTo(137.8951, 3)
  })

  it('reads a column in ft, psf or pcf to SI before checking it against the hole', () => {
    const headers = ['point', 'kind', 'when', 'depth', 'u']
    const mapping = { point: 'point', kind: 'kind', observedAt: 'when', depth: 'depth', pressure: 'u' }
    const ok = validateRows('groundwater', headers, [['BH-01', 'standing', '2026-11-02T09:00:00Z', '10', '1000']], mapping, ctx(), undefined, { depth: 'ft', pressure: 'psf' })
    expect(ok.errors).toEqual([])
    expect(ok.records[0]!.depth).toBe(3.048)
    expect(ok.records[0]!.pressure).toBeCloseTo(47.88026, 5)
    // 70 ft = 21.336 m is below BH-01's 20 m: the check sees metres.
    const deep = validateRows('groundwater', headers, [['BH-01', 'standing', '2026-11-02T09:00:00Z', '70', '']], mapping, ctx(), undefined, { depth: 'ft' })
    expect(deep.errors.map(e => e.column)).toEqual(['depth'])
    const gamma = validateRows('index-tests', ['point', 'sample', 'g'], [['BH-01', 'U1', '120']], { point: 'point', sample: 'sample', bulkUnitWeight: 'g' }, ctx(), undefined, { bulkUnitWeight: 'pcf' })
    expect(gamma.records[0]!.bulkUnitWeight).toBeCloseTo(18.850, 3)
  })

  it('names the column of a unit it does not read for that field', () => {
    expect(checkUnits('points', { finalDepth: 'ft', easting: 'm' })).toEqual([])
    expect(checkUnits('points', { finalDepth: 'furlongs' }, { finalDepth: 'FDEP' })).toEqual(['Final depth (column “FDEP”) cannot be in "furlongs": choose one of m, ft.'])
    expect(checkUnits('vane', { peak: 'ft' })).toEqual(['Peak su cannot be in "ft": choose one of kPa, MPa, psf, tsf, psi.'])
    expect(checkUnits('points', { kind: 'm' })).toEqual(['Kind has no unit to choose.'])
  })
})

