// Settlement runs through the job queue: a grid run goes queued → running → finished in the app
// process's worker, with progress; and a run whose worker is killed mid-run is left running and
// unwritten, then finished by the next worker after the job's expiry (attempts 2).
import { beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import { Client, demoEmail, signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { until, useRunRows, useStandaloneWorkers } from '../helpers/run-worker'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const { pool, row } = useRunRows()


/** A grid run large enough to take a few seconds: a 70 m × 50 m slab, a 1 m grid with 10 m margin (91 × 71 points). */
function gridRunBody(model: { modelId: string, version: number }, name: string) {
  return smallRunBody(model, { name, points: [{ label: 'Centre', x: 0, y: 0 }], loads: [{ type: 'rectangle', x: 0, y: 0, width: 70, length: 50, pressure: 80 }], grid: { spacing: 1, margin: 10 } })
}

describe('settlement runs through the job queue', () => {
  const { owner, engineer, designer } = signedInDemo('owner', 'engineer', 'designer')
  let project: { id: string, base: string }
  let model: { modelId: string, version: number }

  beforeAll(async () => {
    project = await createProject(owner, 'SRJ', 'Settlement jobs site', ['engineer', 'designer'])
    model = await createRunModel(engineer, project.id)
  })

  it('queues a grid run and the app\'s worker finishes it, writing progress on the way', async () => {
    const created = await must('grid run', designer.post<{ run: { id: string, status: string } }>(`${project.base}/settlement-runs`, gridRunBody(model, 'Grid run')), 201)
    expect(created.run.status).toBe('queued')
    const seen: { status: string, progress: number }[] = []
    const finished = await until('grid run', async () => {
      const { run } = await must('read', designer.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${created.run.id}`))
      seen.push({ status: run.status, progress: run.progress })
      return run
    }, run => run.status === 'finished' || run.status === 'failed')
    expect(finished.status).toBe('finished')
    expect(finished.startedAt).not.toBeNull()
    const grid = finished.results!.grid!
    expect(grid.xs).toHaveLength(91)
    expect(grid.ys).toHaveLength(71)
    // Progress never goes back, and statuses only move forward.
    const order = ['queued', 'running', 'finished']
    for (let i = 1; i < seen.length; i++) {
      expect(order.indexOf(seen[i]!.status)).toBeGreaterThanOrEqual(order.indexOf(seen[i - 1]!.status))
      if (seen[i]!.status === 'running' && seen[i - 1]!.status === 'running') expect(seen[i]!.progress).toBeGreaterThanOrEqual(seen[i - 1]!.progress)
    }
    const r = await row(created.run.id)
    expect(r).toMatchObject({ status: 'finished', progress: 1, attempts: 1, has_results: true, points: 1 })
    // Live pages heard of it: created, started, progress, finished.
    const events = await pool.query('select count(*)::int as n from live_events where type = \'run.changed\' and entity_id = $1', [created.run.id])
    expect(events.rows[0].n).toBeGreaterThanOrEqual(3)
    const list = await must('list', designer.get<{ runs: { id: string, gridPoints: number, headline: { maxAngularDistortion: number | null } | null }[] }>(`${project.base}/settlement-runs`))
    const summary = list.runs.find(x => x.id === created.run.id)!
    expect(summary.gridPoints).toBe(91 * 71)
    expect(summary.headline).not.toBeNull()
  })

  it('fails a queued run the engine refuses while computing, with the plain reason', async () => {
    const body = smallRunBody(model, { name: 'Grid excavation', points: [{ label: 'Centre', x: 0, y: 0 }], loads: [{ type: 'rectangle', x: 0, y: 0, width: 20, length: 20, pressure: -500 }], grid: { spacing: 5, margin: 0 } })
    const created = await must('failing grid run', designer.post<{ run: { id: string, status: string } }>(`${project.base}/settlement-runs`, body), 201)
    expect(created.run.status).toBe('queued')
    const r = await until('failed', () => row(created.run.id), x => x.status === 'finished' || x.status === 'failed')
    expect(r).toMatchObject({ status: 'failed', has_results: false, points: 0, attempts: 1 })
    const { run } = await must('read', designer.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${created.run.id}`))
    expect(run.error?.code).toBe('final-effective-stress-not-positive')
    expect(run.error?.message).toMatch(/must stay positive/)
  })

  describe('a standalone worker killed mid-run', () => {
    const workers = useStandaloneWorkers('pgboss_kill', pool)

    it('leaves the run running and unwritten, and the next worker finishes it (attempts 2)', async () => {
      const first = await workers.start()
      expect(first.log()).toContain('runs computed in a worker thread')
      // Sent through the worker's own HTTP side, so the job lands in its queue schema.
      const viaWorker = new Client(first.url)
      await must('sign-in on the worker', viaWorker.post('/api/auth/login', { email: demoEmail('designer'), password: DEMO_PASSWORD }))
      const body = smallRunBody(model, { name: 'Killed worker run', points: [{ label: 'Centre', x: 0, y: 0 }], loads: [{ type: 'rectangle', x: 0, y: 0, width: 80, length: 60, pressure: 80 }], grid: { spacing: 1, margin: 10 }, options: { maxSublayerThickness: 0.05 } })
      const created = await must('run on the worker', viaWorker.post<{ run: { id: string, status: string } }>(`${project.base}/settlement-runs`, body), 201)
      expect(created.run.status).toBe('queued')

      // 101 × 81 grid points at 0.05 m sublayers: seconds of work, so the kill lands mid-run.
      const running = await until('progress', () => row(created.run.id), r => r.status !== 'queued' && r.progress > 0)
      expect(running.status).toBe('running')
      first.child.kill('SIGKILL')
      await new Promise(r => first.child.once('exit', r))

      const left = await row(created.run.id)
      expect(left).toMatchObject({ status: 'running', attempts: 1, has_results: false, points: 0 })

      await workers.start()
      const done = await until('finished by the second worker', () => row(created.run.id), r => r.status === 'finished' || r.status === 'failed', 300)
      expect(done).toMatchObject({ status: 'finished', progress: 1, attempts: 2, has_results: true, points: 1 })
      const { run } = await must('read', designer.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${created.run.id}`))
      expect(run.results!.grid!.xs).toHaveLength(101)
      expect(run.results!.grid!.ys).toHaveLength(81)
    }, 420_000)
  })
})
