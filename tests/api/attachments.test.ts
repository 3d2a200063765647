// Attachments over real HTTP, stored in the test run's object store: content
// decides the type, photos get thumbnails, downloads are authorised streams,
// and a store that is down or missing answers 503 while the rest keeps working.
import { createHash } from 'node:crypto'
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import sharp from 'sharp'
import * as XLSX from 'xlsx-republish'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { AttachmentView } from '../../shared/schemas/attachments'
import { attach, fetchBytes, TINY_PDF, testPhoto } from '../helpers/attach'
import { Client, demoEmail, demoProjectId, signedInDemo, useNewAccount } from '../helpers/http'
import { testBody } from '../helpers/lab'
import { createPoint, createProject } from '../helpers/project'
import { startServer, type RunningServer } from '../helpers/server'
import { uploadChunked } from '../helpers/upload'

type View = AttachmentView
interface ErrorBody { message: string, data?: { code?: string, issues?: { path: string }[] } }

const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex')

/** Keys under the project's prefix in the bucket the test servers use. */
async function storedKeys(projectId: string): Promise<string[]> {
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true'
  const s3 = new S3Client({
    endpoint: process.env.PASTLOAD_S3_ENDPOINT,
    region: process.env.PASTLOAD_S3_REGION ?? 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.PASTLOAD_S3_ACCESS_KEY_ID!, secretAccessKey: process.env.PASTLOAD_S3_SECRET_ACCESS_KEY! },
  })
  const r = await s3.send(new ListObjectsV2Command({ Bucket: process.env.PASTLOAD_S3_BUCKET!, Prefix: `projects/${projectId}/` }))
  s3.destroy()
  return (r.Contents ?? []).map(o => o.Key!).sort()
}

async function signInOn(server: RunningServer, email: string): Promise<Client> {
  const c = new Client(server.url)
  const r = await c.post('/api/auth/login', { email, password: 'pastload-demo-2026' })
  if (r.status !== 200) throw new Error(`sign-in on the extra server failed: ${r.status}`)
  return c
}

describe('attachments', () => {
  const { owner, geologist: geo } = signedInDemo('owner', 'geologist')
  const viewerAccount = useNewAccount(owner, 'att-viewer')
  const viewer = viewerAccount.client
  const outsider = useNewAccount(owner, 'att-outsider').client
  let otherProjectId: string
  let otherPointId: string
  let otherSampleId: string
  let photo: Buffer

  /** A project of one test's own: the geologist and the viewer as members, one borehole BH-A1. */
  async function site(): Promise<{ projectId: string, base: string, pointId: string }> {
    const { id: projectId } = await createProject(owner, 'ATT', 'Attachment test site', ['geologist', { email: viewerAccount.email, role: 'viewer' }])
    const pointId = await createPoint(geo, projectId, { identifier: 'BH-A1', easting: 1, northing: 2, groundElevation: 2.5, finalDepth: 25 })
    return { projectId, base: `/api/projects/${projectId}/attachments`, pointId }
  }

  /** The oedometer report on the project, stored by the geologist (one object). */
  async function storePdf(projectId: string): Promise<View> {
    const r = await attach<{ attachment: View }>(geo, projectId, 'LR-03 oedometer.pdf', TINY_PDF, { ownerType: 'project', caption: 'Oedometer report' })
    expect(r.status).toBe(201)
    return r.body.attachment
  }

  /** A core-box photo of the point, stored by the geologist (two objects: the photo and its thumbnail). */
  async function storePng(projectId: string, pointId: string): Promise<View> {
    const r = await attach<{ attachment: View }>(geo, projectId, 'box 1.png', photo, { ownerType: 'point', ownerId: pointId, caption: 'Core box 1' })
    expect(r.status).toBe(201)
    return r.body.attachment
  }

  beforeAll(async () => {
    const other = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `ATO-${Date.now().toString(36)}`, name: 'Another site' })
    otherProjectId = other.body.project.id
    const op = await owner.post<{ point: { id: string } }>(`/api/projects/${otherProjectId}/points`, { identifier: 'BH-Z9', kind: 'borehole', easting: 1, northing: 2, groundElevation: 2.5, finalDepth: 25 })
    otherPointId = op.body.point.id
    const os = await owner.post<{ sample: { id: string } }>(`/api/projects/${otherProjectId}/points/${otherPointId}/samples`, { identifier: 'U1', top: 4, bottom: 4.45, type: 'thin-walled-tube' })
    otherSampleId = os.body.sample.id
    photo = await testPhoto(1000, 600)
  })

  it('stores a PDF report for the project: type from the content, SHA-256, no thumbnail, no storage key in the answer', async () => {
    const { projectId, base } = await site()
    const r = await attach<{ attachment: View }>(geo, projectId, 'LR-03 oedometer.pdf', TINY_PDF, { ownerType: 'project', caption: 'Oedometer report' })
    expect(r.status).toBe(201)
    const pdf = r.body.attachment
    expect(pdf).toMatchObject({ ownerType: 'project', ownerId: null, filename: 'LR-03 oedometer.pdf', contentType: 'application/pdf', kind: 'report', size: TINY_PDF.length, sha256: sha256(TINY_PDF), caption: 'Oedometer report', thumbnailUrl: null })
    expect(pdf.uploadedBy?.displayName).toBe('Ana Ferreira')
    expect(pdf.downloadUrl).toBe(`${base}/${pdf.id}/download`)
    const keys = await storedKeys(projectId)
    expect(keys).toHaveLength(1)
    expect(keys[0]).toMatch(new RegExp(`^projects/${projectId}/[0-9a-f-]{36}$`))
    expect(keys[0]).not.toContain('oedometer')
    expect(JSON.stringify(r.body)).not.toContain(keys[0]!)
  })

  it('stores a photo of a point with a thumbnail of its own; the download returns the same bytes', async () => {
    const { projectId, base, pointId } = await site()
    const r = await attach<{ attachment: View }>(geo, projectId, 'box 1.png', photo, { ownerType: 'point', ownerId: pointId, caption: 'Core box 1' })
    expect(r.status).toBe(201)
    const png = r.body.attachment
    expect(png).toMatchObject({ ownerType: 'point', ownerId: pointId, contentType: 'image/png', kind: 'photo', size: photo.length, sha256: sha256(photo) })
    expect(png.thumbnailUrl).toBe(`${base}/${png.id}/thumbnail`)
    // The photo and its thumbnail.
    expect(await storedKeys(projectId)).toHaveLength(2)

    const d = await fetchBytes(geo, png.downloadUrl)
    expect(d.status).toBe(200)
    expect(d.bytes.equals(photo)).toBe(true)
    expect(d.headers.get('content-type')).toBe('image/png')
    expect(d.headers.get('content-disposition')).toBe('attachment; filename="box 1.png"; filename*=UTF-8\'\'box%201.png')
    expect(d.headers.get('x-content-type-options')).toBe('nosniff')

    const t = await fetchBytes(geo, png.thumbnailUrl!)
    expect(t.status).toBe(200)
    expect(t.headers.get('content-type')).toBe('image/jpeg')
    const meta = await sharp(t.bytes).metadata()
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 320, 192])
    expect(t.bytes.length).toBeLessThan(photo.length)
  })

  it('has no thumbnail for a PDF (404)', async () => {
    const { projectId, base } = await site()
    const pdf = await storePdf(projectId)
    const r = await geo.get<ErrorBody>(`${base}/${pdf.id}/thumbnail`)
    expect(r.status).toBe(404)
    expect(r.body.message).toMatch(/no thumbnail/)
  })

  it('keeps field sheets: CSV and XLSX', async () => {
    const { projectId, base } = await site()
    const csv = await attach<{ attachment: View }>(geo, projectId, 'levels.txt', 'point,depth\nBH-A1,1.6\nBH-A1,1.7\n')
    expect(csv.status).toBe(201)
    expect([csv.body.attachment.contentType, csv.body.attachment.kind]).toEqual(['text/csv', 'sheet'])
    const wb = XLSX.utils.book_new()
    XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['point', 'depth'], ['BH-A1', 1.6]]), 'Levels')
    const xlsx = await attach<{ attachment: View }>(geo, projectId, 'levels.xlsx', XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Buffer)
    expect(xlsx.status).toBe(201)
    expect(xlsx.body.attachment.contentType).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
    for (const a of [csv.body.attachment, xlsx.body.attachment]) expect((await geo.delete(`${base}/${a.id}`)).status).toBe(200)
  })

  it('lists by owner, newest first, in pages', async () => {
    const { projectId, base, pointId } = await site()
    const pdf = await storePdf(projectId)
    const png = await storePng(projectId, pointId)
    const all = await viewer.get<{ attachments: View[], total: number, limit: number, offset: number }>(base)
    expect(all.status).toBe(200)
    expect(all.body.total).toBe(2)
    expect(all.body.attachments.map(a => a.id)).toEqual([png.id, pdf.id])
    const projectOnly = await viewer.get<{ attachments: View[], total: number }>(`${base}?ownerType=project`)
    expect(projectOnly.body.attachments.map(a => a.filename)).toEqual(['LR-03 oedometer.pdf'])
    const ofPoint = await viewer.get<{ attachments: View[], total: number }>(`${base}?ownerType=point&ownerId=${pointId}`)
    expect(ofPoint.body.attachments.map(a => a.filename)).toEqual(['box 1.png'])
    const page2 = await viewer.get<{ attachments: View[], total: number, offset: number }>(`${base}?limit=1&offset=1`)
    expect([page2.body.total, page2.body.offset, page2.body.attachments.map(a => a.id)]).toEqual([2, 1, [pdf.id]])
    expect((await viewer.get(`${base}?limit=500`)).status).toBe(400)
    expect(JSON.stringify(all.body)).not.toMatch(new RegExp(`projects/${projectId}/[0-9a-f]{8}-`))
  })

  it('refuses a type it does not keep with 422 and a message naming it', async () => {
    const { projectId } = await site()
    const gif = await attach<ErrorBody>(geo, projectId, 'site.gif', new Uint8Array([0x47, 0x49, 0x46, 0x38, 0x39, 0x61, 1, 0, 1, 0]))
    expect(gif.status).toBe(422)
    expect(gif.body.message).toMatch(/^site\.gif is a GIF image/)
    const html = await attach<ErrorBody>(geo, projectId, 'report.pdf', '<html><script>alert(1)</script></html>')
    expect(html.status).toBe(422)
    expect(html.body.data?.code).toBe('wrong-type')
    const broken = await attach<ErrorBody>(geo, projectId, 'broken.png', photo.subarray(0, 200))
    expect(broken.status).toBe(422)
    expect(broken.body.message).toMatch(/starts like a PNG image but could not be read/)
    expect(await storedKeys(projectId)).toEqual([])
  })

  it('refuses an empty file with 422', async () => {
    const { projectId } = await site()
    const r = await attach<ErrorBody>(geo, projectId, 'empty.pdf', new Uint8Array(0))
    expect(r.status).toBe(422)
    expect(r.body).toMatchObject({ message: 'empty.pdf is empty (0 bytes).', data: { code: 'empty-file' } })
  })

  it('refuses two files in one upload, and a body that is not multipart, with 400 and what to send', async () => {
    const { base } = await site()
    const form = new FormData()
    form.append('ownerType', 'project')
    form.append('file', new Blob([TINY_PDF]), 'a.pdf')
    form.append('file', new Blob([TINY_PDF]), 'b.pdf')
    const two = await fetch(`${geo.base}${base}`, { method: 'POST', body: form, headers: { cookie: geo.cookie!, origin: geo.origin! } })
    expect(two.status).toBe(400)
    expect((await two.json() as ErrorBody).message).toBe('Send one file per upload.')
    const json = await geo.post<ErrorBody>(base, { ownerType: 'project' })
    expect(json.status).toBe(400)
    expect(json.body.message).toBe('Send the file as multipart form data in a field named "file".')
    const list = await geo.get<{ attachments: View[] }>(`${base}?limit=100`)
    expect(list.body.attachments.map(a => a.filename)).not.toContain('b.pdf')
  })

  it('refuses a file over 25 MB with 413, with or without a Content-Length', async () => {
    const { projectId, base } = await site()
    const big = new Uint8Array(26 * 1024 * 1024).fill(0x25)
    const r = await attach<ErrorBody>(geo, projectId, 'big.pdf', big)
    expect(r.status).toBe(413)
    // Streamed (chunked) so the body-size middleware cannot see its length: the route stops reading at the limit.
    const res = await uploadChunked(geo, base, 'big.pdf', 'application/pdf', '%PDF-1.4\n', 27)
    expect(res.status).toBe(413)
    expect(((await res.json()) as ErrorBody).message).toBe('The file is larger than 25 MB, the limit for an attachment.')
    expect(await storedKeys(projectId)).toEqual([])
  })

  it('checks the owner belongs to the project: another project\'s point or sample is 404', async () => {
    const { projectId } = await site()
    const point = await attach<ErrorBody>(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'point', ownerId: otherPointId })
    expect(point.status).toBe(404)
    expect(point.body.message).toBe('The point to attach to was not found in this project.')
    expect((await attach(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'sample', ownerId: otherSampleId })).status).toBe(404)
    expect((await attach(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'test', ownerId: '00000000-0000-4000-8000-000000000000' })).status).toBe(404)
    // The other project's owner can attach to it in its own project.
    expect((await attach(owner, otherProjectId, 'x.pdf', TINY_PDF, { ownerType: 'sample', ownerId: otherSampleId })).status).toBe(201)
  })

  it('validates the fields: an owner id for a point, none for the project, a bounded caption', async () => {
    const { projectId, pointId } = await site()
    const noId = await attach<ErrorBody>(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'point' })
    expect(noId.status).toBe(400)
    expect(noId.body.data?.issues?.[0]?.path).toBe('ownerId')
    expect((await attach(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'project', ownerId: pointId })).status).toBe(400)
    expect((await attach(geo, projectId, 'x.pdf', TINY_PDF, { ownerType: 'borehole-ish' })).status).toBe(400)
    expect((await attach(geo, projectId, 'x.pdf', TINY_PDF, { caption: 'c'.repeat(501) })).status).toBe(400)
  })

  it('answers 404 to a non-member everywhere, so neither the project nor the file can be probed', async () => {
    const { projectId, base, pointId } = await site()
    const pdf = await storePdf(projectId)
    const png = await storePng(projectId, pointId)
    expect((await fetchBytes(outsider, pdf.downloadUrl)).status).toBe(404)
    expect((await fetchBytes(outsider, png.thumbnailUrl!)).status).toBe(404)
    expect((await outsider.get(base)).status).toBe(404)
    expect((await attach(outsider, projectId, 'x.pdf', TINY_PDF)).status).toBe(404)
    // A member asking for another project's attachment through their own project: 404 too.
    expect((await fetchBytes(geo, `${base}/${pdf.id}/download`.replace(projectId, otherProjectId))).status).toBe(404)
    expect((await fetchBytes(owner, `/api/projects/${otherProjectId}/attachments/${pdf.id}/download`)).status).toBe(404)
  })

  it('lets a viewer download but not upload or delete', async () => {
    const { projectId, base } = await site()
    const pdf = await storePdf(projectId)
    const d = await fetchBytes(viewer, pdf.downloadUrl)
    expect(d.status).toBe(200)
    expect(d.bytes.toString('latin1')).toBe(TINY_PDF)
    expect(d.headers.get('content-type')).toBe('application/pdf')
    expect((await attach(viewer, projectId, 'x.pdf', TINY_PDF)).status).toBe(403)
    expect((await viewer.delete(`${base}/${pdf.id}`)).status).toBe(403)
  })

  it('deletes the row and both stored objects, and audits upload and delete without storage keys', async () => {
    const { projectId, base, pointId } = await site()
    const pdf = await storePdf(projectId)
    const [pdfKey] = await storedKeys(projectId)
    const png = await storePng(projectId, pointId)
    expect(await storedKeys(projectId)).toHaveLength(3)
    const r = await geo.delete(`${base}/${png.id}`)
    expect(r.status).toBe(200)
    expect(await storedKeys(projectId)).toEqual([pdfKey])
    expect((await fetchBytes(geo, png.downloadUrl)).status).toBe(404)
    expect((await geo.delete(`${base}/${png.id}`)).status).toBe(404)
    const list = await geo.get<{ attachments: View[] }>(base)
    expect(list.body.attachments.map(a => a.id)).toEqual([pdf.id])

    const audit = await owner.get<{ events: { action: string, entity: string, entityId: string, after: unknown, before: unknown }[] }>(`/api/projects/${projectId}/audit?limit=100`)
    const mine = audit.body.events.filter(e => e.entity === 'attachment' && e.entityId === png.id)
    expect(mine.map(e => e.action)).toEqual(['delete', 'create'])
    expect(mine[1]!.after).toMatchObject({ filename: 'box 1.png', sha256: png.sha256, ownerType: 'point', ownerId: pointId })
    expect(JSON.stringify(audit.body)).not.toMatch(/objectKey|thumbnailKey/)
  })

  it('moves the files of a deleted point, sample or test to the project with a caption saying where they came from', async () => {
    const { projectId, base } = await site()
    const pt = await geo.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: 'BH-A2', kind: 'borehole', easting: 5, northing: 6, groundElevation: 2.4, finalDepth: 20 })
    const p2 = pt.body.point.id
    const mkSample = async (identifier: string, top: number) => (await geo.post<{ sample: { id: string } }>(`/api/projects/${projectId}/points/${p2}/samples`, { identifier, top, bottom: top + 0.45, type: 'thin-walled-tube' })).body.sample.id
    const s1 = await mkSample('U1', 4)
    const s2 = await mkSample('U2', 7)
    const t1 = await owner.post<{ test: { id: string } }>(`/api/projects/${projectId}/tests/oedometer`, testBody(s2, 'OED-A2'))
    expect(t1.status).toBe(201)
    const testId = t1.body.test.id
    const up = async (name: string, fields: Record<string, string>) => {
      const r = await attach<{ attachment: View }>(geo, projectId, name, TINY_PDF, fields)
      expect(r.status).toBe(201)
      return r.body.attachment.id
    }
    const onTest = await up('oed.pdf', { ownerType: 'test', ownerId: testId, caption: 'Lab sheet' })
    const onSample = await up('u1.pdf', { ownerType: 'sample', ownerId: s1 })
    const onPoint = await up('log.pdf', { ownerType: 'point', ownerId: p2, caption: 'Driller log' })
    const keysBefore = await storedKeys(projectId)
    const byId = async () => new Map((await geo.get<{ attachments: View[] }>(`${base}?limit=100`)).body.attachments.map(a => [a.id, a]))

    // A test deleted on its own: its file moves up to the project.
    expect((await owner.delete(`/api/projects/${projectId}/tests/oedometer/${testId}`)).status).toBe(200)
    let all = await byId()
    expect(all.get(onTest)).toMatchObject({ ownerType: 'project', ownerId: null, caption: 'Moved to the project when the oedometer test on BH-A2 U2 was deleted. Lab sheet' })
    expect(all.get(onSample)).toMatchObject({ ownerType: 'sample', ownerId: s1 })

    // A point deleted with its samples: the point's and the sample's files move too.
    expect((await geo.delete(`/api/projects/${projectId}/points/${p2}`)).status).toBe(200)
    all = await byId()
    expect(all.get(onPoint)).toMatchObject({ ownerType: 'project', ownerId: null, caption: 'Moved to the project when point BH-A2 was deleted. Driller log' })
    expect(all.get(onSample)).toMatchObject({ ownerType: 'project', ownerId: null, caption: 'Moved to the project when point BH-A2 was deleted.' })
    expect(await storedKeys(projectId)).toEqual(keysBefore)
    expect((await fetchBytes(geo, all.get(onSample)!.downloadUrl)).bytes.toString('latin1')).toBe(TINY_PDF)

    const audit = await owner.get<{ events: { action: string, entity: string, entityId: string, before: { ownerType: string }, after: { ownerType: string } }[] }>(`/api/projects/${projectId}/audit?limit=100`)
    const moved = audit.body.events.filter(e => e.entity === 'attachment' && e.action === 'update' && e.entityId === onSample)
    expect(moved.map(e => [e.before.ownerType, e.after.ownerType])).toEqual([['sample', 'project']])
    for (const id of [onTest, onSample, onPoint]) expect((await geo.delete(`${base}/${id}`)).status).toBe(200)
  })

  it('moves a deleted sample\'s files and those of its tests', async () => {
    const { projectId, base, pointId } = await site()
    const s = await geo.post<{ sample: { id: string } }>(`/api/projects/${projectId}/points/${pointId}/samples`, { identifier: 'U9', top: 9, bottom: 9.45, type: 'piston' })
    const sampleId = s.body.sample.id
    const t = await owner.post<{ test: { id: string } }>(`/api/projects/${projectId}/tests/oedometer`, testBody(sampleId, 'OED-U9'))
    const a = await attach<{ attachment: View }>(geo, projectId, 't.pdf', TINY_PDF, { ownerType: 'test', ownerId: t.body.test.id })
    const b = await attach<{ attachment: View }>(geo, projectId, 's.pdf', TINY_PDF, { ownerType: 'sample', ownerId: sampleId })
    expect((await geo.delete(`/api/projects/${projectId}/points/${pointId}/samples/${sampleId}`)).status).toBe(200)
    const list = await geo.get<{ attachments: View[] }>(`${base}?ownerType=project&limit=100`)
    const captions = new Map(list.body.attachments.map(x => [x.id, x.caption]))
    expect(captions.get(a.body.attachment.id)).toBe('Moved to the project when sample U9 of BH-A1 was deleted.')
    expect(captions.get(b.body.attachment.id)).toBe('Moved to the project when sample U9 of BH-A1 was deleted.')
    for (const id of [a.body.attachment.id, b.body.attachment.id]) expect((await geo.delete(`${base}/${id}`)).status).toBe(200)
  })

  it('seeded the demo project with a lab report, core-box photos and a field sheet', async () => {
    const demoId = await demoProjectId(owner)
    const r = await owner.get<{ attachments: View[], total: number }>(`/api/projects/${demoId}/attachments?ownerType=project`)
    expect(r.status).toBe(200)
    expect(r.body.attachments.map(a => [a.filename, a.contentType]).sort()).toEqual([
      ['BH-02 core box 1.png', 'image/png'],
      ['BH-02 water levels.csv', 'text/csv'],
      ['LR-0417-03 oedometer tests BH-02 BH-04.pdf', 'application/pdf'],
    ])
    const report = r.body.attachments.find(a => a.kind === 'report')!
    const d = await fetchBytes(owner, report.downloadUrl)
    expect(d.bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(sha256(d.bytes)).toBe(report.sha256)
    const box = r.body.attachments.find(a => a.kind === 'photo')!
    expect(box.uploadedBy?.displayName).toBe('Ana Ferreira')
    expect((await fetchBytes(owner, box.thumbnailUrl!)).status).toBe(200)
    const atPoints = await owner.get<{ total: number }>(`/api/projects/${demoId}/attachments?ownerType=point`)
    expect(atPoints.body.total).toBe(1)
  })

  describe('when object storage is down or not configured', () => {
    let down: RunningServer
    let bare: RunningServer
    let projectId: string
    let base: string
    let pdf: View
    beforeAll(async () => {
      // A project of this block's own, with a report stored while the store was up.
      const s = await site()
      projectId = s.projectId
      base = s.base
      pdf = await storePdf(projectId)
      down = await startServer({ PASTLOAD_S3_ENDPOINT: 'http://127.0.0.1:9' })
      bare = await startServer({ PASTLOAD_S3_BUCKET: '' })
    })
    afterAll(async () => {
      await down?.stop()
      await bare?.stop()
    })

    it('answers 503 on every attachment route with a plain message, while the rest of the app works', async () => {
      const c = await signInOn(down, demoEmail('geologist'))
      const list = await c.get<ErrorBody>(base)
      expect(list.status).toBe(503)
      expect(list.body.message).toMatch(/^Object storage is not reachable right now/)
      const up = await attach<ErrorBody>(c, projectId, 'x.pdf', TINY_PDF)
      expect(up.status).toBe(503)
      expect(up.body.data?.code).toBe('storage-unreachable')
      expect((await fetchBytes(c, pdf.downloadUrl)).status).toBe(503)
      expect((await c.delete(`${base}/${pdf.id}`)).status).toBe(503)
      expect((await c.get(`/api/projects/${projectId}`)).status).toBe(200)
      expect((await c.get(`/api/projects/${projectId}/points`)).status).toBe(200)
      // Nothing was removed by the failed delete.
      expect((await fetchBytes(geo, pdf.downloadUrl)).status).toBe(200)
    })

    it('says storage is not configured when no bucket is set', async () => {
      const c = await signInOn(bare, demoEmail('geologist'))
      const list = await c.get<ErrorBody>(base)
      expect(list.status).toBe(503)
      expect(list.body.message).toMatch(/object storage is not configured/)
      expect((await attach(c, projectId, 'x.pdf', TINY_PDF)).status).toBe(503)
      expect((await c.get('/api/health')).status).toBe(200)
    })
  })
})
