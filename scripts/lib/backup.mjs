// Backup and restore of Pastload's two stores: the PostgreSQL database
// (`pg_dump -Fc` / `pg_restore` from Debian's client) and the attachment bucket
// (any S3-compatible store, through the S3 API: list + get, put). Used by
// scripts/backup.mjs and scripts/restore.mjs; the functions take explicit
// settings so a test can back up one database and bucket and restore into others.
import { spawn } from 'node:child_process'
import { createHash } from 'node:crypto'
import { chmodSync, createWriteStream, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname, join, relative, resolve, sep } from 'node:path'
import { pipeline } from 'node:stream/promises'
import pg from 'pg'
import { ensurePostgresInstalled } from './postgres.mjs'

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true'

export const MANIFEST = 'manifest.json'
export const DUMP = 'database.dump'
export const OBJECTS = 'objects'


async function s3Client(settings) {
  const { S3Client } = await import('@aws-sdk/client-s3')
  return new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    credentials: settings.credentials,
    forcePathStyle: settings.forcePathStyle,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
}

/** Connection parameters for the client tools: the password goes in the environment, never on a command line. */
function pgToolArgs(url) {
  const u = new URL(url)
  const password = decodeURIComponent(u.password)
  u.password = ''
  return { dbname: u.toString(), env: { ...process.env, PGPASSWORD: password, PGCONNECT_TIMEOUT: '10' } }
}

function run(bin, args, env) {
  return new Promise((resolvePromise, reject) => {
    const child = spawn(bin, args, { env, stdio: ['ignore', 'inherit', 'pipe'] })
    let stderr = ''
    child.stderr.on('data', (d) => { stderr += d.toString() })
    child.once('error', reject)
    child.once('exit', (code) => {
      if (code === 0) resolvePromise(stderr)
      else reject(new Error(`${bin.split('/').pop()} exited with code ${code}: ${stderr.trim().slice(0, 2000)}`))
    })
  })
}

/** A key is written under `objects/` exactly as named; a key that would climb out of it is refused. */
function objectPath(folder, key) {
  const root = resolve(folder, OBJECTS)
  const path = resolve(root, key)
  if (!path.startsWith(root + sep) || key.includes('\0')) throw new Error(`Refusing an object key that is not a plain path: ${JSON.stringify(key.slice(0, 100))}`)
  return path
}

/** A folder name from the time: 2026-12-02T08-30-00Z. */
export function datedName(now = new Date()) {
  return now.toISOString().replace(/\.\d+Z$/, 'Z').replace(/:/g, '-')
}

/**
 * Writes `database.dump`, `objects/<key>` and `manifest.json` into `folder`.
 * The dump and the list of files the rows refer to are read in one snapshot;
 * the bucket is copied after the dump, so every file a restored row refers to
 * is in the backup (a file deleted in between is reported as missing).
 */
export async function backup({ databaseUrl, s3, folder, log = () => {} }) {
  if (existsSync(folder) && existsSync(join(folder, MANIFEST))) throw new Error(`${folder} already holds a backup: choose another folder.`)
  // A backup holds password hashes and every file: readable by its owner only.
  mkdirSync(folder, { recursive: true, mode: 0o700 })
  chmodSync(folder, 0o700)
  const started = Date.now()
  const bin = ensurePostgresInstalled()
  const { dbname, env } = pgToolArgs(databaseUrl)

  // Hold a repeatable-read transaction open and hand its snapshot to pg_dump, so the dump and the key list agree.
  const db = new pg.Client({ connectionString: databaseUrl })
  await db.connect()
  let referenced = []
  let serverVersion = ''
  try {
    await db.query('begin isolation level repeatable read, read only')
    const snapshot = (await db.query('select pg_export_snapshot() as s')).rows[0].s
    serverVersion = (await db.query('show server_version')).rows[0].server_version
    const hasTable = (await db.query(`select to_regclass('public.attachments') is not null as t`)).rows[0].t
    if (hasTable) {
      referenced = (await db.query('select object_key as k from attachments union select thumbnail_key from attachments where thumbnail_key is not null')).rows.map(r => r.k)
    }
    log(`Dumping the database (pg_dump -Fc, PostgreSQL ${serverVersion})…`)
    await run(join(bin, 'pg_dump'), ['--dbname', dbname, '-Fc', '--no-owner', '--no-privileges', `--snapshot=${snapshot}`, '-f', join(folder, DUMP)], env)
    await db.query('commit')
  }
  finally {
    await db.end()
  }
  const dumpDone = Date.now()

  const objects = []
  let bytes = 0
  if (s3) {
    log(`Copying the bucket "${s3.bucket}"…`)
    const { GetObjectCommand, ListObjectsV2Command } = await import('@aws-sdk/client-s3')
    const client = await s3Client(s3)
    try {
      let token
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket: s3.bucket, ContinuationToken: token, MaxKeys: 1000 }))
        token = page.IsTruncated ? page.NextContinuationToken : undefined
        for (const o of page.Contents ?? []) {
          const path = objectPath(folder, o.Key)
          mkdirSync(dirname(path), { recursive: true })
          const got = await client.send(new GetObjectCommand({ Bucket: s3.bucket, Key: o.Key }))
          const hash = createHash('sha256')
          got.Body.on('data', d => hash.update(d))
          await pipeline(got.Body, createWriteStream(path))
          const size = got.ContentLength ?? o.Size ?? 0
          bytes += size
          objects.push({ key: o.Key, size, contentType: got.ContentType ?? 'application/octet-stream', sha256: hash.digest('hex') })
        }
      } while (token)
    }
    finally {
      client.destroy()
    }
  }
  const copied = new Set(objects.map(o => o.key))
  const missing = s3 ? referenced.filter(k => !copied.has(k)) : []
  const manifest = {
    kind: 'pastload-backup',
    version: 1,
    createdAt: new Date(started).toISOString(),
    database: { file: DUMP, format: 'pg_dump custom (-Fc)', serverVersion, name: new URL(databaseUrl).pathname.slice(1) },
    objectStore: s3 ? { bucket: s3.bucket, folder: OBJECTS, count: objects.length, bytes, referencedByRows: referenced.length, missing } : null,
    durationMs: { database: dumpDone - started, objects: Date.now() - dumpDone, total: Date.now() - started },
    objects,
  }
  writeFileSync(join(folder, MANIFEST), JSON.stringify(manifest, null, 2))
  return manifest
}

export function readManifest(folder) {
  const file = join(folder, MANIFEST)
  if (!existsSync(file)) throw new Error(`${folder} is not a Pastload backup (no ${MANIFEST}).`)
  const manifest = JSON.parse(readFileSync(file, 'utf8'))
  if (manifest.kind !== 'pastload-backup' || manifest.version !== 1) throw new Error(`${file} is not a version-1 Pastload backup manifest.`)
  return manifest
}

/** Tables in the database outside PostgreSQL's own schemas. */
async function userTableCount(databaseUrl) {
  const db = new pg.Client({ connectionString: databaseUrl })
  await db.connect()
  try {
    return Number((await db.query(`select count(*)::int as n from pg_tables where schemaname not in ('pg_catalog', 'information_schema')`)).rows[0].n)
  }
  finally {
    await db.end()
  }
}

/** Empties the database the dump restores into: its schemas are dropped and `public` is made again. */
async function clearDatabase(databaseUrl) {
  const db = new pg.Client({ connectionString: databaseUrl })
  await db.connect()
  try {
    const schemas = (await db.query(`select nspname from pg_namespace where nspname not in ('pg_catalog', 'information_schema', 'pg_toast') and nspname not like 'pg_temp_%' and nspname not like 'pg_toast_temp_%'`)).rows.map(r => r.nspname)
    for (const s of schemas) await db.query(`drop schema if exists "${s.replace(/"/g, '""')}" cascade`)
    await db.query('create schema if not exists public')
  }
  finally {
    await db.end()
  }
}

/**
 * Restores a backup folder: the database into `databaseUrl` (refused when it
 * already holds tables, unless `force`, which empties it first) and every
 * object into the bucket (created when missing). Each object's SHA-256 is
 * checked against the manifest before it is stored.
 */
export async function restore({ folder, databaseUrl, s3, force = false, log = () => {} }) {
  const manifest = readManifest(folder)
  const started = Date.now()
  const tables = await userTableCount(databaseUrl)
  if (tables > 0 && !force) {
    throw Object.assign(new Error(`The target database already holds ${tables} table(s). Restoring would overwrite it: run again with --force to empty it first.`), { code: 'NOT_EMPTY' })
  }
  if (manifest.objectStore && !s3) throw new Error('The backup holds attachment files but no bucket is configured: set PASTLOAD_S3_* or let the script start the local store.')
  // The files are checked before anything is written, so a damaged backup changes nothing.
  for (const o of manifest.objects) {
    const sha = createHash('sha256').update(readFileSync(objectPath(folder, o.key))).digest('hex')
    if (sha !== o.sha256) throw new Error(`The backup's copy of ${o.key} does not match its manifest (damaged backup): nothing was restored.`)
  }
  if (tables > 0) {
    log(`Emptying the target database (${tables} tables, --force)…`)
    await clearDatabase(databaseUrl)
  }
  const bin = ensurePostgresInstalled()
  const { dbname, env } = pgToolArgs(databaseUrl)
  log('Restoring the database (pg_restore)…')
  await run(join(bin, 'pg_restore'), ['--dbname', dbname, '--no-owner', '--no-privileges', '--exit-on-error', '--single-transaction', join(folder, DUMP)], env)
  const dbDone = Date.now()

  if (manifest.objects.length > 0) {
    const { CreateBucketCommand, HeadBucketCommand, PutObjectCommand } = await import('@aws-sdk/client-s3')
    const client = await s3Client(s3)
    try {
      try {
        await client.send(new HeadBucketCommand({ Bucket: s3.bucket }))
      }
      catch (err) {
        if (err?.$metadata?.httpStatusCode !== 404) throw err
        log(`Creating the bucket "${s3.bucket}"`)
        await client.send(new CreateBucketCommand({ Bucket: s3.bucket }))
      }
      log(`Restoring ${manifest.objects.length} file(s) into the bucket "${s3.bucket}"…`)
      for (const o of manifest.objects) {
        const body = readFileSync(objectPath(folder, o.key))
        await client.send(new PutObjectCommand({ Bucket: s3.bucket, Key: o.key, Body: body, ContentType: o.contentType, ContentLength: body.length }))
      }
    }
    finally {
      client.destroy()
    }
  }
  return { manifest, durationMs: { database: dbDone - started, objects: Date.now() - dbDone, total: Date.now() - started } }
}

/** Where a backup folder goes by default. */
export function defaultBackupFolder(projectRoot) {
  return join(projectRoot, '.data', 'backups', datedName())
}

export function describePath(projectRoot, path) {
  const rel = relative(projectRoot, path)
  return rel.startsWith('..') ? path : rel
}
