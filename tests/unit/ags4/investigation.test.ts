import { readdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { checkAgs } from '../../../shared/ags4/check'
import { dictionaryFromAgs, standardDictionary } from '../../../shared/ags4/dictionary'
import { agsToInvestigation, investigationToAgs, investigationToAgsGroups } from '../../../shared/ags4/investigation'
import { parseAgs } from '../../../shared/ags4/parse'
import type { InvestigationRecord, PointRecord } from '../../../shared/investigation/types'
import { hasReference, noteIfMissing, readReference, REFERENCE_DIR } from './reference'

noteIfMissing('checking the exported file against the full v4.1 dictionary')

const emptyPoint = { intervals: [], samples: [], spt: [], groundwater: [], cpt: null, vane: [] } satisfies Partial<PointRecord>

/**
 * An invented investigation, not from any real project. Every number sits on
 * the precision of the TYPE Pastload writes for it (2DP depths, 0DP blows, 3DP
 * void ratios, 3DP MPa cone resistance …), so the round trip can be exact.
 */
function demoRecord(): InvestigationRecord {
  return {
    project: { jobNumber: 'TRN-0417', name: 'TRN-0417 Saltmarsh Lane', client: 'Demo Highways Authority' },
    strata: [
      { code: 'MG', name: 'Made ground', description: 'Gravelly clay fill', colour: 'brown', pattern: 'fill', unitWeight: 19, unitWeightSaturated: 20, displayOrder: 0 },
      { code: 'ALV', name: 'Alluvium', description: 'Soft grey organic clay', colour: 'grey', pattern: 'clay', unitWeight: 15.5, unitWeightSaturated: 15.8, displayOrder: 1 },
      { code: 'TER', name: 'Terrace gravel', description: 'Dense sandy gravel', colour: 'ochre', pattern: 'gravel', unitWeight: 19.5, unitWeightSaturated: 21, displayOrder: 2 },
    ],
    points: [
      {
        ...emptyPoint,
        identifier: 'BH-01',
        kind: 'borehole',
        easting: 412345.6,
        northing: 287654.3,
        groundElevation: 3.25,
        finalDepth: 15,
        startedOn: '2024-03-04',
        endedOn: '2024-03-05',
        method: 'Cable percussion (shell and auger)',
        loggedBy: 'A. Example',
        remarks: 'Demo hole, "north" verge',
        intervals: [
          { top: 0, bottom: 1.2, description: 'Firm brown sandy gravelly CLAY (made ground)', uscs: 'CL', stratumCode: 'MG', moisture: 'moist', consistency: 'firm' },
          { top: 1.2, bottom: 8.5, description: 'Very soft grey organic silty CLAY', uscs: 'OH', stratumCode: 'ALV', moisture: 'wet', consistency: 'very soft' },
          { top: 8.5, bottom: 15, description: 'Dense sandy GRAVEL', uscs: 'GW', stratumCode: 'TER', moisture: null, consistency: 'dense' },
        ],
        samples: [
          {
            identifier: 'U1', top: 2, bottom: 2.45, type: 'thin-walled-tube', recovery: 95, remarks: '',
            index: { waterContent: 68.5, liquidLimit: 72, plasticLimit: 31, bulkUnitWeight: 15.696 },
            oedometer: {
              testType: 'incremental', specimenHeight: 0.019, initialWaterContent: 66.2, specificGravity: 2.62, e0: 1.843,
              stages: [{ stress: 12.5, voidRatio: 1.835 }, { stress: 25, voidRatio: 1.82 }, { stress: 50, voidRatio: 1.79 }, { stress: 100, voidRatio: 1.71 }, { stress: 200, voidRatio: 1.58 }, { stress: 400, voidRatio: 1.43 }],
              remarks: 'Demo specimen',
            },
          },
          { identifier: 'D2', top: 3, bottom: 3.2, type: 'bulk', recovery: null, remarks: 'bag', index: { waterContent: 55, liquidLimit: null, plasticLimit: null, bulkUnitWeight: null }, oedometer: null },
          {
            identifier: 'P3', top: 5, bottom: 5.6, type: 'piston', recovery: 100, remarks: '', index: null,
            oedometer: { testType: 'crs', specimenHeight: 0.02, initialWaterContent: null, specificGravity: null, e0: 1.9, stages: [{ stress: 10, voidRatio: 1.89 }, { stress: 150, voidRatio: 1.62 }], remarks: '' },
          },
          { identifier: 'S4', top: 9, bottom: 9.45, type: 'spt-split-spoon', recovery: null, remarks: '', index: null, oedometer: null },
          { identifier: 'C5', top: 12, bottom: 13, type: 'core', recovery: 80, remarks: '', index: null, oedometer: null },
          { identifier: 'B6', top: 0.5, bottom: 1, type: 'block', recovery: null, remarks: '', index: null, oedometer: null },
        ].sort((a, b) => a.top - b.top) as PointRecord['samples'],
        spt: [
          // 75 mm increments: N = 2 + 3 + 3 + 4 = 12.
          { depth: 9, blows: [1, 2, 2, 3, 3, 4], penetrations: [75, 75, 75, 75, 75, 75], seating: 2, n: 12, penetration: null },
          // A refusal: 25 + 25 = 50 test blows for 75 + 60 = 135 mm.
          { depth: 12, blows: [12, 13, 25, 25], penetrations: [75, 75, 75, 60], seating: 2, n: 50, penetration: 135 },
          // Counts per 150 mm: N = 10 + 12 = 22.
          { depth: 13.5, blows: [6, 10, 12], penetrations: [150, 150, 150], seating: 1, n: 22, penetration: null },
        ],
        groundwater: [
          { kind: 'strike', observedAt: '2024-03-04T10:15:00Z', depth: 2.8, pressure: null, remarks: 'seepage' },
          { kind: 'standing', observedAt: '2024-03-05T08:00:00Z', depth: 1.95, pressure: null, remarks: 'next morning' },
          { kind: 'piezometer', observedAt: '2024-04-10T09:00:00Z', depth: null, pressure: 58.4, remarks: '' },
          { kind: 'piezometer', observedAt: '2024-05-10T09:00:00Z', depth: 1.7, pressure: 61.2, remarks: 'level and pressure' },
        ],
        vane: [{ depth: 4, peak: 18.5, remoulded: 6.2 }, { depth: 6, peak: 22, remoulded: null }],
      },
      {
        ...emptyPoint,
        identifier: 'CPT-01',
        kind: 'cpt',
        easting: 412360,
        northing: 287640.55,
        groundElevation: 3.3,
        finalDepth: 12.5,
        startedOn: '2024-03-06',
        endedOn: '2024-03-06',
        method: '',
        loggedBy: '',
        remarks: '',
        cpt: { areaRatio: 0.8, depth: [1, 1.02, 1.04, 1.06, 1.08], qc: [250, 310, 305, 298, 402], fs: [3.1, 4, 3.8, 4.2, 5.5], u2: [45.2, 52.1, 60, 61.4, 38.9] },
      },
      { ...emptyPoint, identifier: 'TP-01', kind: 'test-pit', easting: 412300, northing: 287700, groundElevation: 3.6, finalDepth: 2.4, startedOn: '2024-03-07', endedOn: null, method: 'Machine excavated', loggedBy: 'B. Example', remarks: '', intervals: [{ top: 0, bottom: 2.4, description: 'Topsoil over soft clay', uscs: null, stratumCode: null, moisture: null, consistency: null }] },
      { ...emptyPoint, identifier: 'PZ-01', kind: 'piezometer', easting: 412350, northing: 287650, groundElevation: 3.2, finalDepth: 10, startedOn: null, endedOn: null, method: '', loggedBy: '', remarks: 'tip in alluvium', groundwater: [{ kind: 'piezometer', observedAt: '2024-04-10T09:30:00Z', depth: 1.4, pressure: null, remarks: '' }] },
    ],
  }
}

const EXPORT = { producedOn: '2024-06-01', recipient: 'Demo Consulting' }

describe('round trip: investigationToAgs → parseAgs → checkAgs → agsToInvestigation', () => {
  const original = demoRecord()
  const text = investigationToAgs(original, EXPORT)
  const file = parseAgs(text)

  it('writes a file the reader and checker accept without a finding (built-in v4.1 groups)', () => {
    expect(file.errors).toEqual([])
    expect(checkAgs(file, standardDictionary())).toEqual([])
  })

  it('reads back exactly the record it wrote', () => {
    const back = agsToInvestigation(file)
    expect(back.issues).toEqual([])
    expect(back.unknownGroups).toEqual([])
    expect(back.undefinedStrata).toEqual([])
    expect(back.data).toEqual(original)
  })

  it('writes the groups Pastload maps, with the definitions they need', () => {
    expect(file.groups.map(g => g.name)).toEqual(['PROJ', 'TRAN', 'UNIT', 'TYPE', 'ABBR', 'DICT', 'PSTR', 'LOCA', 'GEOL', 'SAMP', 'LNMC', 'LLPL', 'LDEN', 'CONG', 'CONS', 'ISPT', 'WSTG', 'MONG', 'MOND', 'SCPG', 'SCPT', 'IVAN'])
    const abbr = file.groups.find(g => g.name === 'ABBR')?.rows.map(r => `${r.values.ABBR_HDNG}=${r.values.ABBR_CODE}`) ?? []
    expect(abbr).toEqual(expect.arrayContaining(['LOCA_TYPE=CP', 'LOCA_TYPE=SCP', 'LOCA_TYPE=TP', 'LOCA_TYPE=INST', 'SAMP_TYPE=UT', 'GEOL_GEOL=ALV', 'GEOL_GEO2=OH', 'MOND_TYPE=PRES', 'DICT_TYPE=GROUP']))
    expect(text.endsWith('\r\n')).toBe(true)
    expect(text.includes('\n') && !/[^\r]\n/.test(text)).toBe(true)
  })

  it('writes numbers in the declared TYPE and SI values in the dictionary units (MPa for SCPT, mm for CONG_HIGT)', () => {
    const scpt = file.groups.find(g => g.name === 'SCPT')
    expect(scpt?.units.slice(3)).toEqual(['MPa', 'MPa', 'MPa'])
    expect(scpt?.rows[0]?.values).toMatchObject({ SCPT_DPTH: '1.00', SCPT_RES: '0.250', SCPT_FRES: '0.0031', SCPT_PWP2: '0.0452' })
    expect(file.groups.find(g => g.name === 'CONG')?.rows[0]?.values).toMatchObject({ CONG_HIGT: '19.00', CONG_IVR: '1.843', CONG_PDEN: '2.62', CONG_TYPE: 'OEDOMETER' })
    expect(file.groups.find(g => g.name === 'LDEN')?.rows[0]?.values.LDEN_BDEN).toBe('1.600')
    expect(file.groups.find(g => g.name === 'LOCA')?.rows[0]?.values).toMatchObject({ LOCA_NATE: '412345.60', LOCA_TYPE: 'CP' })
  })

  it.runIf(hasReference)('writes SPT to ISPT\'s standard headings only, with the units and types of the v4.1 dictionary (reference file)', () => {
    const ispt = file.groups.find(g => g.name === 'ISPT')!
    const standard = dictionaryFromAgs(parseAgs(readReference('Standard_dictionary_v4_1.ags')), { edition: '4.1' }).groups.get('ISPT')!
    expect(ispt.headings).toEqual([
      'LOCA_ID', 'ISPT_TOP', 'ISPT_SEAT', 'ISPT_MAIN', 'ISPT_NPEN', 'ISPT_NVAL', 'ISPT_REP',
      'ISPT_INC1', 'ISPT_INC2', 'ISPT_INC3', 'ISPT_INC4', 'ISPT_INC5', 'ISPT_INC6',
      'ISPT_PEN1', 'ISPT_PEN2', 'ISPT_PEN3', 'ISPT_PEN4', 'ISPT_PEN5', 'ISPT_PEN6',
    ])
    ispt.headings.forEach((h, i) => {
      const def = standard.headings.get(h)
      expect(def?.source, h).toBe('standard')
      expect([ispt.units[i], ispt.types[i]], h).toEqual([def?.unit, def?.type])
    })
    // Nothing of the SPT is declared as a project-made heading.
    const dict = file.groups.find(g => g.name === 'DICT')?.rows.map(r => r.values.DICT_HDNG) ?? []
    expect(dict.filter(h => String(h).startsWith('ISPT'))).toEqual([])
    const [full, refusal, coarse] = ispt.rows.map(r => r.values)
    // 2 3 / 3 3 … : seating 1 + 2 = 3, test 2 + 3 + 3 + 4 = 12 for 300 mm; 450 mm in all.
    expect(full).toMatchObject({ ISPT_TOP: '9.00', ISPT_SEAT: '3', ISPT_MAIN: '12', ISPT_NPEN: '450', ISPT_NVAL: '12', ISPT_REP: '1 2 / 2 3 3 4 N=12', ISPT_INC1: '1', ISPT_INC6: '4', ISPT_PEN1: '75', ISPT_PEN6: '75' })
    // Seating 12 + 13 = 25; test 25 + 25 = 50 blows for 75 + 60 = 135 mm; 150 + 135 = 285 mm in all; no N.
    expect(refusal).toMatchObject({ ISPT_TOP: '12.00', ISPT_SEAT: '25', ISPT_MAIN: '50', ISPT_NPEN: '285', ISPT_NVAL: '', ISPT_REP: '12 13 / 25 25/60mm', ISPT_INC3: '25', ISPT_INC4: '25', ISPT_INC5: '', ISPT_PEN3: '75', ISPT_PEN4: '60', ISPT_PEN5: '' })
    // Counts per 150 mm keep their penetrations: one seating slot, two test slots.
    expect(coarse).toMatchObject({ ISPT_SEAT: '6', ISPT_MAIN: '22', ISPT_NPEN: '450', ISPT_NVAL: '22', ISPT_INC1: '6', ISPT_PEN1: '150', ISPT_INC2: '', ISPT_INC3: '10', ISPT_PEN3: '150', ISPT_INC4: '12', ISPT_PEN4: '150' })
  })

  it('rounds to the declared precision: a value finer than its TYPE comes back rounded', () => {
    const finer = demoRecord()
    const hole = finer.points[0]
    if (!hole) throw new Error('no point')
    hole.easting = 412345.678
    hole.spt = [{ depth: 9.123, blows: [3, 5, 7], penetrations: [150, 150, 150], seating: 1, n: 12, penetration: null }]
    const back = agsToInvestigation(parseAgs(investigationToAgs(finer, EXPORT))).data.points[0]
    expect(back?.easting).toBe(412345.68)
    expect(back?.spt[0]?.depth).toBe(9.12)
  })

  it('writes date-times in UTC: another offset comes back as the same instant', () => {
    const shifted = demoRecord()
    const strike = shifted.points[0]?.groundwater[0]
    if (!strike) throw new Error('no strike')
    strike.observedAt = '2024-03-04T11:15:00+01:00'
    const back = agsToInvestigation(parseAgs(investigationToAgs(shifted, EXPORT))).data.points[0]?.groundwater[0]
    expect(back?.observedAt).toBe('2024-03-04T10:15:00Z')
  })
})

describe.skipIf(!hasReference)('the exported file against the full v4.1 dictionary (Standard_dictionary_v4_1.ags)', () => {
  it('has no finding either', () => {
    const dictionary = dictionaryFromAgs(parseAgs(readReference('Standard_dictionary_v4_1.ags')), { edition: '4.1' })
    expect(checkAgs(parseAgs(investigationToAgs(demoRecord(), EXPORT)), dictionary)).toEqual([])
  })
})

// Source: the reference files (README); test_data.ags is in AGS 4.0.4 and leaves out ABBR and SAMP.
describe.skipIf(!hasReference)('agsToInvestigation on the reference files', () => {
  it('reads test_data.ags: four boreholes, reporting what it cannot map', () => {
    const result = agsToInvestigation(parseAgs(readReference('test_data.ags')))
    expect(result.data.project).toEqual({ jobNumber: '123456', name: 'Project_Name "XYZ" ', client: 'Project_Locations' })
    expect(result.data.points.map(p => [p.identifier, p.kind, p.easting, p.finalDepth, p.startedOn])).toEqual([
      ['Location_1', 'borehole', 100000.01, 50.11, '2019-01-01'],
      ['Location_2', 'borehole', 101000.01, 50.22, '2019-01-07'],
      ['Location_3', 'borehole', 102000.01, 50.33, '2019-01-14'],
      ['Location_4', 'borehole', 103000.01, 50.44, '2019-01-21'],
    ])
    expect(result.unknownGroups).toEqual(['TEST'])
    // LOCA_TYPE "Boring" is no AGS code, and LLPL's rows have no SAMP to belong to.
    expect(result.issues.some(i => i.group === 'LOCA' && i.message.includes('"Boring"'))).toBe(true)
    expect(result.issues.some(i => i.group === 'LLPL' && i.severity === 'error')).toBe(true)
  })

  it('reads every rule file without throwing', () => {
    for (const name of readdirSync(resolve(REFERENCE_DIR, 'rules')).filter(n => n.endsWith('.ags'))) {
      const result = agsToInvestigation(parseAgs(readReference(`rules/${name}`)))
      expect(Array.isArray(result.data.points), name).toBe(true)
    }
  })
})

describe('investigationToAgsGroups', () => {
  it('leaves out groups with no rows (rule 2) and DICT when nothing is user-defined', () => {
    const groups = investigationToAgsGroups({ project: { jobNumber: 'TRN-0417', name: 'Demo', client: '' }, strata: [], points: [] }, EXPORT)
    expect(groups.map(g => g.name)).toEqual(['PROJ', 'TRAN', 'UNIT', 'TYPE'])
  })
})

// A US project's file: its UNIT row states ft, psf (or tsf) and pcf and the values follow (1 ft = 0.3048 m,
// 1 psf = 0.047880 kPa, 1 tsf = 2000 psf, 1 pcf = 0.157087 kN/m³, NIST SP 811, 2008, App. B.8); read back it gives the same record
// within the rounding of the written decimals.
describe('an export in US units', () => {
  const original = demoRecord()
  const file = parseAgs(investigationToAgs(original, { ...EXPORT, units: { system: 'US' } }))
  const g = (name: string) => file.groups.find(x => x.name === name)!

  it('states ft, psf and pcf in the UNIT row and heads, and the checker finds nothing', () => {
    expect(file.errors).toEqual([])
    expect(checkAgs(file, standardDictionary())).toEqual([])
    const units = g('UNIT').rows.map(r => r.values.UNIT_UNIT)
    expect(units).toEqual(expect.arrayContaining(['ft', 'psf', 'pcf']))
    expect(units).not.toContain('m')
    expect(units).not.toContain('kPa')
    expect(g('LOCA').units[g('LOCA').headings.indexOf('LOCA_FDEP')]).toBe('ft')
    expect(g('CONS').units[g('CONS').headings.indexOf('CONS_INCF')]).toBe('psf')
    expect(g('PSTR').units[g('PSTR').headings.indexOf('PSTR_UWT')]).toBe('pcf')
  })

  it('writes the values in those units and reads them back to the same SI record', () => {
    const hole = original.points[0]!
    const loca = g('LOCA').rows.find(r => r.values.LOCA_ID === hole.identifier)!
    expect(loca.values.LOCA_FDEP).toBe((hole.finalDepth / 0.3048).toFixed(2))
    const back = agsToInvestigation(file)
    expect(back.issues.filter(i => i.severity === 'error')).toEqual([])
    const bh = back.data.points.find(p => p.identifier === hole.identifier)!
    expect(bh.finalDepth).toBeCloseTo(hole.finalDepth, 2)
    expect(bh.intervals.map(i => i.bottom)).toEqual(hole.intervals.map(i => expect.closeTo(i.bottom, 2)))
    expect(back.data.strata[0]!.unitWeight).toBeCloseTo(original.strata[0]!.unitWeight, 2)
  })

  it('writes stresses in tsf with two more decimals when the project chose tsf', () => {
    const tsf = parseAgs(investigationToAgs(original, { ...EXPORT, units: { system: 'US', usStress: 'tsf' } }))
    const cons = tsf.groups.find(x => x.name === 'CONS')!
    expect(cons.units[cons.headings.indexOf('CONS_INCF')]).toBe('tsf')
    expect(cons.types[cons.headings.indexOf('CONS_INCF')]).toBe('3DP')
    expect(checkAgs(tsf, standardDictionary())).toEqual([])
  })
})

/** Rows joined with CR LF, as rule 2a asks. */
function ags(...lines: string[]): string {
  return lines.join('\r\n') + '\r\n'
}

// A file in the shape other programs write, invented for this test: MPa cone data, 75 mm SPT increments, a water
// strike with a later level, a head reading, a group Pastload does not map, and some values it cannot take.
const FOREIGN = ags(
  '"GROUP","PROJ"', '"HEADING","PROJ_ID","PROJ_NAME","PROJ_CLNT"', '"UNIT","","",""', '"TYPE","ID","X","X"', '"DATA","D-77","Demo Wharf","Demo Port Co"', '',
  '"GROUP","TRAN"', '"HEADING","TRAN_ISNO","TRAN_DATE","TRAN_PROD","TRAN_STAT","TRAN_AGS","TRAN_RECV","TRAN_DLIM","TRAN_RCON"', '"UNIT","","yyyy-mm-dd","","","","","",""', '"TYPE","X","DT","X","X","X","X","X","X"', '"DATA","2","2024-01-15","Demo Drilling","Final","4.1","Demo Consulting","|","+"', '',
  '"GROUP","ABBR"', '"HEADING","ABBR_HDNG","ABBR_CODE","ABBR_DESC"', '"UNIT","","",""', '"TYPE","X","X","X"',
  '"DATA","LOCA_TYPE","CP","Cable percussion (shell and auger)"', '"DATA","LOCA_TYPE","RC","Rotary cored"', '"DATA","GEOL_GEOL","ALV","Alluvium"', '', // 20
  '"GROUP","LOCA"', '"HEADING","LOCA_ID","LOCA_TYPE","LOCA_NATE","LOCA_NATN","LOCA_GL","LOCA_FDEP","LOCA_PURP"', '"UNIT","","","m","m","m","m",""', '"TYPE","ID","PA","2DP","2DP","2DP","2DP","X"',
  '"DATA","BH-01","CP+RC","500100.00","200200.00","2.10","20.00","Design"', '"DATA","CPT-01","SCP","500110.00","200210.00","2.00","","Design"', '',
  '"GROUP","GEOL"', '"HEADING","LOCA_ID","GEOL_TOP","GEOL_BASE","GEOL_DESC","GEOL_GEOL","GEOL_GEO2"', '"UNIT","","m","m","","",""', '"TYPE","ID","2DP","2DP","X","PA","PA"',
  '"DATA","BH-01","0.00","6.00","Soft grey CLAY","ALV","ALV2"', '"DATA","BH-01","6.00","20.00","Stiff CLAY","LC","CH"', '',
  '"GROUP","SAMP"', '"HEADING","LOCA_ID","SAMP_TOP","SAMP_REF","SAMP_TYPE","SAMP_ID","SAMP_BASE"', '"UNIT","","m","","","","m"', '"TYPE","ID","2DP","X","PA","ID","2DP"',
  '"DATA","BH-01","2.00","1","U","","2.45"', '"DATA","BH-01","3.00","2","W","",""', '',
  '"GROUP","LNMC"', '"HEADING","LOCA_ID","SAMP_TOP","SAMP_REF","SAMP_TYPE","SAMP_ID","SPEC_REF","SPEC_DPTH","LNMC_MC"', '"UNIT","","m","","","","","m","%"', '"TYPE","ID","2DP","X","PA","ID","X","2DP","X"',
  '"DATA","BH-01","2.00","1","U","","","","41"', '"DATA","BH-01","3.00","2","W","","","","99"', '',
  '"GROUP","ISPT"', '"HEADING","LOCA_ID","ISPT_TOP","ISPT_SEAT","ISPT_NVAL","ISPT_INC1","ISPT_INC2","ISPT_INC3","ISPT_INC4","ISPT_INC5","ISPT_INC6"', '"UNIT","","m","","","","","","","",""', '"TYPE","ID","2DP","0DP","0DP","0DP","0DP","0DP","0DP","0DP","0DP"',
  '"DATA","BH-01","7.50","3","14","1","2","3","3","4","4"', '"DATA","BH-01","9.00","","31","","","","","",""', '',
  '"GROUP","WSTG"', '"HEADING","LOCA_ID","WSTG_DPTH","WSTG_DTIM"', '"UNIT","","m","yyyy-mm-ddThh:mm"', '"TYPE","ID","2DP","DT"', '"DATA","BH-01","4.20","2024-01-08T11:40"', '',
  '"GROUP","WSTD"', '"HEADING","LOCA_ID","WSTG_DPTH","WSTD_NMIN","WSTD_POST"', '"UNIT","","m","min","m"', '"TYPE","ID","2DP","0DP","2DP"', '"DATA","BH-01","4.20","20","3.65"', '',
  '"GROUP","MONG"', '"HEADING","LOCA_ID","MONG_ID","MONG_DIS","MONG_TYPE"', '"UNIT","","","m",""', '"TYPE","ID","X","2DP","PA"', '"DATA","BH-01","P1","12.00","SPIE"', '',
  '"GROUP","MOND"', '"HEADING","LOCA_ID","MONG_ID","MONG_DIS","MOND_DTIM","MOND_TYPE","MOND_REF","MOND_RDNG","MOND_UNIT"', '"UNIT","","","m","yyyy-mm-ddThh:mm:ss","","","",""', '"TYPE","ID","X","2DP","DT","PA","X","XN","PU"',
  '"DATA","BH-01","P1","12.00","2024-02-01T09:00:00","WHD","1","10.00","m"', '"DATA","BH-01","P1","12.00","2024-02-01T09:00:00","GM","2","0.1","%"', '',
  '"GROUP","SCPG"', '"HEADING","LOCA_ID","SCPG_TESN","SCPG_CAR"', '"UNIT","","",""', '"TYPE","ID","X","3DP"', '"DATA","CPT-01","1","0.750"', '',
  '"GROUP","SCPT"', '"HEADING","LOCA_ID","SCPG_TESN","SCPT_DPTH","SCPT_RES","SCPT_FRES","SCPT_PWP2"', '"UNIT","","","m","MPa","kPa","MPa"', '"TYPE","ID","X","2DP","3DP","1DP","4DP"',
  '"DATA","CPT-01","1","0.52","0.312","4.1","0.0102"', '"DATA","CPT-01","1","0.50","1.205","12.0",""', '',
  '"GROUP","IVAN"', '"HEADING","LOCA_ID","IVAN_DPTH","IVAN_TESN","IVAN_IVAN","IVAN_IVAR"', '"UNIT","","m","","furlongs","kPa"', '"TYPE","ID","2DP","X","XN","XN"', '"DATA","BH-01","3.50","1","24","8"', '',
  '"GROUP","GRAT"', '"HEADING","LOCA_ID","SAMP_TOP","GRAT_SIZE","GRAT_PERP"', '"UNIT","","m","mm","%"', '"TYPE","ID","2DP","3SF","0DP"', '"DATA","BH-01","2.00","0.063","85"',
)

describe('agsToInvestigation on a file from elsewhere', () => {
  const result = agsToInvestigation(parseAgs(FOREIGN))
  const hole = result.data.points.find(p => p.identifier === 'BH-01')
  const cone = result.data.points.find(p => p.identifier === 'CPT-01')
  const findings = (text: string) => result.issues.filter(issue => issue.message.includes(text))

  it('maps LOCA_TYPE codes to kinds and reads the method from their ABBR descriptions (rule 16a parts)', () => {
    expect(hole?.kind).toBe('borehole')
    expect(hole?.method).toBe('Cable percussion (shell and auger) + Rotary cored')
    expect(cone?.kind).toBe('cpt')
    expect(result.data.project).toEqual({ jobNumber: 'D-77', name: 'Demo Wharf', client: 'Demo Port Co' })
  })

  it('converts cone data per its UNIT row: MPa and kPa to kPa, a missing u2 to 0 with a finding', () => {
    expect(cone?.cpt).toEqual({ areaRatio: 0.75, depth: [0.5, 0.52], qc: [1205, 312], fs: [12, 4.1], u2: [0, 10.2] })
    expect(findings('u2 = 0')).toHaveLength(1)
  })

  it('keeps GRAT as an unknown group with its rows, never dropping it', () => {
    expect(result.unknownGroups).toEqual(['GRAT'])
    expect(result.rawGroups[0]?.rows[0]?.values.GRAT_PERP).toBe('85')
  })

  it('reports a unit it does not read instead of converting it: the vane in "furlongs" is not imported', () => {
    expect(hole?.vane).toEqual([])
    expect(findings('"furlongs"')).toEqual([expect.objectContaining({ rule: 'import', severity: 'error', group: 'IVAN' })])
  })

  it('reads the SPT increments (ISPT_INC1–6, 75 mm each without ISPT_PEN), and an N alone as a 300 mm test drive without the seating', () => {
    expect(hole?.spt).toEqual([
      // N = 3 + 3 + 4 + 4 = 14, as ISPT_NVAL says.
      { depth: 7.5, blows: [1, 2, 3, 3, 4, 4], penetrations: [75, 75, 75, 75, 75, 75], seating: 2, n: 14, penetration: null },
      { depth: 9, blows: [31], penetrations: [300], seating: 0, n: 31, penetration: null },
    ])
    expect(findings('SPT')).toEqual([])
  })

  it('reads a strike, its later level from WSTD, and a head reading as pore pressure (γw = 9.81 kN/m³)', () => {
    expect(hole?.groundwater).toEqual([
      { kind: 'strike', observedAt: '2024-01-08T11:40:00', depth: 4.2, pressure: null, remarks: '' },
      { kind: 'standing', observedAt: '2024-01-08T12:00:00', depth: 3.65, pressure: null, remarks: '20 min after the water strike at 4.2 m' },
      { kind: 'piezometer', observedAt: '2024-02-01T09:00:00', depth: null, pressure: 98.1, remarks: '' },
    ])
    expect(findings('no time zone')).toHaveLength(2)
    expect(findings('type "GM"')).toHaveLength(1)
  })

  it('applies a time zone when asked', () => {
    const zoned = agsToInvestigation(parseAgs(FOREIGN), { timeZone: 'Z' })
    expect(zoned.data.points[0]?.groundwater[0]?.observedAt).toBe('2024-01-08T11:40:00Z')
  })

  it('maps SAMP_TYPE codes, noting the U reading, and skips a water sample with its test without a second finding', () => {
    expect(hole?.samples).toEqual([{ identifier: '1', top: 2, bottom: 2.45, type: 'thin-walled-tube', recovery: null, remarks: '', index: { waterContent: 41, liquidLimit: null, plasticLimit: null, bulkUnitWeight: null }, oedometer: null }])
    expect(findings('SAMP_TYPE U')).toHaveLength(1)
    expect(findings('"W"')).toHaveLength(1)
    expect(findings('sample is not in SAMP')).toEqual([])
  })

  it('reads GEOL_GEO2 as USCS only when it is a USCS symbol, and lists strata it has no unit weights for', () => {
    expect(hole?.intervals.map(i => [i.stratumCode, i.uscs])).toEqual([['ALV', null], ['LC', 'CH']])
    expect(findings('"ALV2"')).toHaveLength(1)
    expect(result.undefinedStrata).toEqual([{ code: 'ALV', name: 'Alluvium' }, { code: 'LC', name: 'LC' }])
    expect(result.data.strata).toEqual([])
  })

  it('fills a missing final depth from the deepest record, and says so', () => {
    expect(cone?.finalDepth).toBe(0.52)
    expect(findings('no final depth')).toHaveLength(1)
  })

  it('names the headings whose data it does not keep', () => {
    expect(findings('LOCA_PURP')).toEqual([expect.objectContaining({ severity: 'warning', group: 'LOCA' })])
  })

  it('reports rows of a location missing from LOCA', () => {
    const orphan = agsToInvestigation(parseAgs(FOREIGN.replace('"DATA","BH-01","3.50","1","24","8"', '"DATA","BH-09","3.50","1","24","8"')))
    expect(orphan.issues.filter(i => i.message.includes('BH-09'))).toEqual([expect.objectContaining({ severity: 'error', group: 'IVAN' })])
  })
})
