// Settlement runs over real HTTP: the contract (create, read, list, a point's table, exports,
// delete by the creator), the 422 refusals of runs the site or model cannot take, 400 shapes and 404s.
import pg from 'pg'
import * as XLSX from 'xlsx-republish'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { RESULT_CAUTION } from '../../shared/caution'
import type { RunPointDetail, SettlementRun, SettlementRunList, SettlementRunView } from '../../shared/types/settlement-runs'
import { demoProjectId, signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { scenarioDefinition } from '../helpers/scenario-definition'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

interface Created { run: { id: string, status: string } }

describe('settlement runs', () => {
  const { owner, engineer, designer, reviewer } = signedInDemo('owner', 'engineer', 'designer', 'reviewer')
  let base: string
  let model: { modelId: string, version: number, url: string }
  let runId: string

  beforeAll(async () => {
    base = (await createProject(owner, 'SR', 'Settlement runs site', ['engineer', 'designer', 'reviewer'])).base
    model = await createRunModel(engineer, base.split('/').pop()!)
    const r = await designer.post<Created>(`${base}/settlement-runs`, smallRunBody(model))
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    runId = r.body.run.id
  })

  it('creates a small run at once: 201 with its id and status, finished', async () => {
    const r = await designer.post<Created>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Again' }))
    expect(r.status).toBe(201)
    expect(Object.keys(r.body)).toEqual(['run'])
    expect(Object.keys(r.body.run).sort()).toEqual(['id', 'status'])
    expect(r.body.run.status).toBe('finished')
    expect(r.body.run.id).toMatch(/^[0-9a-f-]{36}$/)
  })

  it('reads the run with its inputs, model and results (the centre settles most, the outside point least)', async () => {
    const { run } = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}`))
    expect(run.status).toBe('finished')
    expect(run.progress).toBe(1)
    expect(run.error).toBeNull()
    expect(run.model).toMatchObject({ modelId: model.modelId, modelName: 'Run model', version: 1, status: 'saved', approvedBy: null, approvedAt: null })
    expect(run.createdBy?.name).toBe('Sam Okafor')
    expect(run.loads).toEqual([expect.objectContaining({ type: 'rectangle', width: 40, length: 30, pressure: 100, rotation: 0 })])
    expect(run.options.maxSublayerThickness).toBe(0.25)
    expect(run.grid).toBeNull()
    const pts = run.results!.points
    expect(pts.map(p => p.label)).toEqual(['Centre', 'Corner', 'Outside'])
    // 100 kPa on the scenario's soft clay: the centre settles some decimetres (a plausibility band, not a reference value).
    expect(pts[0]!.settlement).toBeGreaterThan(0.2)
    expect(pts[0]!.settlement).toBeLessThan(3)
    expect(pts[1]!.settlement).toBeLessThan(pts[0]!.settlement)
    expect(pts[2]!.settlement).toBeLessThan(pts[1]!.settlement)
    // Δσ at the surface: the full pressure under the centre (common practice: a flexible load transmits its pressure at its base).
    expect(pts[0]!.surfaceStressIncrease).toBeCloseTo(100, 0)
    expect(run.results!.maximum).toMatchObject({ label: 'Centre', settlement: pts[0]!.settlement })
    expect(run.results!.caution).toBe(RESULT_CAUTION)
  })

  it('reads the run without its points\' time curves on ?curves=none, everything else the same; 400 for another value', async () => {
    const whole = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}`))
    const explicit = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}?curves=all`))
    expect(explicit).toEqual(whole)
    const { run } = await must('view', reviewer.get<{ run: SettlementRunView }>(`${base}/settlement-runs/${runId}?curves=none`))
    expect(whole.run.results!.points.every(p => (p.curve?.years.length ?? 0) > 3)).toBe(true)
    const points = run.results!.points
    expect(points.map(p => p.label)).toEqual(['Centre', 'Corner', 'Outside'])
    expect(points.some(p => 'curve' in p)).toBe(false)
    expect(points).toEqual(whole.run.results!.points.map(({ curve: _curve, ...rest }) => rest))
    const { results: _wholeResults, ...wholeRest } = whole.run
    const { results: _viewResults, ...viewRest } = run
    expect(viewRest).toEqual(wholeRest)
    const { points: _wp, ...wholeHead } = whole.run.results!
    const { points: _vp, ...viewHead } = run.results!
    expect(viewHead).toEqual(wholeHead)
    const bad = await reviewer.get<{ data: { issues: { path: string }[] } }>(`${base}/settlement-runs/${runId}?curves=some`)
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map(i => i.path)).toContain('curves')
  })

  it('lists runs newest first with the headline figures', async () => {
    const list = await must('list', reviewer.get<SettlementRunList>(`${base}/settlement-runs`))
    expect(list.total).toBeGreaterThanOrEqual(1)
    const row = list.runs.find(r => r.id === runId)!
    const { run } = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}`))
    expect(row).toMatchObject({ name: 'Small slab', status: 'finished', loadCount: 1, pointCount: 3, gridPoints: 0 })
    expect(row.headline!.maxSettlement).toBeCloseTo(run.results!.points[0]!.settlement, 9)
    expect(row.headline!.maxAt).toEqual({ x: 0, y: 0, label: 'Centre' })
    expect(row.headline!.maxAngularDistortion).toBeNull()
    const t90s = run.results!.points.map(p => p.t90).filter((t): t is number => t !== null)
    if (t90s.length) expect(row.headline!.t90).toBeCloseTo(Math.max(...t90s), 9)
    const paged = await must('page', reviewer.get<SettlementRunList>(`${base}/settlement-runs?limit=1&offset=0`))
    expect(paged.runs).toHaveLength(1)
    expect(paged.total).toBe(list.total)
    expect((await reviewer.get(`${base}/settlement-runs?limit=0`)).status).toBe(400)
  })

  it('answers one point with its sublayer table; 404 beyond the points or for a malformed index', async () => {
    const { point } = await must('point', reviewer.get<{ point: RunPointDetail }>(`${base}/settlement-runs/${runId}/points/0`))
    expect(point.index).toBe(0)
    expect(point.label).toBe('Centre')
    expect(point.sublayers.length).toBeGreaterThan(10)
    const sum = point.sublayers.reduce((s, l) => s + l.compression, 0)
    expect(sum).toBeCloseTo(point.settlement, 6)
    expect((await reviewer.get(`${base}/settlement-runs/${runId}/points/3`)).status).toBe(404)
    expect((await reviewer.get(`${base}/settlement-runs/${runId}/points/x`)).status).toBe(404)
  })

  it('exports the run as a workbook and as JSON, named after the run, with the caution', async () => {
    const x = await fetch(`${designer.base}${base}/settlement-runs/${runId}/export?format=xlsx`, { headers: { cookie: designer.cookie } })
    expect(x.status).toBe(200)
    expect(x.headers.get('content-disposition')).toContain('filename="Small_slab.xlsx"')
    const wb = XLSX.read(Buffer.from(await x.arrayBuffer()), { type: 'buffer' })
    expect(wb.SheetNames).toEqual(['Inputs', 'Points', 'Sublayers', 'Time curves', 'Grid'])
    const inputs = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Inputs!, { header: 1 })
    expect(inputs.find(r => r[0] === 'Caution')?.[1]).toBe(RESULT_CAUTION)
    const points = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Points!, { header: 1 })
    const { run } = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}`))
    expect(points[1]![0]).toBe('Centre')
    expect(points[1]![3]).toBeCloseTo(run.results!.points[0]!.settlement, 9)
    const sub = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Sublayers!, { header: 1 })
    expect(new Set(sub.slice(1).map(r => r[0]))).toEqual(new Set(['Centre', 'Corner', 'Outside']))

    const j = await reviewer.get<{ caution: string, run: SettlementRun, points: RunPointDetail[] }>(`${base}/settlement-runs/${runId}/export?format=json`)
    expect(j.status).toBe(200)
    expect(j.headers.get('content-disposition')).toContain('filename="Small_slab.json"')
    expect(j.body.caution).toBe(RESULT_CAUTION)
    expect(j.body.run.id).toBe(runId)
    expect(j.body.points).toHaveLength(3)
    expect((await reviewer.get(`${base}/settlement-runs/${runId}/export?format=pdf`)).status).toBe(400)
  })

  it('refuses runs the site or the model cannot take with 422 and the plain reason', async () => {
    const far = await designer.post<{ message: string, data: { code: string } }>(`${base}/settlement-runs`, smallRunBody(model, { loads: [{ type: 'circle', x: 4990, y: 0, radius: 20, pressure: 50 }] }))
    expect(far.status).toBe(422)
    expect(far.body.data.code).toBe('load-off-site')
    expect(far.body.message).toMatch(/beyond ±5000 m/)
    const big = await designer.post<{ message: string, data: { code: string } }>(`${base}/settlement-runs`, smallRunBody(model, { grid: { spacing: 1, margin: 100 } }))
    expect(big.status).toBe(422)
    expect(big.body.data.code).toBe('grid-too-large')
    expect(big.body.message).toMatch(/limit is 10000/)

    const def = scenarioDefinition()
    const est = def.strata.find(s => s.code === 'EST')!
    delete est.compressibility
    const noCc = await createRunModel(engineer, base.split('/').pop()!, def, 'Without Cc')
    const r = await designer.post<{ message: string, data: { code: string } }>(`${base}/settlement-runs`, smallRunBody(noCc))
    expect(r.status).toBe(422)
    expect(r.body.data.code).toBe('compressibility-missing')
    expect(r.body.message).toContain('Estuarine clay')
    const none = await pool.query('select count(*)::int as n from settlement_runs where model->>\'modelId\' = $1', [noCc.modelId])
    expect(none.rows[0].n).toBe(0)

    // σ'v0 ≤ 0: saving refuses such a version, so one is written into the database to reach the run's own check.
    const uplift = await createRunModel(engineer, base.split('/').pop()!, scenarioDefinition(), 'Uplift')
    const bad = scenarioDefinition()
    bad.groundwater.piezometers = [{ depth: 6, porePressure: 300 }]
    await pool.query('update site_model_versions set definition = $2 where model_id = $1 and version = 1', [uplift.modelId, JSON.stringify(bad)])
    const u = await designer.post<{ message: string, data: { code: string, depth?: number } }>(`${base}/settlement-runs`, smallRunBody(uplift))
    expect(u.status).toBe(422)
    expect(u.body.data.code).toBe('effective-stress-not-positive')
    expect(u.body.message).toContain('Desiccated crust')
  })

  it('records an engine refusal met while computing as a failed run with the plain reason (201, never a 500)', async () => {
    const body = smallRunBody(model, { name: 'Deep excavation', loads: [{ type: 'rectangle', x: 0, y: 0, width: 40, length: 30, pressure: -500 }] })
    const c = await must('failing run', designer.post<Created>(`${base}/settlement-runs`, body), 201)
    expect(c.run.status).toBe('failed')
    const { run } = await must('read', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${c.run.id}`))
    expect(run.status).toBe('failed')
    expect(run.results).toBeNull()
    expect(run.error?.code).toBe('final-effective-stress-not-positive')
    const view = await must('view', reviewer.get<{ run: SettlementRunView }>(`${base}/settlement-runs/${c.run.id}?curves=none`))
    expect(view.run).toEqual(run)
    expect(run.error?.message).toContain('Desiccated crust')
    const point = await reviewer.get<{ data: { status: string } }>(`${base}/settlement-runs/${c.run.id}/points/0`)
    expect(point.status).toBe(409)
    expect(point.body.data.status).toBe('failed')
    expect((await reviewer.get(`${base}/settlement-runs/${c.run.id}/export?format=xlsx`)).status).toBe(409)
    const list = await must('list', reviewer.get<SettlementRunList>(`${base}/settlement-runs`))
    expect(list.runs.find(r => r.id === c.run.id)?.headline).toBeNull()
  })

  it('refuses shapes with 400 and names the field', async () => {
    const cases: unknown[] = [
      {},
      smallRunBody(model, { loads: [] }),
      smallRunBody(model, { points: [], grid: undefined }),
      smallRunBody(model, { loads: [{ type: 'rectangle', x: 0, y: 0, width: 10, length: 10 }] }),
      smallRunBody(model, { loads: [{ type: 'rectangle', x: 0, y: 0, width: 10, length: 10, pressure: 10, fill: { thickness: 1, unitWeight: 20 } }] }),
      smallRunBody(model, { options: { maxSublayerThickness: 0 } }),
      smallRunBody(model, { name: 'x'.repeat(121) }),
    ]
    for (const body of cases) {
      const r = await designer.post<{ data: { issues: { path: string }[] } }>(`${base}/settlement-runs`, body)
      expect(r.status, JSON.stringify(body).slice(0, 200)).toBe(400)
      expect(r.body.data.issues.length).toBeGreaterThan(0)
    }
  })

  it('answers 404 for an unknown version, another project\'s model or run', async () => {
    expect((await designer.post(`${base}/settlement-runs`, smallRunBody({ ...model, version: 9 }))).status).toBe(404)
    const other = await createProject(owner, 'SR2', 'Another site', ['engineer', 'designer'])
    const otherModel = await createRunModel(engineer, other.id)
    expect((await designer.post(`${base}/settlement-runs`, smallRunBody(otherModel))).status).toBe(404)
    const theirs = await must('their run', designer.post<Created>(`${other.base}/settlement-runs`, smallRunBody(otherModel)), 201)
    expect((await designer.get(`${base}/settlement-runs/${theirs.run.id}`)).status).toBe(404)
    expect((await designer.get(`${base}/settlement-runs/${theirs.run.id}/points/0`)).status).toBe(404)
    expect((await designer.get(`${base}/settlement-runs/${theirs.run.id}/export?format=json`)).status).toBe(404)
    expect((await designer.delete(`${base}/settlement-runs/${theirs.run.id}`)).status).toBe(404)
  })

  it('records the approval the version had when the run was made', async () => {
    const rereviewerId = (await pool.query('select id from users where email like \'priya%\' limit 1')).rows[0]?.id as string | undefined
    const approvedModel = await createRunModel(engineer, base.split('/').pop()!, scenarioDefinition(), 'Approved model')
    await pool.query('update site_model_versions set status = \'approved\', decided_by = $2, decided_at = now() where model_id = $1 and version = 1', [approvedModel.modelId, rereviewerId ?? null])
    const c = await must('run', designer.post<Created>(`${base}/settlement-runs`, smallRunBody(approvedModel)), 201)
    const { run } = await must('read', designer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${c.run.id}`))
    expect(run.model.status).toBe('approved')
    expect(run.model.approvedAt).not.toBeNull()
    if (rereviewerId) expect(run.model.approvedBy).toBe('Priya Natarajan')
  })

  it('deletes a run for its creator only (204), another member 403, and audits it', async () => {
    const c = await must('run', designer.post<Created>(`${base}/settlement-runs`, smallRunBody(model, { name: 'To delete' })), 201)
    expect((await engineer.delete(`${base}/settlement-runs/${c.run.id}`)).status).toBe(403)
    expect((await owner.delete(`${base}/settlement-runs/${c.run.id}`)).status).toBe(403)
    expect((await designer.delete(`${base}/settlement-runs/${c.run.id}`)).status).toBe(204)
    expect((await designer.get(`${base}/settlement-runs/${c.run.id}`)).status).toBe(404)
    const points = await pool.query('select count(*)::int as n from settlement_run_points where run_id = $1', [c.run.id])
    expect(points.rows[0].n).toBe(0)
    const audit = await pool.query('select action from audit_events where entity = \'settlement-run\' and entity_id = $1 order by at', [c.run.id])
    expect(audit.rows.map(r => r.action)).toEqual(['create', 'delete'])
  })
})

describe('the demo\'s settlement run', () => {
  const { designer } = signedInDemo('designer')

  it('is seeded finished on the approved Yard model version 1, with the yard\'s points and a 5 m grid', async () => {
    const projectId = await demoProjectId(designer)
    const list = await must('list', designer.get<SettlementRunList>(`/api/projects/${projectId}/settlement-runs`))
    const seeded = list.runs.find(r => r.name === 'Yard embankment, 6 m on version 1')
    expect(seeded).toBeDefined()
    expect(seeded!.status).toBe('finished')
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${seeded!.id}`))
    expect(run.model).toMatchObject({ modelName: 'Yard model', version: 1, status: 'approved', approvedBy: 'Priya Natarajan' })
    expect(run.createdBy?.name).toBe('Sam Okafor')
    // The yard (easting 50–170 m, northing 40–120 m) is the toe: crest 96 m × 56 m for 6 m at 2:1.
    expect(run.loads).toEqual([expect.objectContaining({ type: 'embankment', x: 110, y: 80, crestWidth: 96, crestLength: 56, height: 6, sideSlope: 2, unitWeight: 20 })])
    expect(run.points.map(p => p.label)).toEqual(['Yard centre', 'South-west corner', 'South edge, middle', 'BH-03'])
    expect(run.points[3]).toMatchObject({ x: 157.6, y: 56.3 })
    expect(run.points[3]!.pointId).toMatch(/^[0-9a-f-]{36}$/)
    expect(run.grid).toEqual({ spacing: 5, margin: 10 })
    const [centre, corner, edge] = run.results!.points
    // 120 kPa over the scenario's 11.6 m of soft estuarine clay: metre-scale at the centre (plausibility band).
    expect(centre!.settlement).toBeGreaterThan(0.5)
    expect(centre!.settlement).toBeLessThan(4)
    expect(corner!.settlement).toBeLessThan(edge!.settlement)
    expect(edge!.settlement).toBeLessThan(centre!.settlement)
    expect(run.results!.grid!.xs[0]).toBe(40)
    expect(run.results!.grid!.xs).toHaveLength(29)
    expect(run.results!.grid!.ys).toHaveLength(21)
  })
})
