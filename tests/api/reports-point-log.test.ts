// The point log report over real HTTP: the stress-history log of a borehole as a PDF at each scale,
// read back with pdftotext, who may download it, and the refusals (404 another project's point, 400 a scale).
import { beforeAll, describe, expect, it } from 'vitest'
import { RESULT_CAUTION } from '../../shared/caution'
import type { PointLogReply } from '../../shared/types/point-log'
import { type Client, signedInDemo, useNewAccount } from '../helpers/http'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../helpers/pdf'
import { createPoint, createProject, must } from '../helpers/project'
import { createRunModel } from '../helpers/settlement-run'

async function pdfOf(c: Client, path: string): Promise<{ status: number, type: string | null, disposition: string | null, cache: string | null, pdf: Buffer }> {
  const res = await fetch(c.base + path, { headers: { cookie: c.cookie } })
  return { status: res.status, type: res.headers.get('content-type'), disposition: res.headers.get('content-disposition'), cache: res.headers.get('cache-control'), pdf: Buffer.from(await res.arrayBuffer()) }
}

describe('point log report', () => {
  const { owner, geologist } = signedInDemo('owner', 'geologist')
  const viewerAccount = useNewAccount(owner, 'logreportviewer')
  let projectId: string
  let jobNumber: string
  let base: string
  let otherProjectPoint: string

  beforeAll(async () => {
    const project = await createProject(owner, 'PLR', 'Point log report site', ['geologist', { email: viewerAccount.email, role: 'viewer' }])
    projectId = project.id
    jobNumber = (await must('reading the project', owner.get<{ project: { jobNumber: string } }>(project.base))).project.jobNumber
    await createRunModel(owner, projectId, undefined, 'Log model')
    const pointId = await createPoint(geologist, projectId, {
      identifier: 'BH-21', easting: 120, northing: 80, groundElevation: 3.1, finalDepth: 24, startedOn: '2026-02-02', endedOn: '2026-02-04',
      method: 'Rotary with casing', loggedBy: 'Demo Logger', remarks: 'Casing withdrawn; hole grouted.',
    })
    base = `${project.base}/points/${pointId}`
    await must('saving the log', geologist.request('PUT', `${base}/intervals`, {
      intervals: [
        { top: 0, bottom: 1.5, description: 'Made ground: sandy gravel with brick', uscs: 'GW' },
        { top: 1.5, bottom: 15, description: 'Very soft grey silty CLAY with shells', uscs: 'CH' },
        { top: 15, bottom: 24, description: 'Dense grey fine SAND', uscs: 'SP' },
      ],
    }))
    for (const s of [
      { identifier: 'U-101', top: 3, bottom: 3.45, type: 'thin-walled-tube' },
      { identifier: 'P-102', top: 6, bottom: 6.8, type: 'piston' },
      { identifier: 'D-103', top: 17, bottom: 17.45, type: 'spt-split-spoon' },
    ]) await must(`sample ${s.identifier}`, geologist.post(`${base}/samples`, s), 201)
    await must('SPT', geologist.post(`${base}/spt`, { depth: 17, blows: [5, 12, 15] }), 201)
    const refusal = await must('SPT refusal', geologist.post<{ row: { n: number, penetration: number } }>(`${base}/spt`, { depth: 21, blows: [14, 50, 0], penetration: 100 }), 201)
    expect(refusal.row).toMatchObject({ n: 50, penetration: 100 })
    await must('strike 1', geologist.post(`${base}/groundwater`, { kind: 'strike', observedAt: '2026-02-02T10:00:00Z', depth: 1.7 }), 201)
    await must('strike 2', geologist.post(`${base}/groundwater`, { kind: 'strike', observedAt: '2026-02-03T09:00:00Z', depth: 1.6 }), 201)

    const other = await createProject(owner, 'PLX', 'Another site')
    otherProjectPoint = `${other.base}/points/${await createPoint(owner, other.id, { identifier: 'BH-99' })}`
  })

  it('draws the borehole at 1:50, 1:100 and 1:200 with the job, the point, the samples, the refusal as written and the caution', async () => {
    const expectedDrawingPages = { 50: 3, 100: 2, 200: 1 } as const
    for (const scale of [50, 100, 200] as const) {
      const r = await pdfOf(owner, `${base}/report.pdf?scale=${scale}`)
      expect(r.status).toBe(200)
      expect(r.type).toBe('application/pdf')
      expect(r.cache).toBe('private, no-store')
      expect(r.disposition).toContain(`inline; filename="${jobNumber}_BH-21_log_1-${scale}.pdf"`)
      const info = pdfInfo(r.pdf)
      expect(info.width).toBeCloseTo(595.28, 1)
      // The drawing's pages, then the key on the last one or one more.
      expect(info.pages).toBeGreaterThanOrEqual(expectedDrawingPages[scale])
      expect(info.pages).toBeLessThanOrEqual(expectedDrawingPages[scale] + 1)
      const pages = pdfPagesText(r.pdf)
      for (const p of pages) {
        expect(p).toContain(jobNumber)
        expect(p).toContain('BH-21')
        expect(p.replace(/\s+/g, ' ')).toContain(RESULT_CAUTION.slice(0, 50))
      }
      const all = pages.join('\n')
      expect(all).toContain(`1:${scale}`)
      // Sample references, SPT blows and N, the dates, a remark and the model's name.
      for (const shown of ['U-101', 'P-102', 'D-103', '50/100 mm', 'N 27', '2026-02-02', '2026-02-03', 'Casing withdrawn', 'Log model']) expect(all).toContain(shown)
      pdfPageToPng(r.pdf, `report-point-log-1-${scale}-p1`)
    }
  }, 60_000)

  it('gives the sheet page the same data: σ\'v0 from the model in force down the hole', async () => {
    const r = await must('stress log', geologist.get<PointLogReply>(`${base}/stress-log`))
    expect(r.log.point.identifier).toBe('BH-21')
    expect(r.log.stress.available).toBe(true)
    expect(r.log.stress.profile.length).toBeGreaterThan(20)
    // σ'v0 grows with depth.
    const sv = r.log.stress.profile.map(p => p.effectiveStress)
    expect(sv.at(-1)!).toBeGreaterThan(sv[4]!)
    expect(r.log.spt.map(s => s.penetration)).toEqual([null, 100])
  })

  it('says σ\'v0 is unavailable when the project has no saved model', async () => {
    const bare = await createProject(owner, 'PLN', 'No model site')
    const pt = await createPoint(owner, bare.id, { identifier: 'BH-02', finalDepth: 6 })
    const r = await must('stress log', owner.get<PointLogReply>(`${bare.base}/points/${pt}/stress-log`))
    expect(r.log.stress.available).toBe(false)
    const pdf = await pdfOf(owner, `${bare.base}/points/${pt}/report.pdf`)
    expect(pdf.status).toBe(200)
    expect(pdfPagesText(pdf.pdf).join('\n')).toContain("unavailable")
  })

  it('lets a viewer download; refuses another project\'s point (404) and a scale not offered (400)', async () => {
    const v = await pdfOf(viewerAccount.client, `${base}/report.pdf?scale=200`)
    expect(v.status).toBe(200)
    expect(v.pdf.subarray(0, 5).toString()).toBe('%PDF-')
    const foreign = otherProjectPoint.split('/points/')[1]
    const wrong = await owner.get(`/api/projects/${projectId}/points/${foreign}/report.pdf`)
    expect(wrong.status).toBe(404)
    const bad = await owner.get(`${base}/report.pdf?scale=75`)
    expect(bad.status).toBe(400)
  })
})
