// The site-model version report over real HTTP: a model saved, sent and approved in its own project,
// and one left unapproved; the PDF read back with poppler-utils.
import { beforeAll, describe, expect, it } from 'vitest'
import { RESULT_CAUTION } from '../../shared/caution'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, createUser, signedInDemo } from '../helpers/http'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../helpers/pdf'
import { createTrendVersion } from '../helpers/project'

interface Model { id: string, version: number, draft: SiteModelDefinition }
const flat = (s: string) => s.replace(/\s+/g, ' ')

/** The PDF bytes (the JSON client reads text). */
async function getPdf(c: Client, path: string): Promise<{ status: number, type: string | null, disposition: string | null, cache: string | null, pdf: Uint8Array }> {
  const res = await fetch(c.base + path, { headers: { cookie: c.cookie } })
  return { status: res.status, type: res.headers.get('content-type'), disposition: res.headers.get('content-disposition'), cache: res.headers.get('cache-control'), pdf: new Uint8Array(await res.arrayBuffer()) }
}

describe('site-model version report', () => {
  const { engineer: eng, reviewer: rev, owner } = signedInDemo('engineer', 'reviewer', 'owner')
  let viewer: Client
  let projectId: string
  let jobNumber: string
  let reviewerName: string
  let base: string
  let approved: { id: string, hash: string }
  let unapproved: string

  const savedVersion = (name: string) => createTrendVersion<Model>(eng, base, name, { n: 12, r2: 0.81, rmse: 6.4, aic: 40.2, aicc: 41.6 }, 'Estuarine trend for the report')

  beforeAll(async () => {
    projectId = await createDemoCopy('RMV')
    const viewerAccount = await createUser(owner, 'rmv-viewer')
    expect((await owner.post(`/api/projects/${projectId}/members`, { email: viewerAccount.email, role: 'viewer' })).status).toBe(201)
    viewer = viewerAccount.client
    base = `/api/projects/${projectId}/models`
    jobNumber = (await eng.get<{ project: { jobNumber: string } }>(`/api/projects/${projectId}`)).body.project.jobNumber
    const members = await eng.get<{ members: { userId: string, role: string, displayName: string }[] }>(`/api/projects/${projectId}/members`)
    const reviewer = members.body.members.find(m => m.role === 'reviewer')!
    reviewerName = reviewer.displayName
    const a = await savedVersion('Report yard model')
    expect((await eng.post(`${a.url}/1/submit`, { message: 'Ready for a check', reviewerIds: [reviewer.userId] })).status).toBe(200)
    const decided = await rev.post<{ version: { approvalHash: string } }>(`${a.url}/1/decision`, { decision: 'approve', comment: 'Checked' })
    expect(decided.status).toBe(200)
    approved = { id: a.model.id, hash: decided.body.version.approvalHash }
    unapproved = (await savedVersion('Report draft model')).model.id
  }, 120_000)

  it('reads back the job number, the model and version, who approved it, the content hash, the trend parameters and the caution', async () => {
    const r = await getPdf(eng, `${base}/${approved.id}/versions/1/report.pdf`)
    expect(r.status).toBe(200)
    expect(r.type).toBe('application/pdf')
    expect(r.cache).toBe('private, no-store')
    expect(r.disposition).toMatch(/^inline; filename=".*Report_yard_model_v1_model-report\.pdf"/)
    const pages = pdfPagesText(r.pdf)
    expect(pdfInfo(r.pdf).pages).toBe(pages.length)
    const cover = flat(pages[0]!)
    // pdftotext's layout mode can split the header's job block around the title: read in drawing order, without white space.
    expect(pdfPagesText(r.pdf, 'raw')[0]!.replace(/\s/g, '')).toContain(jobNumber)
    expect(cover).toContain('Report yard model, version 1')
    expect(cover).toContain(`Approved by ${reviewerName}`)
    expect(cover).toContain(approved.hash)
    const all = flat(pages.join(' '))
    expect(all).toContain('Constant POP')
    expect(all).toContain('POP 25.0 kPa')
    expect(all).toMatch(/Constant POP POP 25\.0 kPa 12 0\.810 6\.4 kPa 41\.6/)
    for (const p of pages) expect(flat(p)).toContain(RESULT_CAUTION.slice(0, 60))
    expect(all).not.toContain('NOT APPROVED')
    pdfPageToPng(r.pdf, 'report-model-version-api-p1', 1)
    pdfPageToPng(r.pdf, 'report-model-version-api-p2', 2)
  }, 60_000)

  it('bands every page of an unapproved version', async () => {
    const r = await getPdf(eng, `${base}/${unapproved}/versions/1/report.pdf`)
    expect(r.status).toBe(200)
    const raw = pdfPagesText(r.pdf, 'raw')
    expect(raw.length).toBeGreaterThan(2)
    for (const p of raw) expect(flat(p)).toContain('NOT APPROVED — FOR DISCUSSION')
    expect(flat(raw[0]!)).toContain('Not approved. This version is saved.')
  }, 60_000)

  it('lets a viewer download; another project\'s model, a version not saved and version 0 are 404', async () => {
    const v = await getPdf(viewer, `${base}/${approved.id}/versions/1/report.pdf`)
    expect(v.status).toBe(200)
    expect(Buffer.from(v.pdf.subarray(0, 5)).toString()).toBe('%PDF-')
    const demoId = (await eng.get<{ projects: { id: string, jobNumber: string }[] }>('/api/projects')).body.projects.find(p => p.id !== projectId)!.id
    expect((await eng.get(`/api/projects/${demoId}/models/${approved.id}/versions/1/report.pdf`)).status).toBe(404)
    expect((await eng.get(`${base}/${approved.id}/versions/2/report.pdf`)).status).toBe(404)
    // Route parameters of the wrong shape name nothing (validateParams: 404, so ids cannot be probed by shape).
    expect((await eng.get(`${base}/${approved.id}/versions/0/report.pdf`)).status).toBe(404)
  }, 60_000)
})
