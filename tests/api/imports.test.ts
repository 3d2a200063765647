// CSV/XLSX imports over real HTTP: upload → preview and mapping → row-level
// report → one transaction (any error: nothing written).
import * as XLSX from 'xlsx-republish'
import { beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { createDemoCopy } from '../helpers/demo-project'
import { demoEmail, signIn, signedInDemo } from '../helpers/http'
import { createPoint, createProject } from '../helpers/project'
import { upload, uploadChunked } from '../helpers/upload'

interface Preview { importId: string, format: string, preview: { headers: string[], rowCount: number, mapping: Record<string, string> | null } | null }
interface Report { message: string, data: { errors: { row: number, column: string, message: string }[] } }

describe('imports', () => {
  const { owner, geologist: geo } = signedInDemo('owner', 'geologist')
  let projectId: string
  let base: string

  // Every test imports into a project of its own: the geologist as a member, the estuarine clay stratum, no points.
  beforeEach(async () => {
    const project = await createProject(owner, 'IMP', 'Import test site', ['geologist'])
    projectId = project.id
    base = project.base
    expect((await geo.post(`${base}/strata`, { code: 'EST', name: 'Estuarine clay', colour: 'c', pattern: 'p', unitWeight: 16, unitWeightSaturated: 16 })).status).toBe(201)
  })

  /** The three points the import tests refer to (BH-01 25 m, BH-02 22 m, CPT-01 22 m), entered one by one. */
  async function seedPoints(): Promise<{ cptId: string }> {
    const made: Record<string, string> = {}
    for (const [identifier, kind, easting, finalDepth] of [['BH-01', 'borehole', 10, 25], ['BH-02', 'borehole', 60, 22], ['CPT-01', 'cpt', 35, 22]] as const) {
      made[identifier] = await createPoint(geo, projectId, { identifier, kind, easting, northing: 30, groundElevation: 2.5, finalDepth })
    }
    return { cptId: made['CPT-01']! }
  }

  async function commit(importId: string, body: Record<string, unknown>) {
    return geo.post<Report & { written: number }>(`${base}/imports/${importId}/commit`, body)
  }

  it('imports points from CSV with a suggested mapping, remembers the mapping, and refuses duplicates', async () => {
    const csv = 'Point,Kind,Easting,Northing,Ground level,Final depth,Start date\nBH-01,borehole,10,20,2.5,25,2025-03-03\nBH-02,borehole,60,40,2.7,22,2025-03-05\nCPT-01,cpt,35,30,2.6,22,\n'
    const up = await upload<Preview>(geo, `${base}/imports`, 'points.csv', csv)
    expect(up.status).toBe(201)
    expect(up.body.format).toBe('csv')
    expect(up.body.preview!.rowCount).toBe(3)
    const pre = await geo.get<Preview>(`${base}/imports/${up.body.importId}?target=points`)
    const mapping = pre.body.preview!.mapping!
    expect(mapping).toMatchObject({ identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth', startedOn: 'Start date' })
    const done = await commit(up.body.importId, { target: 'points', mapping })
    expect(done.status).toBe(200)
    expect(done.body.written).toBe(3)
    const list = await geo.get<{ points: { identifier: string, finalDepth: number, startedOn: string | null }[] }>(`${base}/points`)
    expect(list.body.points.map(p => [p.identifier, p.finalDepth, p.startedOn])).toEqual([['BH-01', 25, '2025-03-03'], ['BH-02', 22, '2025-03-05'], ['CPT-01', 22, null]])

    const again = await upload<Preview>(geo, `${base}/imports`, 'points2.csv', 'Point,Kind,Easting,Northing,Ground level,Final depth,Start date\nBH-01,borehole,1,1,1,5,\n')
    const saved = await geo.get<{ preview: { mappingSource: string } }>(`${base}/imports/${again.body.importId}?target=points`)
    expect(saved.body.preview.mappingSource).toBe('saved')
    const dup = await commit(again.body.importId, { target: 'points', mapping })
    expect(dup.status).toBe(422)
    expect(dup.body.data.errors).toEqual([{ row: 2, column: 'Point', message: 'Point BH-01 already exists in this project.' }])
  })

  it('reports every bad row of an interval file with its file row number and writes nothing', async () => {
    await seedPoints()
    const csv = [
      'point,top,bottom,description,uscs,stratum', // row 1
      'BH-01,0,1.2,Sandy GRAVEL fill,GW,', // 2
      'BH-01,1.2,3.4,Stiff brown CLAY,CL,', // 3
      '', // 4: blank, still counted
      'BH-01,3.0,15,Soft grey CLAY,CH,EST', // 5: overlaps row 3
      'BH-01,15,26,Firm CLAY,CL,', // 6: beyond the final depth of 25 m
      'BH-02,0,two,Fill,GW,', // 7: not a number
      'BH-02,2,5,Clay,XY,', // 8: not a USCS symbol
      'BH-09,0,1,Fill,GW,', // 9: no such point
    ].join('\n')
    const up = await upload<Preview>(geo, `${base}/imports`, 'intervals.csv', csv)
    const mapping = { point: 'point', top: 'top', bottom: 'bottom', description: 'description', uscs: 'uscs', stratum: 'stratum' }
    const r = await commit(up.body.importId, { target: 'intervals', mapping })
    expect(r.status).toBe(422)
    expect(r.body.data.errors.map(e => [e.row, e.column])).toEqual([[5, 'top'], [6, 'bottom'], [7, 'bottom'], [8, 'uscs'], [9, 'point']])
    expect(r.body.data.errors[0]!.message).toBe('BH-01: Overlaps the interval 1.2–3.4 m (file row 3).')
    expect(r.body.data.errors[2]!.message).toBe('Bottom (m) "two" is not a number.')
    expect(r.body.message).toMatch(/nothing was imported/)
    const pts = await geo.get<{ points: { id: string, identifier: string }[] }>(`${base}/points`)
    for (const p of pts.body.points) {
      const d = await geo.get<{ intervals: unknown[] }>(`${base}/points/${p.id}`)
      expect(d.body.intervals).toEqual([])
    }
  })

  it('dry run reports without writing; a clean file then replaces the logs it names', async () => {
    await seedPoints()
    const csv = 'point,top,bottom,description,uscs,stratum\nBH-01,0,1.2,Fill,GW,\nBH-01,1.2,25,Clay,CH,EST\n'
    const up = await upload<Preview>(geo, `${base}/imports`, 'ok.csv', csv)
    const mapping = { point: 'point', top: 'top', bottom: 'bottom', description: 'description', uscs: 'uscs', stratum: 'stratum' }
    const dry = await geo.post<{ dryRun: boolean, rowCount: number }>(`${base}/imports/${up.body.importId}/commit`, { target: 'intervals', mapping, dryRun: true })
    // The preview says whose log the file replaces, and with how many intervals.
    expect(dry.body).toEqual({ dryRun: true, rowCount: 2, errors: [], replaces: [{ point: 'BH-01', before: 0, after: 2 }] })
    const done = await commit(up.body.importId, { target: 'intervals', mapping })
    expect(done.body.written).toBe(2)
    const pts = await geo.get<{ points: { id: string, identifier: string }[] }>(`${base}/points?q=BH-01`)
    const d = await geo.get<{ intervals: { top: number, bottom: number, uscs: string, stratumId: string | null }[] }>(`${base}/points/${pts.body.points[0]!.id}`)
    expect(d.body.intervals.map(i => [i.top, i.bottom, i.uscs])).toEqual([[0, 1.2, 'GW'], [1.2, 25, 'CH']])
    expect(d.body.intervals[1]!.stratumId).not.toBeNull()
    // The upload is consumed by the commit.
    expect((await commit(up.body.importId, { target: 'intervals', mapping })).status).toBe(404)
  })

  it('reads an XLSX workbook, including a chosen sheet', async () => {
    await seedPoints()
    const wb = XLSX.utils.book_new()
    XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['Notes'], ['Lab export']]), 'Cover')
    XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['Point', 'Sample', 'Top', 'Bottom', 'Type'], ['BH-01', 'U1', 4.5, 4.95, 'thin-walled-tube'], ['BH-01', 'U2', 6, 6.45, 'piston']]), 'Samples')
    const buf = XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Buffer
    const up = await upload<Preview & { preview: { sheets: string[] } }>(geo, `${base}/imports`, 'lab.xlsx', new Uint8Array(buf), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
    expect(up.status).toBe(201)
    expect(up.body.format).toBe('xlsx')
    expect((up.body.preview as unknown as { sheets: string[] }).sheets).toEqual(['Cover', 'Samples'])
    const pre = await geo.get<{ preview: { headers: string[], mapping: Record<string, string> } }>(`${base}/imports/${up.body.importId}?target=samples&sheet=Samples`)
    expect(pre.body.preview.headers).toEqual(['Point', 'Sample', 'Top', 'Bottom', 'Type'])
    const done = await commit(up.body.importId, { target: 'samples', mapping: pre.body.preview.mapping, sheet: 'Samples' })
    expect(done.status).toBe(200)
    expect(done.body.written).toBe(2)
  })

  it('imports a CPT sounding into one point', async () => {
    await seedPoints()
    const pts = await geo.get<{ points: { id: string }[] }>(`${base}/points?kind=cpt`)
    const rows = Array.from({ length: 1100 }, (_, i) => `${(0.02 * (i + 1)).toFixed(2)},${300 + i},${5 + i * 0.01},${(9.81 * 0.02 * i).toFixed(3)}`)
    const up = await upload<Preview>(geo, `${base}/imports`, 'cpt-01.csv', `Depth (m),qc (kPa),fs (kPa),u2 (kPa)\n${rows.join('\n')}\n`)
    const pre = await geo.get<{ preview: { mapping: Record<string, string> } }>(`${base}/imports/${up.body.importId}?target=cpt`)
    expect(pre.body.preview.mapping).toEqual({ depth: 'Depth (m)', qc: 'qc (kPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)' })
    const done = await commit(up.body.importId, { target: 'cpt', mapping: pre.body.preview.mapping, pointId: pts.body.points[0]!.id, areaRatio: 0.8 })
    expect(done.status).toBe(200)
    const got = await geo.get<{ count: number, qc: number[] }>(`${base}/points/${pts.body.points[0]!.id}/cpt`)
    expect(got.body.count).toBe(1100)
    expect(got.body.qc[10]).toBe(310)
  })

  it('checks a CPT file row by row with file row numbers and writes nothing, keeps the upload, then imports exact values with an audit entry', async () => {
    const { cptId: pointId } = await seedPoints()
    // A sounding already there, which a refused file must leave as it is.
    expect((await geo.request('PUT', `${base}/points/${pointId}/cpt`, { areaRatio: 0.8, depth: [0.02, 0.04], qc: [300, 310], fs: [5, 5], u2: [1, 2] })).status).toBe(200)
    const before = await geo.get<{ count: number }>(`${base}/points/${pointId}/cpt`)
    expect(before.body.count).toBe(2)
    const mapping = { depth: 'Depth (m)', qc: 'qc (kPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)' }
    const bad = 'Depth (m),qc (kPa),fs (kPa),u2 (kPa)\r\n0.02,301.5,5.01,-0.35\r\n\r\n0.04,3o2,5.02,-0.2\r\n0.03,303,,0.1\r\n'
    const up = await upload<Preview>(geo, `${base}/imports`, 'cpt-bad.csv', bad)
    expect(up.body.preview!.rowCount).toBe(3)
    const r = await commit(up.body.importId, { target: 'cpt', mapping, pointId, areaRatio: 0.8 })
    expect(r.status).toBe(422)
    expect(r.body.data.errors).toEqual([
      { row: 4, column: 'qc (kPa)', message: 'qc (kPa) "3o2" is not a number.' },
      { row: 5, column: 'fs (kPa)', message: 'fs (kPa) is empty.' },
      { row: 5, column: 'Depth (m)', message: 'Depth 0.03 m does not increase from the row above (0.04 m).' },
    ])
    expect((await geo.get<{ count: number }>(`${base}/points/${pointId}/cpt`)).body.count).toBe(before.body.count)
    // A refused commit leaves the upload for another look.
    expect((await geo.get(`${base}/imports/${up.body.importId}?target=cpt`)).status).toBe(200)

    const good = 'Depth (m);qc (kPa);fs (kPa);u2 (kPa)\n0,5;301,5;5;-12,25\n1.0;1.5e3;0;-0.5\n\n2;-4;6.25;987654.125\n'
    const up2 = await upload<Preview>(geo, `${base}/imports`, 'cpt-good.csv', good)
    const done = await commit(up2.body.importId, { target: 'cpt', mapping, pointId, areaRatio: 0.75 })
    expect(done.status).toBe(200)
    expect(done.body.written).toBe(3)
    const got = await geo.get<{ count: number, areaRatio: number, depth: number[], qc: number[], fs: number[], u2: number[] }>(`${base}/points/${pointId}/cpt`)
    expect(got.body).toMatchObject({ count: 3, areaRatio: 0.75, depth: [0.5, 1, 2], qc: [301.5, 1500, -4], fs: [5, 0, 6.25], u2: [-12.25, -0.5, 987654.125] })
    const audit = await geo.get<{ events: { action: string, entity: string, after: { filename?: string, rows?: number } | null }[] }>(`${base}/audit?limit=20`)
    expect(audit.body.events.find(e => e.action === 'import' && e.entity === 'cpt')?.after).toEqual({ filename: 'cpt-good.csv', rows: 3 })

    // Quoted cells take the general reader and give the same result.
    const quoted = '"Depth (m)","qc (kPa)","fs (kPa)","u2 (kPa)"\n"0.1","300","5","-1"\n"0.2","310","6","-2"\n'
    const up3 = await upload<Preview>(geo, `${base}/imports`, 'cpt-quoted.csv', quoted)
    const done3 = await commit(up3.body.importId, { target: 'cpt', mapping, pointId, areaRatio: 0.8 })
    expect(done3.status).toBe(200)
    const got3 = await geo.get<{ depth: number[], u2: number[] }>(`${base}/points/${pointId}/cpt`)
    expect(got3.body.depth).toEqual([0.1, 0.2])
    expect(got3.body.u2).toEqual([-1, -2])
  })

  it('refuses an empty file, a PDF, a binary, a non-UTF-8 text and a file over 25 MB with clear messages', async () => {
    const empty = await upload<{ message: string }>(geo, `${base}/imports`, 'empty.csv', '')
    expect(empty.status).toBe(422)
    expect(empty.body.message).toBe('empty.csv is empty.')
    const pdf = await upload<{ message: string }>(geo, `${base}/imports`, 'report.csv', '%PDF-1.7\n...', 'application/pdf')
    expect(pdf.status).toBe(422)
    expect(pdf.body.message).toMatch(/is a PDF/)
    const latin1 = await upload<{ message: string, data: { code: string } }>(geo, `${base}/imports`, 'legacy.csv', new Uint8Array([0x50, 0x6F, 0x69, 0x6E, 0x74, 0x0A, 0x42, 0xE9, 0x0A]))
    expect(latin1.status).toBe(422)
    expect(latin1.body.data.code).toBe('wrong-encoding')
    const bin = await upload<{ data: { code: string } }>(geo, `${base}/imports`, 'x.csv', new Uint8Array([1, 2, 0, 4, 5]))
    expect(bin.body.data.code).toBe('wrong-type')
    const headerOnly = await upload<{ id: string, importId: string }>(geo, `${base}/imports`, 'h.csv', 'a,b\n')
    expect(headerOnly.status).toBe(422)
    const big = await upload(geo, `${base}/imports`, 'big.csv', new Uint8Array(26 * 1024 * 1024).fill(65))
    expect(big.status).toBe(413)
    // Streamed (chunked), so the body-size middleware cannot see its length: the upload stops reading at 25 MB.
    const streamed = await uploadChunked(geo, `${base}/imports`, 'big.csv', 'text/csv', 'a,b\n', 27)
    expect(streamed.status).toBe(413)
    expect(((await streamed.json()) as { message: string }).message).toBe('The file is larger than 25 MB, the limit for an import.')
    const noFile = await geo.post<{ message: string }>(`${base}/imports`, { file: 'x' })
    expect(noFile.status).toBe(400)
    expect(noFile.body.message).toBe('Send the file as multipart form data in a field named "file".')
  })

  it('lets only writers upload', async () => {
    const designer = await signIn(demoEmail('designer'))
    await owner.post(`${base}/members`, { email: demoEmail('designer'), role: 'designer' })
    const r = await upload(designer, `${base}/imports`, 'p.csv', 'a\n1\n')
    expect(r.status).toBe(403)
  })
})

describe('the example file with the demo site\'s deliberate logging errors', () => {
  let projectId: string
  // A copy of the demo site of this block's own (the upload is stored with the project).
  beforeAll(async () => {
    projectId = await createDemoCopy('IMX')
  })

  it('is reported row by row against a copy of the demo site, and the database is unchanged', async () => {
    const { readFileSync } = await import('node:fs')
    const { resolve } = await import('node:path')
    const { demoImportCsv, demoImportErrors } = await import('../../shared/demo/import-examples')
    const csv = readFileSync(resolve(import.meta.dirname, '../../docs/examples/saltmarsh-lane-intervals-with-errors.csv'), 'utf8')
    // The shipped example is the generator's output, byte for byte.
    expect(csv).toBe(demoImportCsv())
    const geo = await signIn(demoEmail('geologist'))
    const base = `/api/projects/${projectId}`
    const before = await geo.get<{ events: unknown[] }>(`${base}/audit?limit=100`)
    const up = await upload<{ importId: string }>(geo, `${base}/imports`, 'saltmarsh-lane-intervals-with-errors.csv', csv)
    const pre = await geo.get<{ preview: { mapping: Record<string, string> } }>(`${base}/imports/${up.body.importId}?target=intervals`)
    const r = await geo.post<Report>(`${base}/imports/${up.body.importId}/commit`, { target: 'intervals', mapping: pre.body.preview.mapping })
    expect(r.status).toBe(422)
    expect(r.body.data.errors.map(e => [e.row, e.column])).toEqual(demoImportErrors().map(e => [e.row, e.column]))
    const after = await geo.get<{ events: unknown[] }>(`${base}/audit?limit=100`)
    expect(after.body.events.length).toBe(before.body.events.length)
  })
})
