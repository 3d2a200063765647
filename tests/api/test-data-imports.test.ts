// Imports of test data over real HTTP: an oedometer test's stages from a file (one test, replaced in
// one transaction, versioned and audited) and field vane readings (rows added, points checked).
import { beforeEach, describe, expect, it } from 'vitest'
import { signedInDemo, useNewAccount } from '../helpers/http'
import { testBody } from '../helpers/lab'
import { createPoint, useTestProject } from '../helpers/project'
import { upload } from '../helpers/upload'

interface Stage { stress: number, entered: number, voidRatio: number, readings?: { minutes: number, dial: number }[] }
interface TestJson { id: string, version: number, convention: string, e0: number, stages: Stage[] }
interface Report { message: string, data: { errors: { row: number, column: string, message: string }[], mappingProblems?: string[], current?: TestJson } }
interface AuditEvent { action: string, entity: string, entityId: string | null, before: { version: number, convention: string } | null, after: { filename: string, rows: number, readingsKept: number, version: number, convention: string } | null }

// Strain in % of H0 for a specimen with e0 = 2.1 (the helper's estuarine test): e = 2.1 − 3.1·ε/100.
const STAGES_CSV = [
  'Stage,Effective stress (kPa),Strain (%)',
  '1,10,1',
  '2,20,2',
  '3,40,4',
  '4,20,3.5', // unload
  '5,40,4.2', // reload
  '6,80,10',
  '7,160,20',
].join('\n')
const STAGES_E = [2.069, 2.038, 1.976, 1.9915, 1.9698, 1.79, 1.48]

describe('test-data imports', () => {
  const { owner, engineer, reviewer } = signedInDemo('owner', 'engineer', 'reviewer')
  const viewerAccount = useNewAccount(owner, 'tdi-viewer')
  const viewer = viewerAccount.client
  // A project of each test's own: the engineer, the reviewer and a viewer as members, borehole BH-T1 with tube U1.
  const project = useTestProject(owner, 'TDI', 'Test data import site', () => ['engineer', 'reviewer', { email: viewerAccount.email, role: 'viewer' }], { each: true })
  let pointId: string
  let sampleId: string

  beforeEach(async () => {
    pointId = await createPoint(engineer, project.id, { identifier: 'BH-T1' })
    const s = await engineer.post<{ sample: { id: string } }>(`${project.base}/points/${pointId}/samples`, { identifier: 'U1', top: 4.5, bottom: 5, type: 'thin-walled-tube' })
    sampleId = s.body.sample.id
  })

  /** A fresh test (void ratios, e0 = 2.1, H0 = 20 mm) with time readings on its first stage (σ' = 10 kPa). */
  async function freshTest(): Promise<TestJson> {
    const body = testBody(sampleId, `OED-${Date.now().toString(36)}`)
    body.stages[0]!.readings = [{ minutes: 0, dial: 0 }, { minutes: 1, dial: 0.05 }, { minutes: 4, dial: 0.08 }]
    const r = await engineer.post<{ test: TestJson }>(`${project.base}/tests/oedometer`, body)
    expect(r.status).toBe(201)
    return r.body.test
  }
  const getTest = async (id: string) => (await engineer.get<{ test: TestJson }>(`${project.base}/tests/oedometer/${id}`)).body.test
  const audit = async () => (await engineer.get<{ events: AuditEvent[] }>(`${project.base}/audit?limit=100`)).body.events

  async function uploadStages(csv = STAGES_CSV, name = 'stages.csv') {
    const up = await upload<{ importId: string }>(engineer, `${project.base}/imports`, name, csv)
    expect(up.status).toBe(201)
    const pre = await engineer.get<{ preview: { mapping: Record<string, string> } }>(`${project.base}/imports/${up.body.importId}?target=oedometer-stages`)
    return { importId: up.body.importId, mapping: pre.body.preview.mapping }
  }

  it('replaces a test\'s stages from a strain file: values converted, readings kept, version bumped, adoption withdrawn, audited', async () => {
    const test = await freshTest()
    const adopt = await engineer.post<{ adoption: { id: string } }>(`${project.base}/tests/oedometer/${test.id}/adoptions`, { method: 'typed', value: 80, reason: 'from the first curve' })
    expect(adopt.status).toBe(201)
    const { importId, mapping } = await uploadStages()
    expect(mapping).toEqual({ stage: 'Stage', stress: 'Effective stress (kPa)', strain: 'Strain (%)' })

    const dry = await engineer.post<{ rowCount: number }>(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping, testId: test.id, testVersion: test.version, dryRun: true })
    expect(dry.status).toBe(200)
    expect(dry.body.rowCount).toBe(7)
    expect((await getTest(test.id)).version).toBe(1)

    const r = await engineer.post<{ written: number }>(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping, testId: test.id, testVersion: test.version })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect(r.body.written).toBe(7)
    const after = await getTest(test.id)
    expect(after.version).toBe(2)
    expect(after.convention).toBe('strain')
    expect(after.e0).toBe(2.1)
    expect(after.stages.map(s => [s.stress, s.entered])).toEqual([[10, 1], [20, 2], [40, 4], [20, 3.5], [40, 4.2], [80, 10], [160, 20]])
    after.stages.forEach((s, i) => expect(s.voidRatio).toBeCloseTo(STAGES_E[i]!, 10))
    // The first stage keeps its place and its σ' (10 kPa), so its time readings stay; the others had none.
    expect(after.stages[0]!.readings).toEqual([{ minutes: 0, dial: 0 }, { minutes: 1, dial: 0.05 }, { minutes: 4, dial: 0.08 }])
    expect(after.stages.slice(1).every(s => s.readings === undefined)).toBe(true)

    const history = await engineer.get<{ history: { id: string, supersededAt: string | null }[] }>(`${project.base}/tests/oedometer/${test.id}/adoptions`)
    expect(history.body.history.find(a => a.id === adopt.body.adoption.id)!.supersededAt).not.toBeNull()

    const events = await audit()
    const entry = events.find(e => e.entity === 'oedometer-stages' && e.entityId === test.id)!
    expect(entry.action).toBe('import')
    expect(entry.before).toMatchObject({ version: 1, convention: 'void-ratio' })
    expect(entry.after).toMatchObject({ filename: 'stages.csv', rows: 7, readingsKept: 1, version: 2, convention: 'strain' })
    expect(events.some(e => e.action === 'withdraw' && e.entityId === adopt.body.adoption.id)).toBe(true)

    // The same mapping is remembered for the next stage file.
    const next = await upload<{ importId: string }>(engineer, `${project.base}/imports`, 'again.csv', STAGES_CSV)
    const saved = await engineer.get<{ preview: { mappingSource: string } }>(`${project.base}/imports/${next.body.importId}?target=oedometer-stages`)
    expect(saved.body.preview.mappingSource).toBe('saved')
  })

  it('refuses a stale test version with 409 and the current test, writing nothing', async () => {
    const test = await freshTest()
    const patched = await engineer.patch<{ test: TestJson }>(`${project.base}/tests/oedometer/${test.id}`, { remarks: 'edited meanwhile', version: test.version })
    expect(patched.status).toBe(200)
    const { importId, mapping } = await uploadStages()
    const r = await engineer.post<Report>(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping, testId: test.id, testVersion: test.version })
    expect(r.status).toBe(409)
    expect(r.body.data.current!.version).toBe(2)
    const now = await getTest(test.id)
    expect(now.version).toBe(2)
    expect(now.convention).toBe('void-ratio')
    expect(now.stages).toHaveLength(9)
  })

  it('reports a broken stage file row by row (422) and leaves the test and the audit trail as they were', async () => {
    const test = await freshTest()
    const before = await getTest(test.id)
    const eventsBefore = (await audit()).length
    const csv = [
      'stage,stress,e', // 1
      '1,10,2.05', // 2
      '2,-20,2.0', // 3: σ' not positive
      '', // 4: blank, still counted
      '3,40,', // 5: no value
      '4,80,0', // 6: e = 0
      '5,ten,1.8', // 7: not a number
    ].join('\n')
    const { importId, mapping } = await uploadStages(csv, 'broken.csv')
    expect(mapping).toEqual({ stage: 'stage', stress: 'stress', voidRatio: 'e' })
    const r = await engineer.post<Report>(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping, testId: test.id, testVersion: test.version })
    expect(r.status).toBe(422)
    expect(r.body.data.errors).toEqual([
      { row: 3, column: 'stress', message: 'Stage 2: the effective stress must be a positive number (got -20 kPa).' },
      { row: 5, column: 'e', message: 'Void ratio e is empty.' },
      { row: 6, column: 'e', message: 'Stage 4: the void ratio 0 is not positive; the void ratio must stay above 0.' },
      { row: 7, column: 'stress', message: 'Effective stress σ\' (kPa) "ten" is not a number.' },
    ])
    expect(r.body.message).toMatch(/^4 problem\(s\) in broken\.csv; nothing was imported/)
    expect(await getTest(test.id)).toEqual(before)
    expect((await audit()).length).toBe(eventsBefore)
  })

  it('asks for exactly one value column, and for the test', async () => {
    const test = await freshTest()
    const { importId } = await uploadStages('stress,e,strain\n10,2,1\n')
    const two = await engineer.post<Report>(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping: { stress: 'stress', voidRatio: 'e', strain: 'strain' }, testId: test.id, testVersion: 1 })
    expect(two.status).toBe(422)
    expect(two.body.data.mappingProblems).toEqual(['Map only one of Void ratio e, Strain ε (%), Compression Δh (mm): it sets how the stages are read.'])
    const noTest = await engineer.post(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping: { stress: 'stress', voidRatio: 'e' } })
    expect(noTest.status).toBe(400)
    const otherTest = await engineer.post(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping: { stress: 'stress', voidRatio: 'e' }, testId: '00000000-0000-4000-8000-000000000000', testVersion: 1 })
    expect(otherTest.status).toBe(404)
  })

  it('lets neither a viewer nor a reviewer commit a stage file', async () => {
    const test = await freshTest()
    const { importId, mapping } = await uploadStages()
    for (const c of [viewer, reviewer]) {
      const r = await c.post(`${project.base}/imports/${importId}/commit`, { target: 'oedometer-stages', mapping, testId: test.id, testVersion: test.version })
      expect(r.status).toBe(403)
      expect((await upload(c, `${project.base}/imports`, 's.csv', STAGES_CSV)).status).toBe(403)
    }
    expect((await getTest(test.id)).version).toBe(1)
  })

  it('adds vane readings to the points the file names and reads them back', async () => {
    const csv = 'Point,Depth (m),Peak su (kPa),Remoulded su (kPa)\nBH-T1,4,18.5,4.2\nBH-T1,5,21.0,\nBH-T1,6,24.3,5.9\n'
    const up = await upload<{ importId: string }>(engineer, `${project.base}/imports`, 'vane.csv', csv)
    const pre = await engineer.get<{ preview: { mapping: Record<string, string> } }>(`${project.base}/imports/${up.body.importId}?target=vane`)
    expect(pre.body.preview.mapping).toEqual({ point: 'Point', depth: 'Depth (m)', peak: 'Peak su (kPa)', remoulded: 'Remoulded su (kPa)' })
    const r = await engineer.post<{ written: number }>(`${project.base}/imports/${up.body.importId}/commit`, { target: 'vane', mapping: pre.body.preview.mapping })
    expect(r.status, JSON.stringify(r.body)).toBe(200)
    expect(r.body.written).toBe(3)
    const point = await engineer.get<{ vane: { depth: number, peak: number, remoulded: number | null }[] }>(`${project.base}/points/${pointId}`)
    expect(point.body.vane.map(v => [v.depth, v.peak, v.remoulded])).toEqual([[4, 18.5, 4.2], [5, 21, null], [6, 24.3, 5.9]])
    expect((await audit()).find(e => e.entity === 'vane' && e.action === 'import')!.after).toMatchObject({ filename: 'vane.csv', rows: 3 })
  })

  it('refuses a vane file with an unknown point, a reading already there or a bad strength, adding nothing', async () => {
    for (const [depth, peak] of [[4, 18.5], [5, 21], [6, 24.3]] as const) expect((await engineer.post(`${project.base}/points/${pointId}/vane`, { depth, peak })).status).toBe(201)
    const csv = 'hole,depth,su,sur\nBH-T1,7,20,\nBH-99,4,20,\nBH-T1,4,19,\nBH-T1,8,-3,\n'
    const up = await upload<{ importId: string }>(engineer, `${project.base}/imports`, 'vane-bad.csv', csv)
    const r = await engineer.post<Report>(`${project.base}/imports/${up.body.importId}/commit`, { target: 'vane', mapping: { point: 'hole', depth: 'depth', peak: 'su', remoulded: 'sur' } })
    expect(r.status).toBe(422)
    expect(r.body.data.errors).toEqual([
      { row: 3, column: 'hole', message: 'Point BH-99 is not in this project.' },
      { row: 4, column: 'depth', message: 'BH-T1 already has a vane reading at 4 m.' },
      { row: 5, column: 'su', message: 'Peak su (kPa) must be above 0 kPa.' },
    ])
    const point = await engineer.get<{ vane: { depth: number }[] }>(`${project.base}/points/${pointId}`)
    expect(point.body.vane.map(v => v.depth)).toEqual([4, 5, 6])
    const denied = await reviewer.post(`${project.base}/imports/${up.body.importId}/commit`, { target: 'vane', mapping: { point: 'hole', depth: 'depth', peak: 'su' } })
    expect(denied.status).toBe(403)
  })
})
