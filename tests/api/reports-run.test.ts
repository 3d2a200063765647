// The settlement-run report over real HTTP, against the built server: the PDF a member downloads, read back
// with pdftotext — job number, the model version and its approval, the run's settlement figures, the caution —
// the band for a run on a version not approved, 404 for another project's run, 422 before the run has finished.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import pg from 'pg'
import { RESULT_CAUTION } from '../../shared/caution'
import { DEMO_PROJECT } from '../../shared/demo/scenario'
import { NOT_APPROVED_BAND } from '../../shared/reports/sheet'
import type { SettlementRun, SettlementRunList } from '../../shared/types/settlement-runs'
import { type Client, demoProjectId, signedInDemo, useNewAccount } from '../helpers/http'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../helpers/pdf'
import { createProject, must } from '../helpers/project'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

/** The bytes of a GET (the JSON client reads text). */
export async function fetchBytes(c: Client, path: string): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const res = await fetch(c.base + path, { headers: c.cookie ? { cookie: c.cookie } : {} })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

const flat = (pages: string[]) => pages.join('\n').replace(/\s+/g, ' ')

describe('settlement-run report', () => {
  const { owner, engineer, designer, reviewer } = signedInDemo('owner', 'engineer', 'designer', 'reviewer')
  const viewerAccount = useNewAccount(owner, 'report-viewer')
  const viewer = viewerAccount.client
  let base: string
  let jobNumber: string
  let approvedRun: SettlementRun
  let draftRun: SettlementRun

  beforeAll(async () => {
    const p = await createProject(owner, 'RPR', 'Report run site', ['engineer', 'designer', 'reviewer', { email: viewerAccount.email, role: 'viewer' }])
    base = p.base
    jobNumber = (await must('project', owner.get<{ project: { jobNumber: string } }>(base))).project.jobNumber
    const approved = await createRunModel(engineer, p.id, undefined, 'Reported model')
    const members = await must('members', owner.get<{ members: { role: string, userId: string }[] }>(`${base}/members`))
    const reviewerId = members.members.find(m => m.role === 'reviewer')!.userId
    await must('submit', engineer.post(`${approved.url}/versions/1/submit`, { message: 'For the report', reviewerIds: [reviewerId] }))
    await must('approve', reviewer.post(`${approved.url}/versions/1/decision`, { decision: 'approve', comment: 'Fine' }))
    const draft = await createRunModel(engineer, p.id, undefined, 'Unreviewed model')
    const a = await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(approved, { name: 'Approved slab' })), 201)
    const d = await must('run', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(draft, { name: 'Draft slab' })), 201)
    approvedRun = (await must('read', designer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${a.run.id}`))).run
    draftRun = (await must('read', designer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${d.run.id}`))).run
    expect(approvedRun.status).toBe('finished')
    expect(approvedRun.model.status).toBe('approved')
  })

  it('a viewer downloads the PDF: job number, the version and its approval, each point\'s settlement, the caution', async () => {
    const r = await fetchBytes(viewer, `${base}/settlement-runs/${approvedRun.id}/report.pdf`)
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toBe('application/pdf')
    expect(r.headers.get('content-disposition')).toMatch(/^inline; filename=".*Approved_slab_report\.pdf"/)
    expect(r.headers.get('cache-control')).toBe('private, no-store')
    expect(r.bytes.subarray(0, 5).toString()).toBe('%PDF-')
    const pages = pdfPagesText(r.bytes)
    expect(pages.length).toBe(pdfInfo(r.bytes).pages)
    const text = flat(pages)
    expect(text).toContain(jobNumber)
    expect(text).toContain('Settlement run Approved slab')
    expect(text).toMatch(/Reported model, version 1 — approved by \S.+ on \d{4}-\d{2}-\d{2}/)
    for (const p of approvedRun.results!.points) {
      // The summary row: label, E, N, then the settlement in mm to 0.1.
      expect(text).toContain(`Named point ${p.label}`)
      expect(text).toContain((p.settlement * 1000).toFixed(1))
    }
    expect(text).toContain(`${(approvedRun.results!.maximum.settlement * 1000).toFixed(1)} mm`)
    for (const page of pages) expect(page.replace(/\s+/g, ' ')).toContain(RESULT_CAUTION.slice(0, 60))
    expect(flat(pdfPagesText(r.bytes, 'raw'))).not.toContain(NOT_APPROVED_BAND)
    expect(text).toContain('Preview, not issued')
    pdfPageToPng(r.bytes, 'report-settlement-run-p1')
  })

  it('bands every page of the report of a run on a version not approved', async () => {
    const r = await fetchBytes(engineer, `${base}/settlement-runs/${draftRun.id}/report.pdf`)
    expect(r.status).toBe(200)
    const raw = pdfPagesText(r.bytes, 'raw')
    for (const page of raw) expect(page.replace(/\s+/g, ' ')).toContain(NOT_APPROVED_BAND)
    expect(flat(raw)).toContain('Unreviewed model, version 1 — saved, not approved')
  })

  it('404 for another project\'s run, 400 for a malformed id, 422 for a run that did not finish', async () => {
    const other = await createProject(owner, 'RPO', 'Other site', [{ email: viewerAccount.email, role: 'viewer' }])
    expect((await viewer.get(`${other.base}/settlement-runs/${approvedRun.id}/report.pdf`)).status).toBe(404)
    // A malformed id names nothing: 404, like every route's params.
    expect((await viewer.get(`${base}/settlement-runs/not-a-uuid/report.pdf`)).status).toBe(404)
    await pool.query(`update settlement_runs set status = 'failed', error_message = 'stopped' where id = $1`, [draftRun.id])
    const failed = await viewer.get<{ message: string }>(`${base}/settlement-runs/${draftRun.id}/report.pdf`)
    expect(failed.status).toBe(422)
    expect(failed.body.message).toBe('The run failed: it has no results to report.')
  })

  it('the demo project\'s run (read only): its report names the approved Yard model version; page 1 for docs/report-design.md', async () => {
    const demo = await demoProjectId(reviewer)
    const list = await must('runs', reviewer.get<SettlementRunList>(`/api/projects/${demo}/settlement-runs`))
    const run = list.runs.find(r => r.status === 'finished')!
    const r = await fetchBytes(reviewer, `/api/projects/${demo}/settlement-runs/${run.id}/report.pdf`)
    expect(r.status).toBe(200)
    const text = flat(pdfPagesText(r.bytes))
    expect(text).toContain(DEMO_PROJECT.jobNumber)
    expect(text).toContain(`${run.model.modelName}, version ${run.model.version} — approved`)
    expect(text).toContain(`${(run.headline!.maxSettlement * 1000).toFixed(1)} mm`)
    pdfPageToPng(r.bytes, 'report-demo-run-p1', 1, 100)
  })
})
