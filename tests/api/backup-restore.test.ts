// Backups that are proven: `npm run backup` takes the test database and bucket
// while a project the test built (a point, a PDF and a photo with its
// thumbnail) is in them; the project is then deleted, and `npm run restore`
// brings the backup into a separate database and bucket on the same test
// cluster and store (so the running test server is not disturbed). Row counts
// of every table, the files' bytes and a server started on the restored copy
// prove it.
import { execFile } from 'node:child_process'
import { createHash, randomUUID } from 'node:crypto'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { GetObjectCommand, S3Client } from '@aws-sdk/client-s3'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { attach, fetchBytes, TINY_PDF, testPhoto } from '../helpers/attach'
import { Client, demoEmail, signIn } from '../helpers/http'
import { ROOT, startServer } from '../helpers/server'

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true'

interface Run { code: number, out: string }

/** Runs one of the npm scripts' files with the given database and bucket. */
function script(file: string, args: string[], env: Record<string, string>): Promise<Run> {
  return new Promise((resolve) => {
    execFile(process.execPath, [join(ROOT, 'scripts', file), ...args], { cwd: ROOT, env: { ...process.env, ...env }, timeout: 120_000 }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === 'number' ? err.code : 1) : 0
      resolve({ code, out: `${stdout}${stderr}` })
    })
  })
}

/** Rows in every table outside PostgreSQL's own schemas, by "schema.table". */
async function tableCounts(url: string): Promise<Record<string, number>> {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    const tables = (await db.query<{ s: string, t: string }>(`select schemaname as s, tablename as t from pg_tables where schemaname not in ('pg_catalog', 'information_schema') order by 1, 2`)).rows
    const counts: Record<string, number> = {}
    for (const { s, t } of tables) counts[`${s}.${t}`] = Number((await db.query<{ n: string }>(`select count(*) as n from "${s}"."${t}"`)).rows[0]!.n)
    return counts
  }
  finally {
    await db.end()
  }
}

async function query<T extends pg.QueryResultRow>(url: string, text: string, values: unknown[] = []): Promise<T[]> {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    return (await db.query<T>(text, values)).rows
  }
  finally {
    await db.end()
  }
}

const sha256 = (b: Buffer | string) => createHash('sha256').update(b).digest('hex')

// Each restore runs pg_restore and a Node script: allow for a busy machine.
describe('backup and restore', { timeout: 120_000 }, () => {
  const sourceUrl = process.env.DATABASE_URL!
  const tag = randomUUID().slice(0, 8)
  const folder = join(mkdtempSync(join(tmpdir(), 'pastload-backup-')), 'backup')
  // The test cluster's superuser, over its socket (trust on local connections), creates and drops the extra databases.
  const port = Number(new URL(sourceUrl).port)
  const superuser = { host: `/tmp/pastload-pg-${port}`, port, user: 'postgres', database: 'postgres' }
  const created: string[] = []
  let owner: Client
  let projectId: string
  let photo: Buffer
  let pdfId: string
  let photoId: string
  let photoKey: string
  let countsAtBackup: Record<string, number>
  let backupRun: Run

  /** A new empty database owned by the app's role, and a bucket name of its own, for one restore. */
  async function freshTarget(): Promise<{ url: string, bucket: string, env: Record<string, string> }> {
    const name = `pastload_restore_${tag}_${created.length}`
    const admin = new pg.Client(superuser)
    await admin.connect()
    await admin.query(`create database ${name} owner pastload`)
    await admin.end()
    created.push(name)
    const u = new URL(sourceUrl)
    u.pathname = `/${name}`
    const bucket = `restored-${tag}-${created.length}`
    return { url: u.toString(), bucket, env: { DATABASE_URL: u.toString(), PASTLOAD_S3_BUCKET: bucket } }
  }

  // One backup for the file: a project built here, counted, backed up, then deleted from the test database.
  beforeAll(async () => {
    owner = await signIn(demoEmail('owner'))
    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `BKP-${tag}`, name: 'Backup round-trip site' })
    expect(p.status).toBe(201)
    projectId = p.body.project.id
    const pt = await owner.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: 'BH-K1', kind: 'borehole', easting: 10, northing: 20, groundElevation: 2.1, finalDepth: 18 })
    expect(pt.status).toBe(201)
    photo = await testPhoto(400, 300)
    const a = await attach<{ attachment: { id: string } }>(owner, projectId, 'report.pdf', TINY_PDF, { caption: 'Backed-up report' })
    const b = await attach<{ attachment: { id: string } }>(owner, projectId, 'core.png', photo, { ownerType: 'point', ownerId: pt.body.point.id })
    expect([a.status, b.status]).toEqual([201, 201])
    pdfId = a.body.attachment.id
    photoId = b.body.attachment.id
    // Other files may have stored the same picture: the photo is found in the backup by its own key.
    const [stored] = await query<{ object_key: string }>(sourceUrl, 'select object_key from attachments where id = $1', [photoId])
    photoKey = stored!.object_key
    countsAtBackup = await tableCounts(sourceUrl)
    backupRun = await script('backup.mjs', ['--out', folder], {})
    expect(backupRun.code, backupRun.out).toBe(0)
    await query(sourceUrl, 'delete from projects where id = $1', [projectId])
  })

  afterAll(async () => {
    const admin = new pg.Client(superuser)
    await admin.connect()
    for (const name of created) await admin.query(`drop database if exists ${name} with (force)`)
    await admin.end()
    rmSync(join(folder, '..'), { recursive: true, force: true })
  })

  it('the backup holds the dump and every file of the project, and its log names no password', async () => {
    const manifest = JSON.parse(readFileSync(join(folder, 'manifest.json'), 'utf8')) as { objects: { key: string, sha256: string }[], objectStore: { missing: string[] } }
    // The project is gone from the test database; its files are still in the bucket (the sweep removes them after an hour).
    expect((await owner.get(`/api/projects/${projectId}`)).status).toBe(404)
    const photoEntry = manifest.objects.filter(o => o.key === photoKey)
    expect(photoEntry).toHaveLength(1)
    expect(photoEntry[0]!.sha256).toBe(sha256(photo))
    expect(manifest.objects.filter(o => o.sha256 === sha256(TINY_PDF)).length).toBeGreaterThanOrEqual(1)
    expect(manifest.objectStore.missing).toEqual([])
    expect(readFileSync(join(folder, 'objects', photoEntry[0]!.key)).equals(photo)).toBe(true)
    expect(backupRun.out).not.toContain(decodeURIComponent(new URL(sourceUrl).password))
  })

  it('restores into an empty database and bucket: every table has its rows and the photo its bytes', async () => {
    const target = await freshTarget()
    const restore = await script('restore.mjs', [folder], target.env)
    expect(restore.code, restore.out).toBe(0)
    expect(await tableCounts(target.url)).toEqual(countsAtBackup)
    const [project] = await query<{ job_number: string }>(target.url, 'select job_number from projects where id = $1', [projectId])
    expect(project?.job_number).toBe(`BKP-${tag}`)
    const rows = await query<{ object_key: string, thumbnail_key: string | null }>(target.url, 'select object_key, thumbnail_key from attachments where project_id = $1', [projectId])
    expect(rows).toHaveLength(2)

    const s3 = new S3Client({
      endpoint: process.env.PASTLOAD_S3_ENDPOINT,
      region: process.env.PASTLOAD_S3_REGION ?? 'us-east-1',
      forcePathStyle: true,
      credentials: { accessKeyId: process.env.PASTLOAD_S3_ACCESS_KEY_ID!, secretAccessKey: process.env.PASTLOAD_S3_SECRET_ACCESS_KEY! },
    })
    try {
      const [row] = await query<{ object_key: string, sha256: string }>(target.url, 'select object_key, sha256 from attachments where id = $1', [photoId])
      const got = await s3.send(new GetObjectCommand({ Bucket: target.bucket, Key: row!.object_key }))
      const bytes = Buffer.from(await got.Body!.transformToByteArray())
      expect(bytes.equals(photo)).toBe(true)
      expect(sha256(bytes)).toBe(row!.sha256)
    }
    finally {
      s3.destroy()
    }
  })

  it('refuses to restore over a database that holds tables, and --force makes it the backup again', async () => {
    const target = await freshTarget()
    expect((await script('restore.mjs', [folder], target.env)).code).toBe(0)
    await query(target.url, `update projects set name = 'Changed after the restore' where id = $1`, [projectId])

    const again = await script('restore.mjs', [folder], target.env)
    expect(again.code).toBe(4)
    expect(again.out).toMatch(/already holds \d+ table\(s\).*--force/)
    const [unchanged] = await query<{ name: string }>(target.url, 'select name from projects where id = $1', [projectId])
    expect(unchanged?.name).toBe('Changed after the restore')

    const forced = await script('restore.mjs', [folder, '--force'], target.env)
    expect(forced.code, forced.out).toBe(0)
    expect(await tableCounts(target.url)).toEqual(countsAtBackup)
    const [project] = await query<{ name: string }>(target.url, 'select name from projects where id = $1', [projectId])
    expect(project?.name).toBe('Backup round-trip site')
  })

  it('a server started on a restored database and bucket serves the project and its files', async () => {
    const target = await freshTarget()
    expect((await script('restore.mjs', [folder], target.env)).code).toBe(0)
    const server = await startServer(target.env)
    try {
      const c = new Client(server.url)
      expect((await c.post('/api/auth/login', { email: demoEmail('owner'), password: 'pastload-demo-2026' })).status).toBe(200)
      const p = await c.get<{ project: { jobNumber: string } }>(`/api/projects/${projectId}`)
      expect(p.status).toBe(200)
      expect(p.body.project.jobNumber).toBe(`BKP-${tag}`)
      const pdf = await fetchBytes(c, `/api/projects/${projectId}/attachments/${pdfId}/download`)
      expect(pdf.status).toBe(200)
      expect(pdf.bytes.toString('latin1')).toBe(TINY_PDF)
      const thumb = await fetchBytes(c, `/api/projects/${projectId}/attachments/${photoId}/thumbnail`)
      expect(thumb.status).toBe(200)
      expect(thumb.bytes.subarray(0, 3).toString('hex')).toBe('ffd8ff')
    }
    finally {
      await server.stop()
    }
  })
})
