// Long reports through the job queue, over real HTTP against the built server: a settlement-run report is
// listed at once as queued (202) with its letter, made by the app's worker with its steps announced as
// `report.changed`, and ends issued with a PDF that reads back with the run's figures; a report whose run is gone
// by the time its job runs ends failed with a plain reason, and issuing the record again makes that same letter
// (never a second one). A site-model report of a version with more than 8 strata goes the same way; one with 5 is
// made in the request (201).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import pg from 'pg'
import PgBoss from 'pg-boss'
import type { IssuedReport, IssuedReportList } from '../../shared/types/reports'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import { type Client, signedInDemo } from '../helpers/http'
import { pdfPagesText, pdfText } from '../helpers/pdf'
import { createProject, must } from '../helpers/project'
import { waitForReport } from '../helpers/reports'
import { scenarioDefinition } from '../helpers/scenario-definition'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

async function fetchBytes(c: Client, path: string): Promise<{ status: number, bytes: Buffer }> {
  const res = await fetch(c.base + path, { headers: c.cookie ? { cookie: c.cookie } : {} })
  return { status: res.status, bytes: Buffer.from(await res.arrayBuffer()) }
}

describe('long reports on the job queue', () => {
  const { owner, engineer, designer } = signedInDemo('owner', 'engineer', 'designer')
  let base: string
  let projectId: string
  let run: SettlementRun

  beforeAll(async () => {
    const p = await createProject(owner, 'RPQ', 'Queued reports site', ['engineer', 'designer'])
    base = p.base
    projectId = p.id
    const model = await createRunModel(engineer, p.id, undefined, 'Queued report model')
    const created = await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Queued slab' })), 201)
    run = (await must('read', designer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${created.run.id}`))).run
    expect(run.status).toBe('finished')
  })

  it('answers 202 with the report queued, then the worker makes it through its steps and stores a readable PDF', async () => {
    const r = await designer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId: run.id })
    expect(r.status, JSON.stringify(r.body)).toBe(202)
    const queued = r.body.report
    expect(queued).toMatchObject({ revision: 'A', status: 'queued', subject: 'Queued slab', pages: null, sha256: null, attachmentId: null, downloadUrl: null, failure: null })
    expect(queued.progress).toEqual({ stage: null, fraction: 0 })

    const seen: IssuedReport[] = []
    const done = await waitForReport(designer, projectId, queued.id, seen)
    expect(done.status, JSON.stringify(done.failure)).toBe('issued')
    expect(done).toMatchObject({ id: queued.id, revision: 'A', progress: null, failure: null })
    // Statuses only move forward and the fraction never goes back while it is being made.
    const order = ['queued', 'running', 'issued']
    for (let i = 1; i < seen.length; i++) {
      expect(order.indexOf(seen[i]!.status)).toBeGreaterThanOrEqual(order.indexOf(seen[i - 1]!.status))
      if (seen[i]!.progress && seen[i - 1]!.progress && seen[i]!.status === seen[i - 1]!.status) expect(seen[i]!.progress!.fraction).toBeGreaterThanOrEqual(seen[i - 1]!.progress!.fraction)
    }
    // Each step was written to the row and announced: queued, gathering, drawing, writing, storing, issued.
    const events = await pool.query<{ n: number }>(`select count(*)::int as n from live_events where type = 'report.changed' and entity_id = $1`, [queued.id])
    expect(events.rows[0]!.n).toBeGreaterThanOrEqual(6)
    const row = await pool.query<{ attempts: number, stage: string | null, progress: number }>('select attempts, stage, progress from issued_reports where id = $1', [queued.id])
    expect(row.rows[0]).toEqual({ attempts: 1, stage: null, progress: 1 })

    const file = await fetchBytes(designer, done.downloadUrl!)
    expect(file.status).toBe(200)
    expect(file.bytes.length).toBe(done.size)
    expect(pdfPagesText(file.bytes)).toHaveLength(done.pages!)
    const text = pdfText(file.bytes).replace(/\s+/g, ' ')
    expect(text).toContain('Issued, revision A')
    for (const p of run.results!.points) {
      expect(text).toContain(`Named point ${p.label}`)
      expect(text).toContain((p.settlement * 1000).toFixed(1))
    }
    expect(text).toContain(`${(run.results!.maximum.settlement * 1000).toFixed(1)} mm`)
    const audit = await pool.query(`select 1 from audit_events where entity = 'issued-report' and entity_id = $1`, [queued.id])
    expect(audit.rowCount).toBe(1)
  }, 300_000)

  it('fails a report whose run is gone when its job runs, with the plain reason and no file', async () => {
    // A queued report of a run deleted after it was asked for: listed as the issue route lists it, then
    // handed to the queue as the route does (the route itself refuses a run that is already gone).
    const model = await createRunModel(engineer, projectId, undefined, 'Short-lived model')
    const gone = await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Deleted slab' })), 201)
    const members = await must('members', owner.get<{ members: { role: string, userId: string, displayName?: string }[] }>(`${base}/members`))
    const designerId = members.members.find(m => m.role === 'designer')!.userId
    const inserted = await pool.query<{ id: string }>(`insert into issued_reports (project_id, kind, source_id, source_key, revision, status, progress, filename, title, subject, approved_record, issued_by, issued_by_name)
      values ($1, 'settlement-run', $2::uuid, $2::text, 'A', 'queued', 0, 'deleted.pdf', 'Settlement run', 'Deleted slab', false, $3, 'Designer') returning id`, [projectId, gone.run.id, designerId])
    const reportId = inserted.rows[0]!.id
    expect((await designer.delete(`${base}/settlement-runs/${gone.run.id}`)).status).toBe(204)
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL, schema: process.env.PASTLOAD_JOBS_SCHEMA?.trim() || 'pgboss', supervise: false, schedule: false, migrate: false, max: 1 })
    await boss.start()
    try {
      expect(await boss.send('report-issue', { reportId })).toBeTruthy()
    }
    finally {
      await boss.stop({ graceful: false, wait: true })
    }
    const failed = await waitForReport(designer, projectId, reportId)
    expect(failed).toMatchObject({ status: 'failed', revision: 'A', downloadUrl: null, sha256: null, pages: null, progress: null })
    expect(failed.failure).toEqual({ code: 'record-gone', message: 'The run this report is of no longer exists: it was deleted before the report was made.' })
    expect((await designer.get(`${base}/reports/${reportId}/pdf`)).status).toBe(404)
  }, 300_000)

  it('issuing a record whose latest letter failed makes that letter again, then the next one', async () => {
    // Revision A of a finished run failed (its worker gave up): issuing again retries A, not B.
    const model = await createRunModel(engineer, projectId, undefined, 'Retried model')
    const made = await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Retried slab' })), 201)
    const members = await must('members', owner.get<{ members: { role: string, userId: string }[] }>(`${base}/members`))
    const designerId = members.members.find(m => m.role === 'designer')!.userId
    const failed = await pool.query<{ id: string }>(`insert into issued_reports (project_id, kind, source_id, source_key, revision, status, progress, error_message, error_code, filename, title, subject, approved_record, issued_by, issued_by_name)
      values ($1, 'settlement-run', $2::uuid, $2::text, 'A', 'failed', 0.3, 'The report stopped 3 times before it was stored.', 'attempts-exhausted', 'a.pdf', 'Settlement run', 'Retried slab', false, $3, 'Designer') returning id`, [projectId, made.run.id, designerId])
    const retried = await must('retry', engineer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId: made.run.id }), 202)
    expect(retried.report).toMatchObject({ id: failed.rows[0]!.id, revision: 'A', status: 'queued', failure: null })
    const done = await waitForReport(engineer, projectId, retried.report.id)
    expect(done.status).toBe('issued')
    expect(done.issuedBy?.id).not.toBe(designerId)
    const file = await fetchBytes(engineer, done.downloadUrl!)
    expect(pdfText(file.bytes)).toContain('Issued, revision A')

    const next = await must('next', engineer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId: made.run.id }), 202)
    expect(next.report.revision).toBe('B')
    expect((await waitForReport(engineer, projectId, next.report.id)).status).toBe('issued')
    const list = await must('list', designer.get<IssuedReportList>(`${base}/reports`))
    const letters = list.reports.filter(r => r.source.id === made.run.id).map(r => r.revision).sort()
    expect(letters).toEqual(['A', 'B'])
  }, 300_000)

  it('makes a site-model report of a version with more than 8 strata on the queue, and one with 5 in the request', async () => {
    // The demo ground model with its dense sand split into five 1.7 m strata: 9 strata in all.
    const def = scenarioDefinition()
    const sand = def.strata.pop()!
    for (let k = 1; k <= 5; k++) def.strata.push({ ...sand, code: `SAND${k}`, name: `Dense sand ${k}`, thickness: 1.7 })
    const many = await createRunModel(engineer, projectId, def, 'Nine-strata model')
    const r = await designer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'model-version', modelId: many.modelId, version: 1 })
    expect(r.status, JSON.stringify(r.body)).toBe(202)
    expect(r.body.report).toMatchObject({ kind: 'model-version', revision: 'A', status: 'queued', subject: 'Nine-strata model, version 1', approvedRecord: false })
    const done = await waitForReport(designer, projectId, r.body.report.id)
    expect(done.status, JSON.stringify(done.failure)).toBe('issued')
    const file = await fetchBytes(designer, done.downloadUrl!)
    const text = pdfText(file.bytes).replace(/\s+/g, ' ')
    expect(text).toContain('Issued, revision A')
    expect(text).toContain('Strata, unit weights and pore pressure')
    expect(text).toContain('SAND5 — Dense sand 5')
    // Cover, ground, whole depth, nine strata, tables.
    expect(done.pages).toBeGreaterThanOrEqual(13)

    const five = await createRunModel(engineer, projectId, undefined, 'Five-strata model')
    const short = await must('short', designer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'model-version', modelId: five.modelId, version: 1 }), 201)
    expect(short.report).toMatchObject({ status: 'issued', revision: 'A', progress: null })
    expect(short.report.sha256).toMatch(/^[0-9a-f]{64}$/)
  }, 300_000)
})
