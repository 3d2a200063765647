// Issuing reports over real HTTP: the PDF stored as a project attachment with revision A then B, its SHA-256
// matching the stored bytes, the issuer printed on it, the audit record, the permanent list (the run deleted,
// the report stays; its file cannot be deleted), a viewer downloads but cannot issue, 400/404/422.
// A settlement-run report is long: the issue answers 202 with the report queued, and the job queue stores it
// (tests/api/reports-queue.test.ts follows its progress); these tests wait for it to be issued.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import pg from 'pg'
import type { IssuedReport, IssuedReportList } from '../../shared/types/reports'
import { type Client, signedInDemo, useNewAccount } from '../helpers/http'
import { pdfPagesText } from '../helpers/pdf'
import { createProject, must } from '../helpers/project'
import { waitForReport } from '../helpers/reports'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

async function fetchBytes(c: Client, path: string): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const res = await fetch(c.base + path, { headers: c.cookie ? { cookie: c.cookie } : {} })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}
const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex')

describe('issued reports', () => {
  const { owner, engineer, designer } = signedInDemo('owner', 'engineer', 'designer')
  const viewerAccount = useNewAccount(owner, 'report-viewer')
  const viewer = viewerAccount.client
  let base: string
  let projectId: string
  let runId: string

  beforeAll(async () => {
    const p = await createProject(owner, 'RPI', 'Issued reports site', ['engineer', 'designer', { email: viewerAccount.email, role: 'viewer' }])
    base = p.base
    projectId = p.id
    const model = await createRunModel(engineer, p.id, undefined, 'Issue model')
    runId = (await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Issued slab' })), 201)).run.id
  })

  it('issues revision A then B of the same run; each PDF stored byte for byte with its SHA-256 and the letter printed', async () => {
    const a = await designer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId })
    expect(a.status, JSON.stringify(a.body)).toBe(202)
    expect(Object.keys(a.body)).toEqual(['report'])
    expect(a.body.report).toMatchObject({ kind: 'settlement-run', revision: 'A', status: 'queued', title: 'Settlement run', subject: 'Issued slab', approvedRecord: false, source: { id: runId, version: null, options: {} } })
    const ra = await waitForReport(designer, projectId, a.body.report.id)
    expect(ra).toMatchObject({ status: 'issued', revision: 'A', progress: null, failure: null })
    expect(ra.issuedBy?.name).toBe(ra.issuedByName)
    expect(ra.pages).toBeGreaterThanOrEqual(3)
    expect(ra.sha256).toMatch(/^[0-9a-f]{64}$/)

    const b = await engineer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId })
    expect(b.status).toBe(202)
    expect(b.body.report.revision).toBe('B')
    const rb = await waitForReport(engineer, projectId, b.body.report.id)
    expect(rb.status).toBe('issued')

    for (const r of [ra, rb]) {
      const file = await fetchBytes(viewer, r.downloadUrl!)
      expect(file.status).toBe(200)
      expect(file.headers.get('content-type')).toBe('application/pdf')
      expect(file.bytes.length).toBe(r.size)
      expect(sha(file.bytes)).toBe(r.sha256)
      const pages = pdfPagesText(file.bytes)
      expect(pages).toHaveLength(r.pages!)
      for (const page of pages) expect(page).toContain(`Issued, revision ${r.revision}`)
      // The same bytes through the attachment route, a project attachment of type application/pdf.
      const att = await fetchBytes(viewer, `${base}/attachments/${r.attachmentId}/download`)
      expect(att.status).toBe(200)
      expect(sha(att.bytes)).toBe(r.sha256)
    }
    const row = await pool.query<{ content_type: string, owner_type: string, sha256: string }>('select content_type, owner_type, sha256 from attachments where id = $1', [ra.attachmentId])
    expect(row.rows[0]).toEqual({ content_type: 'application/pdf', owner_type: 'project', sha256: ra.sha256 })
    const audit = await pool.query<{ action: string, actor_id: string }>(`select action, actor_id from audit_events where entity = 'issued-report' and entity_id = $1`, [ra.id])
    expect(audit.rows).toHaveLength(1)
    expect(audit.rows[0]!.action).toBe('create')
    expect(audit.rows[0]!.actor_id).toBe(ra.issuedBy!.id)
  }, 300_000)

  it('a viewer lists and downloads but cannot issue (403); the list keeps a report after its run is deleted, and its file cannot be deleted', async () => {
    expect((await viewer.post(`${base}/reports`, { kind: 'settlement-run', runId })).status).toBe(403)
    const queued = await must('issue', designer.post<{ report: IssuedReport }>(`${base}/reports`, { kind: 'settlement-run', runId }), 202)
    const issued = { report: await waitForReport(designer, projectId, queued.report.id) }
    expect(issued.report.status).toBe('issued')
    expect((await designer.delete(`${base}/settlement-runs/${runId}`)).status).toBe(204)
    const list = await must('list', viewer.get<IssuedReportList>(`${base}/reports`))
    const mine = list.reports.find(r => r.id === issued.report.id)
    expect(mine).toMatchObject({ revision: issued.report.revision, subject: 'Issued slab', sha256: issued.report.sha256 })
    expect(list.reports.map(r => r.revision).filter(Boolean).length).toBe(list.total)
    expect((await fetchBytes(viewer, issued.report.downloadUrl!)).status).toBe(200)
    const del = await owner.delete<{ message: string }>(`${base}/attachments/${issued.report.attachmentId}`)
    expect(del.status).toBe(409)
    expect(del.body.message).toMatch(/issued report/)
  }, 300_000)

  it('400 on a bad body, 404 for another project\'s run or report or an unknown point', async () => {
    for (const body of [{}, { kind: 'settlement-run' }, { kind: 'settlement-run', runId: 'x' }, { kind: 'nope', runId }, { kind: 'point-log', pointId: runId, scale: 75 }, { kind: 'settlement-run', runId, extra: 1 }]) {
      const r = await designer.post(`${base}/reports`, body)
      expect(r.status, JSON.stringify(body)).toBe(400)
    }
    const other = await createProject(owner, 'RPX', 'Other issued site', ['designer', { email: viewerAccount.email, role: 'viewer' }])
    const otherModel = await createRunModel(owner, other.id, undefined, 'Other model')
    const otherRun = (await must('run', owner.post<{ run: { id: string } }>(`${other.base}/settlement-runs`, smallRunBody(otherModel)), 201)).run.id
    expect((await designer.post(`${base}/reports`, { kind: 'settlement-run', runId: otherRun })).status).toBe(404)
    const otherReport = await must('issue', owner.post<{ report: IssuedReport }>(`${other.base}/reports`, { kind: 'settlement-run', runId: otherRun }), 202)
    expect((await viewer.get(`${base}/reports/${otherReport.report.id}/pdf`)).status).toBe(404)
    // A point log of an id that is no point of the project: 404, never stored.
    const r = await designer.post<{ message: string }>(`${base}/reports`, { kind: 'point-log', pointId: runId, scale: 100 })
    expect(r.status).toBe(404)
    const stored = await pool.query('select 1 from issued_reports where project_id = $1 and kind = $2', [projectId, 'point-log'])
    expect(stored.rowCount).toBe(0)
  })
})
