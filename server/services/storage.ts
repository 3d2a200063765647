import type { Readable } from 'node:stream'
import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import { type StorageConfig, storageConfigFromEnv } from '#shared/storage/config.js'
import { logServerError } from '../utils/error-log'

/**
 * Object storage for attachments, over the S3 API. Configured only from the
 * environment (PASTLOAD_S3_*), so the local fake and a real S3-compatible
 * service are used the same way. Every failure to reach the store becomes a
 * `StorageUnavailableError`; a missing object is `null`, never an exception.
 */

// The lockfile pins an SDK release that supports Node 20; its notice about future releases is not for operators.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true'

export class StorageUnavailableError extends Error {
  constructor(message: string, readonly reason: 'not-configured' | 'unreachable') {
    super(message)
  }
}


export const NOT_CONFIGURED = 'Attachments are not available: object storage is not configured on this server (set PASTLOAD_S3_BUCKET and the other PASTLOAD_S3_* variables).'

let cached: { config: StorageConfig, client: S3Client } | null | undefined

function connection(): { config: StorageConfig, client: S3Client } {
  if (cached === undefined) {
    const config = storageConfigFromEnv()
    cached = config
      ? {
          config,
          client: new S3Client({
            endpoint: config.endpoint,
            region: config.region,
            credentials: config.credentials,
            forcePathStyle: config.forcePathStyle,
            // Fail fast when the store is down, so a route answers 503 in seconds rather than hanging.
            maxAttempts: 2,
            requestHandler: { connectionTimeout: 2_000, requestTimeout: 30_000 },
            // Many S3-compatible services reject the SDK's newer default trailing checksums.
            requestChecksumCalculation: 'WHEN_REQUIRED',
            responseChecksumValidation: 'WHEN_REQUIRED',
          }),
        }
      : null
  }
  if (!cached) {
    throw new StorageUnavailableError(NOT_CONFIGURED, 'not-configured')
  }
  return cached
}

export function storageConfigured(): boolean {
  return storageConfigFromEnv() !== null
}

function statusOf(err: unknown): number | undefined {
  return err instanceof S3ServiceException ? err.$metadata.httpStatusCode : undefined
}

function isMissing(err: unknown): boolean {
  return err instanceof S3ServiceException && (err.name === 'NoSuchKey' || err.name === 'NotFound') && statusOf(err) === 404
}

let probe: { at: number, ok: boolean } | undefined
const PROBE_OK_MS = 15_000
const PROBE_FAIL_MS = 3_000
const UNREACHABLE = 'Object storage is not reachable right now, so attachments cannot be stored or read. Everything else keeps working; try again in a few minutes.'

function unreachable(err: unknown, action: string): StorageUnavailableError {
  probe = { at: Date.now(), ok: false }
  logServerError(`storage: ${action} failed`, err, { stack: false, level: 'warn' })
  return new StorageUnavailableError(UNREACHABLE, 'unreachable')
}

export async function putObject(key: string, body: Buffer, contentType: string): Promise<void> {
  const { config, client } = connection()
  try {
    await client.send(new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }))
  }
  catch (err) {
    throw unreachable(err, `put ${key}`)
  }
}

export interface StoredObject {
  body: Readable
  size: number | undefined
  contentType: string | undefined
}

/** The object as a stream, or null when the key does not exist. */
export async function getObject(key: string): Promise<StoredObject | null> {
  const { config, client } = connection()
  try {
    const r = await client.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }))
    if (!r.Body) return null
    return { body: r.Body as Readable, size: r.ContentLength, contentType: r.ContentType }
  }
  catch (err) {
    if (isMissing(err)) return null
    throw unreachable(err, `get ${key}`)
  }
}

/** Size and type of the object, or null when the key does not exist. */
export async function headObject(key: string): Promise<{ size: number, contentType: string | undefined } | null> {
  const { config, client } = connection()
  try {
    const r = await client.send(new HeadObjectCommand({ Bucket: config.bucket, Key: key }))
    return { size: r.ContentLength ?? 0, contentType: r.ContentType }
  }
  catch (err) {
    if (isMissing(err) || statusOf(err) === 404) return null
    throw unreachable(err, `head ${key}`)
  }
}

/** Deletes the object; deleting a key that is already gone succeeds. */
export async function deleteObject(key: string): Promise<void> {
  const { config, client } = connection()
  try {
    await client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: key }))
  }
  catch (err) {
    if (isMissing(err)) return
    throw unreachable(err, `delete ${key}`)
  }
}

export interface ListedObject {
  key: string
  lastModified: Date | undefined
  size: number
}

/** One page (at most 1 000 keys) of the objects under `prefix`, and the token for the next page. */
export async function listObjects(prefix: string, continuationToken?: string): Promise<{ objects: ListedObject[], next: string | undefined }> {
  const { config, client } = connection()
  try {
    const r = await client.send(new ListObjectsV2Command({ Bucket: config.bucket, Prefix: prefix, ContinuationToken: continuationToken, MaxKeys: 1000 }))
    const objects = (r.Contents ?? []).flatMap(o => (o.Key ? [{ key: o.Key, lastModified: o.LastModified, size: o.Size ?? 0 }] : []))
    return { objects, next: r.IsTruncated ? r.NextContinuationToken : undefined }
  }
  catch (err) {
    throw unreachable(err, `list ${prefix}`)
  }
}

export type StorageHealth = 'ok' | 'down' | 'unconfigured'

/**
 * A fresh round trip to the bucket for `/api/health`, bounded by `timeoutMs`:
 * 'unconfigured' when no bucket is set (attachments are off, nothing is down),
 * 'down' when the bucket does not answer. Refreshes the remembered answer too.
 */
export async function storageHealth(timeoutMs = 3_000): Promise<StorageHealth> {
  if (!storageConfigured()) return 'unconfigured'
  const { config, client } = connection()
  try {
    await client.send(new HeadBucketCommand({ Bucket: config.bucket }), { abortSignal: AbortSignal.timeout(timeoutMs) })
    probe = { at: Date.now(), ok: true }
    return 'ok'
  }
  catch (err) {
    unreachable(err, `head bucket ${config.bucket}`)
    return 'down'
  }
}

/**
 * Throws `StorageUnavailableError` unless the bucket answers. The answer is
 * remembered for a few seconds so listing attachments does not cost a round trip each time.
 */
export async function assertStorageReachable(): Promise<void> {
  const { config, client } = connection()
  const now = Date.now()
  if (probe && now - probe.at < (probe.ok ? PROBE_OK_MS : PROBE_FAIL_MS)) {
    if (probe.ok) return
    throw new StorageUnavailableError(UNREACHABLE, 'unreachable')
  }
  try {
    await client.send(new HeadBucketCommand({ Bucket: config.bucket }))
    probe = { at: Date.now(), ok: true }
  }
  catch (err) {
    throw unreachable(err, `head bucket ${config.bucket}`)
  }
}
