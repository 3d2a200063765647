// Orphaned attachment objects: an upload cut off mid-stream, and an object
// stored by a process that died before writing its row, leave nothing behind
// once the sweep has run. A second server works on a bucket of its own with a
// one-second age threshold, so the shared test bucket is never swept.
import { randomUUID } from 'node:crypto'
import { request } from 'node:http'
import { CreateBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { attach, fetchBytes, TINY_PDF } from '../helpers/attach'
import { Client, demoEmail } from '../helpers/http'
import { startServer, type RunningServer } from '../helpers/server'

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true'

const bucket = `sweep-${Date.now().toString(36)}`

function s3(): S3Client {
  return new S3Client({
    endpoint: process.env.PASTLOAD_S3_ENDPOINT,
    region: process.env.PASTLOAD_S3_REGION ?? 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.PASTLOAD_S3_ACCESS_KEY_ID!, secretAccessKey: process.env.PASTLOAD_S3_SECRET_ACCESS_KEY! },
  })
}

async function bucketKeys(client: S3Client): Promise<string[]> {
  const r = await client.send(new ListObjectsV2Command({ Bucket: bucket }))
  return (r.Contents ?? []).map(o => o.Key!).sort()
}

/** Every key any attachment row refers to. */
async function referencedKeys(db: pg.Client): Promise<Set<string>> {
  const r = await db.query<{ k: string }>('select object_key as k from attachments union select thumbnail_key from attachments where thumbnail_key is not null')
  return new Set(r.rows.map(x => x.k))
}

/** Polls until the bucket holds only referenced keys (the sweep runs every 300 ms on the extra server). */
async function untilNoOrphans(client: S3Client, db: pg.Client): Promise<string[]> {
  const deadline = Date.now() + 30_000
  for (;;) {
    const keys = await bucketKeys(client)
    const referenced = await referencedKeys(db)
    const orphans = keys.filter(k => !referenced.has(k))
    if (orphans.length === 0 || Date.now() > deadline) return orphans
    await new Promise(r => setTimeout(r, 250))
  }
}

/** Sends the head of a multipart upload that announces 2 MB, then cuts the connection. */
async function abortedUpload(c: Client, projectId: string): Promise<void> {
  const boundary = '----pastload-cut-upload'
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n`)
  const url = new URL(`${c.base}/api/projects/${projectId}/attachments`)
  await new Promise<void>((resolve) => {
    const req = request({
      host: url.hostname, port: url.port, path: url.pathname, method: 'POST',
      headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(2 * 1024 * 1024), 'cookie': c.cookie, 'origin': c.origin ?? '' },
    })
    req.on('error', () => resolve())
    req.on('close', () => resolve())
    req.write(head)
    req.write(Buffer.alloc(256 * 1024, 0x41), () => setTimeout(() => req.destroy(), 200))
  })
}

describe('orphaned attachment objects', { timeout: 90_000 }, () => {
  let server: RunningServer
  let client: S3Client
  let db: pg.Client

  beforeAll(async () => {
    client = s3()
    await client.send(new CreateBucketCommand({ Bucket: bucket }))
    db = new pg.Client({ connectionString: process.env.DATABASE_URL })
    await db.connect()
    server = await startServer({ PASTLOAD_S3_BUCKET: bucket, PASTLOAD_ORPHAN_AGE_MS: '1000', PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS: '300' })
  })

  afterAll(async () => {
    await server?.stop()
    await db?.end()
    client?.destroy()
  })

  async function ownerOnServer(): Promise<{ c: Client, projectId: string }> {
    const c = new Client(server.url)
    expect((await c.post('/api/auth/login', { email: demoEmail('owner'), password: 'pastload-demo-2026' })).status).toBe(200)
    const p = await c.post<{ project: { id: string } }>('/api/projects', { jobNumber: `ORP-${randomUUID().slice(0, 8)}`, name: 'Orphaned object site' })
    expect(p.status).toBe(201)
    return { c, projectId: p.body.project.id }
  }

  it('an upload cut off mid-stream and an object left by a dead process are gone after the sweep; attached files stay', async () => {
    const { c, projectId } = await ownerOnServer()
    const kept = await attach<{ attachment: { id: string, downloadUrl: string } }>(c, projectId, 'kept.pdf', TINY_PDF)
    expect(kept.status).toBe(201)

    await abortedUpload(c, projectId)
    // What a process killed between storing the file and writing its row leaves behind.
    const stray = `projects/${projectId}/${randomUUID()}`
    await client.send(new PutObjectCommand({ Bucket: bucket, Key: stray, Body: Buffer.from('%PDF-1.4 stray'), ContentType: 'application/pdf' }))
    expect(await bucketKeys(client)).toContain(stray)

    expect(await untilNoOrphans(client, db)).toEqual([])
    const keys = await bucketKeys(client)
    expect(keys).not.toContain(stray)
    const [row] = (await db.query<{ object_key: string }>('select object_key from attachments where id = $1', [kept.body.attachment.id])).rows
    expect(keys).toEqual([row!.object_key])

    const download = await fetchBytes(c, kept.body.attachment.downloadUrl)
    expect(download.status).toBe(200)
    expect(download.bytes.toString('latin1')).toBe(TINY_PDF)
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
  })

  it('the files of a project whose rows are gone leave the bucket; other projects keep theirs', async () => {
    const a = await ownerOnServer()
    const b = await ownerOnServer()
    const fa = await attach<{ attachment: { id: string } }>(a.c, a.projectId, 'a.pdf', TINY_PDF)
    const fb = await attach<{ attachment: { id: string } }>(b.c, b.projectId, 'b.pdf', TINY_PDF)
    expect([fa.status, fb.status]).toEqual([201, 201])
    const keyOf = async (id: string) => (await db.query<{ object_key: string }>('select object_key from attachments where id = $1', [id])).rows[0]!.object_key
    const keyA = await keyOf(fa.body.attachment.id)
    const keyB = await keyOf(fb.body.attachment.id)
    // Rows removed without their objects, as deleting a project does (its attachments cascade).
    await db.query('delete from attachments where id = $1', [fa.body.attachment.id])

    expect(await untilNoOrphans(client, db)).toEqual([])
    const keys = await bucketKeys(client)
    expect(keys).not.toContain(keyA)
    expect(keys).toContain(keyB)
  })
})
