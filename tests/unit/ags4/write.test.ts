import { describe, expect, it } from 'vitest'
import { checkValue, formatNumber } from '../../../shared/ags4/datatypes'
import { dictionaryFromAgs } from '../../../shared/ags4/dictionary'
import { checkAgs } from '../../../shared/ags4/check'
import { parseAgs } from '../../../shared/ags4/parse'
import { collectUsedDefinitions, quoteField, writableGroup, writeAgs } from '../../../shared/ags4/write'
import { hasReference, noteIfMissing, readReference } from './reference'

noteIfMissing('writing back the reference files')

// Source of the type codes: the TYPE group of Standard_dictionary_v4_1.ags (nDP decimal places, nSF significant
// figures, nSCI scientific notation, U variable format, MC BS 1377 moisture content, DT date time, T elapsed time,
// DMS degrees:minutes:seconds, YN Y or N). Rule 8 asks each value to follow its TYPE.
describe('checkValue (rule 8)', () => {
  it.each([
    ['2DP', '', '12.30', true], ['2DP', '', '12.3', false], ['2DP', '', '-0.05', true], ['0DP', '', '15', true], ['0DP', '', '15.0', false],
    ['2SF', '', '45', true], ['2SF', '', '20', true], ['2SF', '', '150', true], ['2SF', '', '155', false], ['2SF', '', '55.1', false],
    ['2SF', '', '0.050', true], ['2SF', '', '5', false], ['1SF', '', '0.0', true], ['3SF', '', '1.20', true],
    ['2SCI', '', '1.23E-4', true], ['2SCI', '', '1.2E-4', false], ['0SCI', '', '5e3', true],
    ['U', '', '-1.5e3', true], ['U', '', 'abc', false],
    ['DT', 'yyyy-mm-dd', '2024-02-29', true], ['DT', 'yyyy-mm-dd', '2023-02-29', false], ['DT', 'yyyy-mm-dd', '2024-13-01', false],
    ['DT', 'yyyy-mm-ddThh:mm', '2024-05-02T09:30', true], ['DT', 'yyyy-mm-ddThh:mm', '2024-05-02 09:30', false],
    ['DT', 'yyyy-mm-ddThh:mm:ss.sss', '2024-05-02T09:30:15.250', true], ['DT', 'dd/mm/yyyy', '02/05/2024', true],
    ['DT', 'yyyy-mm-ddThh:mm:ssZ', '2024-05-02T09:30:15Z', true], ['DT', 'yyyy-mm-ddThh:mm:ssZ', '2024-05-02T09:70:15Z', false],
    ['DT', '', '2024-05-02T09:30', true], ['DT', 'm', '2024-05-02', false],
    ['T', 'hh:mm:ss', '26:05:00', true], ['T', 'hh:mm:ss', '01:75:00', false],
    ['DMS', '', '51:30:15.5', true], ['DMS', '', '51.5', false],
    ['YN', '', 'Y', true], ['YN', '', 'maybe', false],
    ['X', '', 'anything "at all"', true], ['PA', '', 'CP+RC', true],
    ['2DP', '', '', true],
  ])('%s (unit %j): %j conforms: %s', (type, unit, value, conforms) => {
    expect(checkValue(type, unit, value) === null).toBe(conforms)
  })

  it('MC off its BS 1377 precision is a warning only (memory: two figures, three from 100 %)', () => {
    expect(checkValue('MC', '%', '38')).toBeNull()
    expect(checkValue('MC', '%', '38.25')?.severity).toBe('warning')
    expect(checkValue('MC', '%', 'wet')?.severity).toBe('error')
  })
})

describe('formatNumber (to the declared TYPE)', () => {
  it.each([
    ['2DP', 3.14159, '3.14'], ['2DP', 2, '2.00'], ['0DP', 17.5, '18'], ['2DP', -0.001, '0.00'], ['3DP', 0.0005, '0.001'],
    ['2SF', 155.1, '160'], ['2SF', 9.96, '10'], ['2SF', 0.04567, '0.046'], ['3SF', 1234, '1230'], ['1SF', 0, '0'],
    ['2SCI', 0.000123, '1.23E-4'], ['MC', 38.25, '38'], ['MC', 104.4, '104'], ['X', 0.1, '0.1'], ['XN', 12.345, '12.345'],
  ])('%s of %d is %j', (type, value, text) => {
    expect(formatNumber(type, value)).toBe(text)
  })

  it('every formatted number passes the check of its own type', () => {
    for (const type of ['0DP', '1DP', '2DP', '3DP', '4DP', '1SF', '2SF', '3SF', '1SCI', '2SCI', 'U']) {
      for (const value of [0, 0.0123, 1.5, -7.25, 99.95, 1234.5678]) {
        expect(checkValue(type, '', formatNumber(type, value)), `${type} ${value}`).toBeNull()
      }
    }
  })
})

describe('writeAgs', () => {
  const groups = [
    { name: 'LOCA', headings: ['LOCA_ID', 'LOCA_NATE', 'LOCA_REM'], units: ['', 'm', ''], types: ['ID', '2DP', 'X'], rows: [{ LOCA_ID: 'BH-01', LOCA_NATE: 412345.6, LOCA_REM: 'said "dry"' }, { LOCA_ID: 'CPT-01', LOCA_NATE: null, LOCA_REM: 'line\r\nbreak' }] },
    { name: 'GEOL', headings: ['LOCA_ID', 'GEOL_TOP'], units: ['', 'm'], types: ['ID', '2DP'], rows: [{ LOCA_ID: 'BH-01', GEOL_TOP: 0 }] },
  ]
  const text = writeAgs(groups)

  it('writes quoted fields, CR LF row ends and a blank line between groups (rules 2a, 5, 6)', () => {
    expect(text).toBe([
      '"GROUP","LOCA"',
      '"HEADING","LOCA_ID","LOCA_NATE","LOCA_REM"',
      '"UNIT","","m",""',
      '"TYPE","ID","2DP","X"',
      '"DATA","BH-01","412345.60","said ""dry"""',
      '"DATA","CPT-01","","line break"',
      '',
      '"GROUP","GEOL"',
      '"HEADING","LOCA_ID","GEOL_TOP"',
      '"UNIT","","m"',
      '"TYPE","ID","2DP"',
      '"DATA","BH-01","0.00"',
      '',
    ].join('\r\n'))
  })

  it('reads back as written', () => {
    const file = parseAgs(text)
    expect(file.errors).toEqual([])
    expect(file.groups[0]?.rows[0]?.values).toEqual({ LOCA_ID: 'BH-01', LOCA_NATE: '412345.60', LOCA_REM: 'said "dry"' })
  })

  it('refuses a group whose units or types do not match its headings (rule 4)', () => {
    expect(() => writeAgs([{ name: 'LOCA', headings: ['LOCA_ID'], units: [], types: ['ID'], rows: [] }])).toThrow(/1 headings, 0 units/)
  })

  it('quotes a field as rule 5 asks', () => {
    expect(quoteField('a "b"')).toBe('"a ""b"""')
  })

  it('lists the units, types and abbreviation parts a set of groups uses (rules 15, 16a, 17)', () => {
    const used = collectUsedDefinitions([{ name: 'LOCA', headings: ['LOCA_ID', 'LOCA_TYPE', 'LOCA_GL'], units: ['', '', 'm'], types: ['ID', 'PA', '2DP'], rows: [{ LOCA_ID: 'BH-01', LOCA_TYPE: 'CP+RC', LOCA_GL: 1 }] }])
    expect([...used.units]).toEqual(['m'])
    expect([...used.types]).toEqual(['ID', 'PA', '2DP'])
    expect([...(used.abbreviations.get('LOCA_TYPE') ?? [])]).toEqual(['CP', 'RC'])
  })
})

// Source: 4.1-rule20OK.ags and 4.1-rule19.ags of the reference files; their TRAN_REM says "No errors" or names one rule.
describe.skipIf(!hasReference)('writing a reference file back', () => {
  it('parse → write → parse gives the same groups, and a conformant file stays conformant', () => {
    const dictionary = dictionaryFromAgs(parseAgs(readReference('Standard_dictionary_v4_1.ags')), { edition: '4.1' })
    for (const name of ['rules/4.1-rule20OK.ags', 'rules/4.1-rule18-OK.ags', 'rules/4.1-rule11-3.ags']) {
      const original = parseAgs(readReference(name))
      const again = parseAgs(writeAgs(original.groups.map(writableGroup)))
      const strip = (groups: typeof original.groups) => groups.map(g => ({ name: g.name, headings: g.headings, units: g.units, types: g.types, rows: g.rows.map(r => r.values) }))
      expect(strip(again.groups), name).toEqual(strip(original.groups))
      expect(checkAgs(again, dictionary, { attachedFiles: ['FILE/327-16A/Report.pdf'] }).map(i => i.rule), name).toEqual(checkAgs(original, dictionary, { attachedFiles: ['FILE/327-16A/Report.pdf'] }).map(i => i.rule))
    }
  })
})

describe('ASCII output (AGS4 rule 1: files are ASCII)', () => {
  it('spells typographic marks and accented letters in ASCII', async () => {
    const { toAscii, quoteField } = await import('../../../shared/ags4/write')
    expect(toAscii('Cable percussion – 150 mm, café, 20 kN/m³, σ\'v0 ±2')).toBe('Cable percussion - 150 mm, cafe, 20 kN/m3, sigma\'v0 +/-2')
    expect(toAscii('plain text')).toBe('plain text')
    expect(quoteField('“quoted” – ok')).toBe('"""quoted"" - ok"')
  })
})
