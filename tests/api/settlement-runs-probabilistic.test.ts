// Probabilistic settlement runs (options.probabilistic): the scatter "from the data" (the demo's tests,
// checked against the oedometer list with simple-statistics), the run through the queue with its
// blocks per point, grid and set-up, the 422s, the same numbers for the same seed, cancel (200, 403,
// 409, nothing written after it), and a killed worker's run restarted and never half-written.
import { mean, sampleStandardDeviation } from 'simple-statistics'
import { beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { RUN_SCATTER_DEFAULT_COV } from '../../shared/schemas/settlement-run-limits'
import type { RunScatterReply, SettlementRun } from '../../shared/types/settlement-runs'
import * as XLSX from 'xlsx-republish'
import { RESULT_CAUTION } from '../../shared/caution'
import { Client, demoEmail, demoProjectId, signedInDemo } from '../helpers/http'
import { pdfPagesText, pdfPageToPng } from '../helpers/pdf'
import { createProject, must } from '../helpers/project'
import { until, useRunRows, useStandaloneWorkers } from '../helpers/run-worker'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const { pool, row } = useRunRows()


describe('the scatter "from the data" of the demo\'s yard model', () => {
  const { engineer, reviewer } = signedInDemo('engineer', 'reviewer')

  it('gives each compressible stratum its COVs from the tests, n shown, and defaults below three tests', async () => {
    const projectId = await demoProjectId(engineer)
    const base = `/api/projects/${projectId}`
    const models = await must('models', engineer.get<{ models: { id: string, name: string }[] }>(`${base}/models`))
    const yard = models.models.find(m => m.name === 'Yard model')!
    // Any member reads it (a reviewer too).
    const reply = await must('scatter', reviewer.get<RunScatterReply>(`${base}/settlement-runs/scatter?modelId=${yard.id}&version=1`))
    const version = await must('version', engineer.get<{ version: { definition: { strata: { code: string, compressible: boolean }[], flagsInForce: { targetType: string, targetId: string, verdict: string }[] } } }>(`${base}/models/${yard.id}/versions/1`))
    expect(reply.strata.map(s => s.code)).toEqual(version.version.definition.strata.filter(s => s.compressible).map(s => s.code))

    // The oracle: the oedometer list, very poor samples and the version's exclusions left out, sample sd / mean by simple-statistics.
    const list = await must('tests', engineer.get<{ tests: { id: string, stratumCode: string | null, e0: number | null, reading: { qualityClass: string | null, cc: number | null, cr: number | null } }[] }>(`${base}/tests/oedometer?limit=500`))
    const excluded = new Set(version.version.definition.flagsInForce.filter(f => f.targetType === 'oedometer-test' && f.verdict === 'exclude').map(f => f.targetId))
    let checked = 0
    for (const s of reply.strata) {
      const use = list.tests.filter(t => t.stratumCode === s.code && !excluded.has(t.id) && t.reading.qualityClass !== 'very-poor' && t.reading.cc !== null && t.reading.cr !== null && t.e0 !== null)
      const cc = s.variables.find(v => v.variable === 'cc')!
      expect(cc.n).toBe(use.length)
      if (use.length >= 3) {
        const xs = use.map(t => t.reading.cc!)
        expect(cc.source).toBe('data')
        expect(cc.cov).toBeCloseTo(sampleStandardDeviation(xs) / mean(xs), 10)
        const e0 = use.map(t => t.e0!)
        expect(s.variables.find(v => v.variable === 'e0')!.cov).toBeCloseTo(sampleStandardDeviation(e0) / mean(e0), 10)
        checked++
      }
      else {
        expect(cc).toMatchObject({ source: 'default', cov: RUN_SCATTER_DEFAULT_COV.cc })
      }
      const pc = s.variables.find(v => v.variable === 'preconsolidation')!
      if (pc.trend) expect(pc).toMatchObject({ source: 'data', cov: 0 })
      else expect(pc).toMatchObject({ source: 'default', cov: RUN_SCATTER_DEFAULT_COV.preconsolidation })
    }
    // The demo logs enough tests in at least one stratum for COVs from the data.
    expect(checked).toBeGreaterThan(0)
    // A fitted σ'p trend of the demo is drawn as whole lines.
    expect(reply.strata.some(s => s.variables.some(v => v.variable === 'preconsolidation' && v.trend === true))).toBe(true)
  })

  it('is 404 for a model not of the project and 400 for a bad query', async () => {
    const projectId = await demoProjectId(engineer)
    const base = `/api/projects/${projectId}/settlement-runs/scatter`
    expect((await engineer.get(`${base}?modelId=00000000-0000-4000-8000-000000000000&version=1`)).status).toBe(404)
    expect((await engineer.get(`${base}?modelId=nope&version=1`)).status).toBe(400)
  })
})

describe('the demo\'s yard run', () => {
  const { designer } = signedInDemo('designer')
  it('is seeded probabilistic from the data, its grid light', async () => {
    const projectId = await demoProjectId(designer)
    const list = await must('list', designer.get<{ runs: { id: string, name: string }[] }>(`/api/projects/${projectId}/settlement-runs`))
    const seeded = list.runs.find(r => r.name === 'Yard embankment, 6 m on version 1')!
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${seeded.id}`))
    const setup = run.results!.probabilistic!
    expect(setup).toMatchObject({ realizations: 2000, seed: 417, fromData: true, limit: 1.5 })
    expect(setup.strata.some(s => s.variables.some(v => v.source === 'data' && v.n >= 3))).toBe(true)
    const centre = run.results!.points[0]!.probabilistic!
    expect(centre.quantiles.p50).toBeGreaterThan(0.5)
    expect(centre.quantiles.p95).toBeGreaterThan(centre.quantiles.p50)
    expect(run.results!.grid!.probabilistic!.realizations).toBe(100)
  })
})

describe('probabilistic settlement runs', () => {
  const { owner, engineer, designer } = signedInDemo('owner', 'engineer', 'designer')
  let project: { id: string, base: string }
  let model: { modelId: string, version: number }

  beforeAll(async () => {
    project = await createProject(owner, 'SRP', 'Probabilistic runs site', ['engineer', 'designer'])
    model = await createRunModel(engineer, project.id)
  })

  async function finished(runId: string, who: Client = designer): Promise<SettlementRun> {
    return until('run', async () => (await must('read', who.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${runId}`))).run, r => r.status === 'finished' || r.status === 'failed' || r.status === 'cancelled')
  }

  const probabilistic = { realizations: 2000, seed: 11, limit: 0.4, layers: { EST: { cc: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.4 } }, GLA: { cc: { cov: 0.2 } } } }
  function body(name: string, extra: Record<string, unknown> = {}, p: Record<string, unknown> = probabilistic) {
    return smallRunBody(model, { name, points: [{ label: 'Centre', x: 0, y: 0 }, { label: 'Corner', x: 20, y: 15 }], options: { probabilistic: p }, ...extra })
  }

  let gridRun: SettlementRun

  it('is queued even when small, and answers per point, per grid node and with its set-up', async () => {
    const created = await must('create', designer.post<{ run: { id: string, status: string } }>(`${project.base}/settlement-runs`, body('Probabilistic slab', { grid: { spacing: 10, margin: 5 } })), 201)
    expect(created.run.status).toBe('queued')
    const run = await finished(created.run.id)
    expect(run.status).toBe('finished')
    gridRun = run
    const r = run.results!
    for (const point of r.points) {
      const p = point.probabilistic!
      expect(p.realizations).toBe(2000)
      expect(p.deterministic).toBeCloseTo(point.settlement, 9)
      expect(p.quantiles.p05).toBeLessThan(p.quantiles.p50)
      expect(p.quantiles.p50).toBeLessThan(p.quantiles.p95)
      expect(p.sd).toBeGreaterThan(0)
      expect(p.histogram.counts.reduce((a, b) => a + b, 0)).toBe(2000)
      expect(p.exceedanceCurve.settlement.length).toBe(p.exceedanceCurve.probability.length)
      expect(p.exceedance!.limit).toBe(0.4)
      expect(p.t90!.quantiles.p50).toBeGreaterThan(0)
      expect(new Set(p.sensitivity.map(s => s.stratum))).toEqual(new Set(['EST', 'GLA']))
      // Ranked by |rank correlation|; the thick estuarine clay's parameters lead.
      const size = p.sensitivity.map(e => Math.abs(e.rankCorrelation))
      expect([...size].sort((a, b) => b - a)).toEqual(size)
      expect(p.sensitivity[0]!.stratum).toBe('EST')
    }
    const g = r.grid!.probabilistic!
    expect(g.realizations).toBe(1000)
    expect(g.p50).toHaveLength(r.grid!.ys.length)
    expect(g.p95[0]).toHaveLength(r.grid!.xs.length)
    expect(g.p95[2]![2]!).toBeGreaterThan(g.p50[2]![2]!)
    expect(r.probabilistic).toMatchObject({ realizations: 2000, seed: 11, ccE0Correlation: 0.5, limit: 0.4, fromData: false })
    expect(r.probabilistic!.threads).toBeGreaterThanOrEqual(1)
    expect(r.probabilistic!.strata.find(s => s.code === 'EST')!.variables).toEqual([
      { variable: 'cc', cov: 0.3, source: 'entered', n: 0 },
      { variable: 'e0', cov: 0.1, source: 'entered', n: 0 },
      { variable: 'cv', cov: 0.4, source: 'entered', n: 0 },
    ])
    expect(r.probabilistic!.warnings.some(w => /grid's P50 and P95 are from 1000 realisations per node/.test(w))).toBe(true)
    // The live pages heard of it as it went.
    const events = await pool.query('select count(*)::int as n from live_events where type = \'run.changed\' and entity_id = $1', [created.run.id])
    expect(events.rows[0].n).toBeGreaterThanOrEqual(3)
  })

  it('exports the blocks: a Probabilistic sheet in the project\'s units, the JSON in SI, the report\'s section', async () => {
    const url = `${project.base}/settlement-runs/${gridRun.id}`
    const x = await fetch(`${designer.base}${url}/export?format=xlsx`, { headers: { cookie: designer.cookie } })
    expect(x.status).toBe(200)
    const wb = XLSX.read(Buffer.from(await x.arrayBuffer()), { type: 'buffer' })
    expect(wb.SheetNames).toContain('Probabilistic')
    const rows = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Probabilistic!, { header: 1 })
    expect(rows.find(r => r[0] === 'Realisations')?.[1]).toBe(2000)
    expect(rows).toContainEqual(['EST (Estuarine clay)', 'cc', 0.3, 'entered', 0])
    const head = rows.findIndex(r => r[0] === 'Point' && r[4] === 'P5 (m)')
    expect(head).toBeGreaterThan(0)
    const centre = rows[head + 1]!
    const b = gridRun.results!.points[0]!.probabilistic!
    expect(centre[0]).toBe('Centre')
    expect(centre[6]).toBeCloseTo(b.quantiles.p50, 9)
    expect(centre[8]).toBeCloseTo(b.quantiles.p95, 9)
    expect(centre[9]).toBe(b.exceedance!.probability)
    expect(rows.some(r => r[0] === 'Centre' && r[1] === b.sensitivity[0]!.stratum && typeof r[3] === 'number')).toBe(true)
    const json = await must('json', designer.get<{ units: { length: string }, run: SettlementRun }>(`${url}/export?format=json`))
    expect(json.units.length).toBe('m')
    expect(json.run.results!.points[0]!.probabilistic).toEqual(b)
    expect(json.run.results!.probabilistic!.realizations).toBe(2000)
    const pdf = await fetch(`${designer.base}${url}/report.pdf`, { headers: { cookie: designer.cookie } })
    expect(pdf.status).toBe(200)
    const bytes = new Uint8Array(await pdf.arrayBuffer())
    const pages = pdfPagesText(bytes)
    const at = pages.findIndex(t => t.includes('How sure is the settlement?'))
    expect(at).toBeGreaterThan(0)
    const page = pages[at]!.replace(/\s+/g, ' ')
    expect(page).toContain('P50 is the settlement that half of these outcomes stay below')
    expect(page).toContain((b.quantiles.p95 * 1000).toFixed(1))
    expect(page).toContain('not all uncertainty')
    expect(page).toContain(RESULT_CAUTION.slice(0, 60))
    pdfPageToPng(bytes, 'report-settlement-run-probabilistic', at + 1)
  })

  it('gives the same numbers for the same inputs and seed, and others for another seed', async () => {
    const a = await must('a', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('Seed 11 a')), 201)
    const b = await must('b', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('Seed 11 b')), 201)
    const c = await must('c', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('Seed 12', {}, { ...probabilistic, seed: 12 })), 201)
    const [ra, rb, rc] = [await finished(a.run.id), await finished(b.run.id), await finished(c.run.id)]
    const blocks = (r: SettlementRun) => r.results!.points.map(p => p.probabilistic)
    expect(blocks(rb)).toEqual(blocks(ra))
    expect(rc.results!.points[0]!.probabilistic!.mean).not.toBe(ra.results!.points[0]!.probabilistic!.mean)
  })

  it('"from the data" in a project without tests: every COV its stated default, n 0, said as assumed', async () => {
    const created = await must('create', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('From the data', {}, { realizations: 500, fromData: true, layers: { EST: { cc: { cov: 0.35 } } } })), 201)
    const run = await finished(created.run.id)
    expect(run.status).toBe('finished')
    const setup = run.results!.probabilistic!
    expect(setup.fromData).toBe(true)
    const est = setup.strata.find(s => s.code === 'EST')!
    expect(est.variables.find(v => v.variable === 'cc')).toEqual({ variable: 'cc', cov: 0.35, source: 'entered', n: 0 })
    expect(est.variables.find(v => v.variable === 'e0')).toEqual({ variable: 'e0', cov: RUN_SCATTER_DEFAULT_COV.e0, source: 'default', n: 0 })
    // No σ'p points in this project: the version's trend cannot be refitted, so σ'p scatters by its default COV.
    expect(est.variables.find(v => v.variable === 'preconsolidation')).toMatchObject({ source: 'default', cov: RUN_SCATTER_DEFAULT_COV.preconsolidation })
    expect(setup.warnings.some(w => w.startsWith('Stratum GLA: fewer than 3 usable tests'))).toBe(true)
  })

  it('refuses a stratum the version lacks, one not compressible, and too much work (422, plain reasons)', async () => {
    const unknown = await designer.post<{ message: string, data: { code: string, issues: { path: string }[] } }>(`${project.base}/settlement-runs`, body('Unknown', {}, { layers: { XYZ: { cc: { cov: 0.2 } } } }))
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.code).toBe('stratum-unknown')
    expect(unknown.body.message).toBe('options.probabilistic.layers names stratum XYZ, which is not in the run\'s model version. Strata there: MG, CRUST, EST, GLA, SAND.')
    expect(unknown.body.data.issues[0]!.path).toBe('options.probabilistic.layers.XYZ')
    const sand = await designer.post<{ message: string }>(`${project.base}/settlement-runs`, body('Sand', {}, { layers: { SAND: { cc: { cov: 0.2 } } } }))
    expect(sand.status).toBe(422)
    expect(sand.body.message).toMatch(/stratum SAND \(Dense sand\), which is not compressible/)
    const points = Array.from({ length: 20 }, (_, i) => ({ label: `P${i}`, x: i, y: 0 }))
    const heavy = await designer.post<{ message: string, data: { code: string } }>(`${project.base}/settlement-runs`, body('Heavy', { points, options: { maxSublayerThickness: 0.05, probabilistic: { realizations: 100_000 } } }))
    expect(heavy.status).toBe(422)
    expect(heavy.body.data.code).toBe('too-much-work')
    expect(heavy.body.message).toMatch(/^100000 realisations at 20 points of about \d+ sublayers are [\d,]+ realisation-sublayers; a run may ask for at most 200,000,000\./)
    const grid = await designer.post<{ message: string, data: { code: string } }>(`${project.base}/settlement-runs`, body('Heavy grid', { grid: { spacing: 1, margin: 10 }, options: { maxSublayerThickness: 0.05, probabilistic: { realizations: 1000 } } }))
    expect(grid.status).toBe(422)
    expect(grid.body.message).toMatch(/^The grid's \d+ nodes of about \d+ sublayers cannot have 100 realisations each/)
    // Shape errors stay 400.
    expect((await designer.post(`${project.base}/settlement-runs`, body('Bad', {}, { realizations: 50 }))).status).toBe(400)
  })

  it('cancels: the creator or an owner, 403 for another runner, 409 once ended; nothing written after', async () => {
    const big = body('To cancel', { options: { maxSublayerThickness: 0.05, probabilistic: { realizations: 100_000, layers: { EST: { cc: { cov: 0.3 } } } } } })
    const created = await must('create', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, big), 201)
    const url = `${project.base}/settlement-runs/${created.run.id}`
    // Another runner (not its creator, not an owner) may not.
    const other = await engineer.post<{ message: string }>(`${url}/cancel`, {})
    expect(other.status).toBe(403)
    expect(other.body.message).toBe('Only the person who made this run or a project owner can cancel it.')
    await until('running or still queued', () => row(created.run.id), r => r.status === 'running' || r.status === 'queued')
    const cancelled = await must('cancel', designer.post<{ run: { id: string, status: string } }>(`${url}/cancel`, {}))
    expect(cancelled).toEqual({ run: { id: created.run.id, status: 'cancelled' } })
    const again = await designer.post<{ message: string }>(`${url}/cancel`, {})
    expect(again.status).toBe(409)
    expect(again.body.message).toBe('The run is cancelled: only a queued or running run can be cancelled.')
    // The worker stops and takes the next job: a run queued after it finishes, and the cancelled one stays unwritten.
    const after = await must('after', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('After the cancel', {}, { realizations: 200 })), 201)
    expect((await finished(after.run.id)).status).toBe('finished')
    expect(await row(created.run.id)).toMatchObject({ status: 'cancelled', has_results: false, points: 0 })
    const { run } = await must('read', designer.get<{ run: SettlementRun }>(url))
    expect(run.status).toBe('cancelled')
    expect(run.results).toBeNull()
    // An owner may cancel someone's run; a finished one is 409 for everyone.
    const mine = await must('owner cancels', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, big), 201)
    expect((await must('owner', owner.post<{ run: { status: string } }>(`${project.base}/settlement-runs/${mine.run.id}/cancel`, {}))).run.status).toBe('cancelled')
    expect((await owner.post(`${project.base}/settlement-runs/${after.run.id}/cancel`, {})).status).toBe(409)
  })

  describe('a standalone worker killed mid-run', () => {
    const workers = useStandaloneWorkers('pgboss_probkill', pool)

    it('leaves the run running and unwritten, and the next worker draws it again from the start (attempts 2, the same numbers)', async () => {
      const first = await workers.start()
      const viaWorker = new Client(first.url)
      await must('sign-in on the worker', viaWorker.post('/api/auth/login', { email: demoEmail('designer'), password: DEMO_PASSWORD }))
      const p = { realizations: 40_000, seed: 5, layers: { EST: { cc: { cov: 0.3 } } } }
      const killed = await must('run on the worker', viaWorker.post<{ run: { id: string, status: string } }>(`${project.base}/settlement-runs`, body('Killed probabilistic run', { options: { maxSublayerThickness: 0.05, probabilistic: p } })), 201)
      expect(killed.run.status).toBe('queued')
      // Into the realisations (past the deterministic tenth), then killed.
      await until('progress', () => row(killed.run.id), r => r.status === 'running' && r.progress > 0.1)
      first.child.kill('SIGKILL')
      await new Promise(r => first.child.once('exit', r))
      expect(await row(killed.run.id)).toMatchObject({ status: 'running', attempts: 1, has_results: false, points: 0 })

      await workers.start()
      const done = await until('finished by the second worker', () => row(killed.run.id), r => r.status === 'finished' || r.status === 'failed', 400)
      expect(done).toMatchObject({ status: 'finished', progress: 1, attempts: 2, has_results: true, points: 2 })
      // The same inputs and seed through the app's own worker: the same numbers, so the restart drew everything again.
      const twin = await must('twin', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, body('Twin of the killed run', { options: { maxSublayerThickness: 0.05, probabilistic: p } })), 201)
      const [a, b] = [await finished(killed.run.id), await finished(twin.run.id)]
      expect(a.results!.points.map(x => x.probabilistic!.quantiles)).toEqual(b.results!.points.map(x => x.probabilistic!.quantiles))
      expect(a.results!.points[0]!.probabilistic!.realizations).toBe(40_000)
    }, 600_000)
  })
})
