// Units of imported and exported numbers over real HTTP: a CSV whose columns are in ft and psf, an AGS4 file whose
// UNIT row says ft, psf and pcf (converted to SI as read), a unit Pastload does not read (422 naming the column or
// the file's line, nothing written), and a US project's AGS4 and XLSX exports in its own units.
// 1 ft = 0.3048 m, 1 psf = 0.047880 kPa, 1 tsf = 2000 psf, 1 pcf = 0.157087 kN/m³ (NIST SP 811, 2008, App. B.8).
import * as XLSX from 'xlsx-republish'
import { beforeEach, describe, expect, it } from 'vitest'
import { signedInDemo } from '../helpers/http'
import { createPoint, createProject, must } from '../helpers/project'
import { upload } from '../helpers/upload'

interface Report { message: string, data: { errors?: { row: number, column: string, message: string }[], mappingProblems?: string[] } }

/** Rows joined with CR LF, as AGS4 rule 2a asks. */
const ags = (...lines: string[]) => `${lines.join('\r\n')}\r\n`

/** An invented AGS4 file of one borehole in US units. */
function usFile(fdepUnit = 'ft'): string {
  return ags(
    '"GROUP","PROJ"', '"HEADING","PROJ_ID","PROJ_NAME"', '"UNIT","",""', '"TYPE","ID","X"', '"DATA","U-1","Units yard"', '',
    '"GROUP","TRAN"', '"HEADING","TRAN_ISNO","TRAN_DATE","TRAN_PROD","TRAN_STAT","TRAN_AGS","TRAN_RECV","TRAN_DLIM","TRAN_RCON"', '"UNIT","","yyyy-mm-dd","","","","","",""', '"TYPE","X","DT","X","X","X","X","X","X"', '"DATA","1","2026-11-30","Demo Drilling","Final","4.1","Demo Consulting","|","+"', '',
    '"GROUP","ABBR"', '"HEADING","ABBR_HDNG","ABBR_CODE","ABBR_DESC"', '"UNIT","","",""', '"TYPE","X","X","X"', '"DATA","LOCA_TYPE","CP","Cable percussion"', '',
    '"GROUP","UNIT"', '"HEADING","UNIT_UNIT","UNIT_DESC"', '"UNIT","",""', '"TYPE","X","X"', '"DATA","ft","foot"', '"DATA","psf","pounds-force per square foot"', '"DATA","yyyy-mm-dd","year month day"',
    ...(fdepUnit === 'ft' ? [] : [`"DATA","${fdepUnit}","${fdepUnit}"`]), '',
    '"GROUP","TYPE"', '"HEADING","TYPE_TYPE","TYPE_DESC"', '"UNIT","",""', '"TYPE","X","X"',
    '"DATA","ID","Unique Identifier"', '"DATA","X","Text"', '"DATA","DT","Date time in international format"', '"DATA","PA","Text listed in ABBR Group"', '"DATA","2DP","Value; required number of decimal places, 2"', '"DATA","XN","Text / numeric"', '',
    '"GROUP","LOCA"', '"HEADING","LOCA_ID","LOCA_TYPE","LOCA_NATE","LOCA_NATN","LOCA_GL","LOCA_FDEP"', `"UNIT","","","ft","ft","ft","${fdepUnit}"`, '"TYPE","ID","PA","2DP","2DP","2DP","2DP"',
    '"DATA","BH-U1","CP","328.08","164.04","8.20","65.62"', '',
    '"GROUP","GEOL"', '"HEADING","LOCA_ID","GEOL_TOP","GEOL_BASE","GEOL_DESC"', '"UNIT","","ft","ft",""', '"TYPE","ID","2DP","2DP","X"',
    '"DATA","BH-U1","0.00","32.81","Soft grey CLAY"', '"DATA","BH-U1","32.81","65.62","Dense SAND"', '',
    '"GROUP","IVAN"', '"HEADING","LOCA_ID","IVAN_DPTH","IVAN_TESN","IVAN_IVAN","IVAN_IVAR"', '"UNIT","","ft","","psf","psf"', '"TYPE","ID","2DP","X","XN","XN"', '"DATA","BH-U1","16.40","1","417.7","104.4"',
  )
}

describe('units of imported and exported numbers', () => {
  const { owner, geologist: geo } = signedInDemo('owner', 'geologist')
  let projectId: string
  let base: string

  beforeEach(async () => {
    const project = await createProject(owner, 'IMU', 'Import units site', ['geologist', 'engineer'])
    projectId = project.id
    base = project.base
  })

  it('reads a CSV whose depth is in ft and pressure in psf into m and kPa, and refuses a unit it does not read, naming the column', async () => {
    await createPoint(geo, projectId, { identifier: 'BH-01', kind: 'borehole', easting: 10, northing: 20, groundElevation: 2.5, finalDepth: 20 })
    const csv = 'Hole,Kind,When,Depth (ft),u (psf)\nBH-01,standing,2026-11-02T09:00:00Z,10,1000\n'
    const up = await upload<{ importId: string }>(geo, `${base}/imports`, 'water.csv', csv)
    expect(up.status).toBe(201)
    const mapping = { point: 'Hole', kind: 'Kind', observedAt: 'When', depth: 'Depth (ft)', pressure: 'u (psf)' }
    const bad = await geo.post<Report>(`${base}/imports/${up.body.importId}/commit`, { target: 'groundwater', mapping, units: { depth: 'furlongs', pressure: 'psf' } })
    expect(bad.status).toBe(422)
    expect(bad.body.message).toBe('Depth (column “Depth (ft)”) cannot be in "furlongs": choose one of m, ft.')
    const none = await geo.get<{ groundwater: unknown[] }>(`${base}/points/${(await geo.get<{ points: { id: string }[] }>(`${base}/points`)).body.points[0]!.id}`)
    expect(none.body.groundwater).toEqual([])
    const ok = await geo.post<{ written: number }>(`${base}/imports/${up.body.importId}/commit`, { target: 'groundwater', mapping, units: { depth: 'ft', pressure: 'psf' } })
    expect(ok.status).toBe(200)
    const pts = (await geo.get<{ points: { id: string }[] }>(`${base}/points`)).body.points
    const detail = await geo.get<{ groundwater: { depth: number, pressure: number }[] }>(`${base}/points/${pts[0]!.id}`)
    expect(detail.body.groundwater[0]!.depth).toBeCloseTo(3.048, 6)
    expect(detail.body.groundwater[0]!.pressure).toBeCloseTo(47.880, 3)
  })

  it('quotes depths in a US project\'s row checks in ft, as the file has them', async () => {
    await must('US units', owner.patch(base, { unitSystem: 'US' }))
    await createPoint(geo, projectId, { identifier: 'BH-01', kind: 'borehole', easting: 10, northing: 20, groundElevation: 2.5, finalDepth: 20 })
    const csv = 'Hole,Depth (ft),Peak su (psf)\nBH-01,80,500\n'
    const up = await upload<{ importId: string }>(geo, `${base}/imports`, 'vane.csv', csv)
    expect(up.status).toBe(201)
    const r = await geo.post<Report>(`${base}/imports/${up.body.importId}/commit`, { target: 'vane', mapping: { point: 'Hole', depth: 'Depth (ft)', peak: 'Peak su (psf)' }, units: { depth: 'ft', peak: 'psf' } })
    expect(r.status).toBe(422)
    // 20 m = 65.62 ft (1 ft = 0.3048 m).
    expect(r.body.data.errors?.map(e => e.message)).toContain('Depth (80.00 ft) is below the hole\'s final depth (65.62 ft).')
  })

  it('reads an AGS4 file per its UNIT row (ft, psf) into m and kPa', async () => {
    const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'us.ags', usFile(), 'text/plain')
    expect(up.status).toBe(201)
    const r = await owner.post(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(r.status).toBe(200)
    const pts = (await owner.get<{ points: { id: string, identifier: string, finalDepth: number, easting: number }[] }>(`${base}/points`)).body.points
    // 65.62 ft = 20.0010 m; 328.08 ft = 99.999 m.
    expect(pts[0]!.finalDepth).toBeCloseTo(20.001, 3)
    expect(pts[0]!.easting).toBeCloseTo(99.999, 2)
    const detail = await owner.get<{ intervals: { bottom: number }[], vane: { depth: number, peak: number }[] }>(`${base}/points/${pts[0]!.id}`)
    expect(detail.body.intervals.map(i => i.bottom)).toEqual([expect.closeTo(10.0005, 3), expect.closeTo(20.001, 3)])
    // 417.7 psf = 20.0 kPa.
    expect(detail.body.vane[0]!.peak).toBeCloseTo(20.0, 1)
  })

  it('remembers each column\'s unit with a saved mapping, and gives them back for the next file of that layout', async () => {
    await createPoint(geo, projectId, { identifier: 'BH-01', kind: 'borehole', easting: 10, northing: 20, groundElevation: 2.5, finalDepth: 20 })
    const csv = 'Hole,Kind,When,Depth,u\nBH-01,standing,2026-11-02T09:00:00Z,10,2\n'
    const mapping = { point: 'Hole', kind: 'Kind', observedAt: 'When', depth: 'Depth', pressure: 'u' }
    const first = await upload<{ importId: string }>(geo, `${base}/imports`, 'water.csv', csv)
    const ok = await geo.post<{ written: number }>(`${base}/imports/${first.body.importId}/commit`, { target: 'groundwater', mapping, units: { depth: 'ft', pressure: 'psi' } })
    expect(ok.status).toBe(200)
    const next = await upload<{ importId: string }>(geo, `${base}/imports`, 'water-2.csv', csv.replace('10,2', '12,3'))
    const preview = await geo.get<{ preview: { mapping: Record<string, string>, mappingSource: string, units: Record<string, string> | null } }>(`${base}/imports/${next.body.importId}?target=groundwater`)
    expect(preview.status).toBe(200)
    expect(preview.body.preview).toMatchObject({ mappingSource: 'saved', mapping, units: { depth: 'ft', pressure: 'psi' } })
    // 2 psi = 13.79 kPa (1 psi = 6.894757 kPa).
    const pts = (await geo.get<{ points: { id: string }[] }>(`${base}/points`)).body.points
    const detail = await geo.get<{ groundwater: { pressure: number }[] }>(`${base}/points/${pts[0]!.id}`)
    expect(detail.body.groundwater[0]!.pressure).toBeCloseTo(13.7895, 3)
  })

  it('writes an AGS4 file\'s log rules in ft on a US project, in the preview and the commit', async () => {
    await must('US units', owner.patch(base, { unitSystem: 'US' }))
    const text = usFile().replace('"DATA","BH-U1","32.81","65.62","Dense SAND"', '"DATA","BH-U1","30.00","65.62","Dense SAND"')
    const up = await upload<{ importId: string, ags: { errors: { message: string }[] } }>(owner, `${base}/imports`, 'overlap.ags', text, 'text/plain')
    expect(up.status).toBe(201)
    expect(up.body.ags.errors.map(e => e.message)).toContain('BH-U1 30.00–65.62 ft: Overlaps the interval 0.00–32.81 ft.')
    const r = await owner.post<Report>(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(r.status).toBe(422)
    const messages = (r.body.data.errors ?? []).map(e => e.message)
    expect(messages).toContain('BH-U1 30.00–65.62 ft: Overlaps the interval 0.00–32.81 ft.')
    expect(messages.join(' ')).not.toMatch(/\d m\b/)
  })

  it('refuses an AGS4 file whose depth is in a unit Pastload does not read, at the file\'s line, writing nothing', async () => {
    const text = usFile('furlongs')
    const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'bad.ags', text, 'text/plain')
    expect(up.status).toBe(201)
    const r = await owner.post<Report>(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(r.status).toBe(422)
    const errs = r.body.data.errors ?? []
    const unit = errs.find(e => e.message.includes('"furlongs"'))
    expect(unit).toBeDefined()
    expect(unit!.message).toContain('LOCA_FDEP')
    expect(text.split('\r\n')[unit!.row - 1]).toMatch(/^"(DATA|UNIT)"/)
    expect((await owner.get<{ points: unknown[] }>(`${base}/points`)).body.points).toEqual([])
  })

  it('exports a US project\'s logs in ft, psf and pcf: the AGS4 UNIT row and the XLSX headings say so', async () => {
    await createPoint(geo, projectId, { identifier: 'BH-01', kind: 'borehole', easting: 30.48, northing: 0, groundElevation: 3.048, finalDepth: 30 })
    await must('a stratum', geo.post(`${base}/strata`, { code: 'EST', name: 'Estuarine clay', colour: 'c', pattern: 'p', unitWeight: 18.85, unitWeightSaturated: 18.85 }), 201)
    await must('US units', owner.patch(base, { unitSystem: 'US', usStressUnit: 'tsf' }))
    const res = await fetch(`${owner.base}/exports/${projectId}/logs.ags`, { headers: { cookie: owner.cookie } })
    expect(res.status).toBe(200)
    const text = await res.text()
    expect(text).toContain('"DATA","ft","foot"')
    expect(text).toContain('"DATA","pcf","pounds-force per cubic foot"')
    expect(text).not.toContain('"DATA","m","metre"')
    // BH-01's 30 m final depth is 98.43 ft; 18.85 kN/m³ is 120.00 pcf.
    expect(text).toMatch(/"DATA","BH-01","[^"]*","100\.00","0\.00","10\.00","[^"]*","98\.43"/)
    expect(text).toMatch(/"EST",[^\r\n]*"120\.00","120\.00"/)
    const xlsx = await fetch(`${owner.base}/exports/${projectId}/logs.xlsx`, { headers: { cookie: owner.cookie } })
    expect(xlsx.status).toBe(200)
    const wb = XLSX.read(Buffer.from(await xlsx.arrayBuffer()), { type: 'buffer' })
    const points = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Points!, { header: 1 })
    expect(points[0]).toEqual(expect.arrayContaining(['Easting (ft)', 'Final depth (ft)']))
    expect(points[1]![5]).toBe(98.4252)
    const about = XLSX.utils.sheet_to_json<string[]>(wb.Sheets.About!, { header: 1 })
    expect(about.find(r => r[0] === 'Units')?.[1]).toBe('ft, tsf, pcf, %')
    const water = XLSX.utils.sheet_to_json<string[]>(wb.Sheets.Groundwater!, { header: 1 })
    expect(water[0]).toEqual(['Point', 'Kind', 'Observed at', 'Depth (ft)', 'Pressure (tsf)', 'Remarks'])
  })
})
