import { describe, expect, it } from 'vitest'
import { checkAgs } from '../../../shared/ags4/check'
import {
  dictionaryFromAgs,
  keyHeadings,
  PASTLOAD_GROUPS,
  renderStandardGroups,
  standardDictionary,
  withFileDefinitions,
} from '../../../shared/ags4/dictionary'
import { parseAgs } from '../../../shared/ags4/parse'
import { hasReference, lazy, noteIfMissing, readReference } from './reference'

noteIfMissing('the dictionary tests against Standard_dictionary_v4_1.ags and DICT.ags')

// Source of every expectation below: Standard_dictionary_v4_1.ags (the AGS4 v4.1 standard dictionary, an AGS4 file whose DICT group lists each group and heading).
const standardFile = lazy(() => parseAgs(readReference('Standard_dictionary_v4_1.ags')))
const standard = lazy(() => dictionaryFromAgs(standardFile(), { edition: '4.1' }))

describe.skipIf(!hasReference)('standard dictionary v4.1 (Standard_dictionary_v4_1.ags)', () => {

  it('reads the file without structural errors', () => {
    const file = standardFile()
    expect(file.errors.filter(issue => issue.severity === 'error' && issue.rule !== '1')).toEqual([])
    expect(file.groups.map(group => group.name)).toEqual(['DICT', 'ABBR', 'TYPE', 'UNIT'])
  })

  it('LOCA has LOCA_ID as its only key field and PROJ as parent', () => {
    const loca = standard().groups.get('LOCA')
    expect(loca && keyHeadings(loca)).toEqual(['LOCA_ID'])
    expect(loca?.parent).toBe('PROJ')
    expect(loca?.headings.get('LOCA_NATE')).toMatchObject({ status: 'OTHER', key: false, type: '2DP', unit: 'm' })
  })

  it('SAMP keys are LOCA_ID, SAMP_TOP, SAMP_REF, SAMP_TYPE, SAMP_ID under LOCA', () => {
    const samp = standard().groups.get('SAMP')
    expect(samp && keyHeadings(samp)).toEqual(['LOCA_ID', 'SAMP_TOP', 'SAMP_REF', 'SAMP_TYPE', 'SAMP_ID'])
    expect(samp?.parent).toBe('LOCA')
    expect(samp?.headings.get('SAMP_TOP')).toMatchObject({ type: '2DP', unit: 'm' })
  })

  it('reads KEY+REQUIRED as both flags and REQUIRED alone as required only', () => {
    const tran = standard().groups.get('TRAN')
    expect(tran?.headings.get('TRAN_ISNO')).toMatchObject({ status: 'KEY+REQUIRED', key: true, required: true })
    expect(tran?.headings.get('TRAN_DATE')).toMatchObject({ status: 'REQUIRED', key: false, required: true, type: 'DT', unit: 'yyyy-mm-dd' })
    expect(standard().groups.get('MOND')?.headings.get('MOND_UNIT')).toMatchObject({ required: true, type: 'PU' })
  })

  it('has the oedometer, cone and monitoring headings Pastload maps, with their units', () => {
    expect(standard().groups.get('CONS')?.headings.get('CONS_INCF')).toMatchObject({ type: '0DP', unit: 'kPa' })
    expect(standard().groups.get('CONS')?.headings.get('CONS_INCE')).toMatchObject({ type: '3DP', unit: '' })
    expect(standard().groups.get('CONG')?.headings.get('CONG_IVR')).toMatchObject({ type: '3DP' })
    expect(standard().groups.get('SCPT')?.headings.get('SCPT_RES')).toMatchObject({ unit: 'MPa' })
    expect(standard().groups.get('SCPG')?.headings.get('SCPG_CAR')).toMatchObject({ type: '3DP' })
    expect(standard().groups.get('MOND')?.parent).toBe('MONG')
    expect(standard().groups.get('CONS')?.parent).toBe('CONG')
  })

  it('standard-groups.ts is what the generator writes from this dictionary', async () => {
    const source = renderStandardGroups(standard(), PASTLOAD_GROUPS, 'Standard_dictionary_v4_1.ags')
    await expect(source).toMatchFileSnapshot('../../../shared/ags4/standard-groups.ts')
  })

  it('the built-in subset agrees with the full dictionary on every group it holds', () => {
    const subset = standardDictionary()
    expect(subset.coverage).toBe('subset')
    expect(subset.edition).toBe('4.1')
    expect([...subset.groups.keys()]).toEqual([...PASTLOAD_GROUPS])
    for (const [name, group] of subset.groups) {
      const full = standard().groups.get(name)
      expect(full?.parent).toBe(group.parent)
      expect([...group.headings.values()].map(h => [h.name, h.status, h.type, h.unit])).toEqual([...(full?.headings.values() ?? [])].map(h => [h.name, h.status, h.type, h.unit]))
    }
  })
})

// Source: DICT.ags of the reference files (README: "a file with user-defined dictionary entries").
describe.skipIf(!hasReference)('user-defined dictionary entries (DICT.ags)', () => {
  const extended = lazy(() => withFileDefinitions(standard(), parseAgs(readReference('DICT.ags'))))

  it('adds GRAG_REM to GRAT as a file-defined heading, after the standard ones', () => {
    const grat = extended().dictionary.groups.get('GRAT')
    const heading = grat?.headings.get('GRAG_REM')
    expect(heading).toMatchObject({ source: 'file', type: 'X', status: '' })
    expect([...(grat?.headings.keys() ?? [])].at(-1)).toBe('GRAG_REM')
    expect(standard().groups.get('GRAT')?.headings.has('GRAG_REM')).toBe(false)
  })

  it('keeps the standard definitions when the file redefines them, and says so', () => {
    const { dictionary, issues } = extended()
    expect(dictionary.groups.get('LOCA')?.headings.get('LOCA_ID')?.source).toBe('standard')
    expect(issues.some(issue => issue.rule === '9' && issue.severity === 'warning' && issue.message.includes('LOCA'))).toBe(true)
  })
})

describe('user-defined dictionary entries in a data file', () => {
  // A small file written for this test: a user group and a user heading on LOCA, as rule 18 asks.
  const lines = [
    '"GROUP","DICT"',
    '"HEADING","DICT_TYPE","DICT_GRP","DICT_HDNG","DICT_STAT","DICT_DTYP","DICT_DESC","DICT_UNIT","DICT_PGRP"',
    '"UNIT","","","","","","","",""',
    '"TYPE","PA","X","X","PA","PT","X","PU","X"',
    '"DATA","GROUP","QQRD","","","","Demo readings","","LOCA"',
    '"DATA","HEADING","QQRD","LOCA_ID","KEY","ID","Location","",""',
    '"DATA","HEADING","QQRD","QQRD_DPTH","KEY","2DP","Depth","m",""',
    '"DATA","HEADING","LOCA","LOCA_CHKD","OTHER","X","Checked by","",""',
  ]
  const file = parseAgs(lines.join('\r\n') + '\r\n')
  const { dictionary } = withFileDefinitions(standardDictionary(), file)

  it('defines the user group with its keys and parent', () => {
    const group = dictionary.groups.get('QQRD')
    expect(group && keyHeadings(group)).toEqual(['LOCA_ID', 'QQRD_DPTH'])
    expect(group).toMatchObject({ parent: 'LOCA', source: 'file', description: 'Demo readings' })
  })

  it('appends the user heading to the standard group without touching the base dictionary', () => {
    expect(dictionary.groups.get('LOCA')?.headings.get('LOCA_CHKD')).toMatchObject({ source: 'file', type: 'X' })
    expect(standardDictionary().groups.get('LOCA')?.headings.has('LOCA_CHKD')).toBe(false)
  })

  it('a user heading on a group outside the built-in subset does not make its standard headings rule 9 errors', () => {
    const text = [
      ...lines,
      '"DATA","HEADING","HDPH","HDPH_QQQ","OTHER","X","Demo note","",""',
      '',
      '"GROUP","HDPH"', '"HEADING","LOCA_ID","HDPH_TOP","HDPH_QQQ"', '"UNIT","","m",""', '"TYPE","ID","2DP","X"', '"DATA","BH-01","0.00","x"',
    ].join('\r\n') + '\r\n'
    const issues = checkAgs(parseAgs(text), standardDictionary()).filter(issue => issue.group === 'HDPH' || issue.message.includes('HDPH'))
    expect(issues).toEqual([expect.objectContaining({ rule: '9', severity: 'warning', group: 'HDPH' })])
  })

  it('a group outside the built-in subset is a warning, not a rule 9 error', () => {
    const issues = checkAgs(parseAgs('"GROUP","HDPH"\r\n"HEADING","LOCA_ID"\r\n"UNIT",""\r\n"TYPE","ID"\r\n"DATA","BH-01"\r\n'), standardDictionary())
    expect(issues.filter(issue => issue.group === 'HDPH' && issue.rule === '9')).toEqual([expect.objectContaining({ severity: 'warning' })])
  })
})
