import { randomUUID } from 'node:crypto'
import { and, count, desc, eq, isNull, or, type SQL } from 'drizzle-orm'
import type { H3Event } from 'h3'
import sharp from 'sharp'
import { ATTACHMENT_TYPES, attachmentKind, type AttachmentContentType, type AttachmentOwnerType, type AttachmentView, MAX_ATTACHMENT_BYTES, THUMBNAIL_MAX_PX } from '#shared/schemas/attachments'
import { type Tx, useDb } from '../db/client'
import { anyOf } from '../db/any'
import { attachments, investigationPoints, issuedReports, oedometerTests, samples, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { AttachmentContentError, sniffAttachment } from './attachment-content'
import { recordAudit } from './audit'
import { readMultipart } from './multipart'
import { deleteObject, getObject, NOT_CONFIGURED, putObject, storageConfigured, StorageUnavailableError } from './storage'
import { unprocessableError } from './http-errors'

/**
 * Attachments: reading an upload within its size limit, checking what it is
 * and what it belongs to, storing it (and a photo's thumbnail) under random
 * keys, and the public view of a row (never its storage keys).
 */
export type AttachmentRow = typeof attachments.$inferSelect

const MB = 1024 * 1024

export interface UploadedFile {
  filename: string
  data: Buffer
  sha256: string
}

/** A file name safe to store and to echo in a header: no path, no control characters, at most 200 characters. */
export function cleanFilename(name: string | undefined): string {
  const base = (name ?? '').split(/[\\/]/).pop() ?? ''
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is stripped from a file name
  const clean = base.replace(/[\u0000-\u001F\u007F]/g, '').trim().slice(0, 200)
  return clean || 'attachment'
}

/**
 * Streams a multipart upload (one part named `file`, plus text fields) with the
 * 25 MB limit enforced while reading, so a body without a Content-Length cannot
 * grow past it. The SHA-256 is computed on the way.
 */
export async function readAttachmentUpload(event: H3Event): Promise<{ file: UploadedFile | null, fields: Record<string, string> }> {
  const { file, fields } = await readMultipart(event, {
    maxBytes: MAX_ATTACHMENT_BYTES,
    tooLarge: `The file is larger than ${MAX_ATTACHMENT_BYTES / MB} MB, the limit for an attachment.`,
    notMultipart: 'Send the file as multipart form data in a field named "file".',
    limits: { files: 1, fields: 10, fieldSize: 4096, parts: 12 },
    tooManyParts: 'Send one file per upload.',
    hash: true,
  })
  return { file: file ? { filename: cleanFilename(file.filename), data: file.data, sha256: file.sha256 } : null, fields }
}

const OWNER_LABEL: Record<Exclude<AttachmentOwnerType, 'project'>, string> = { point: 'point', sample: 'sample', test: 'oedometer test' }

/** The point, sample or oedometer test must belong to the project (checked in the WHERE clause): 404 otherwise. */
export async function requireAttachmentOwner(projectId: string, ownerType: AttachmentOwnerType, ownerId: string | null | undefined): Promise<void> {
  if (ownerType === 'project') return
  if (!ownerId) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `Invalid body: ownerId is required for a ${OWNER_LABEL[ownerType]}` })
  const db = useDb()
  let found: unknown[]
  if (ownerType === 'point') {
    found = await db.select({ id: investigationPoints.id }).from(investigationPoints)
      .where(and(eq(investigationPoints.id, ownerId), eq(investigationPoints.projectId, projectId))).limit(1)
  }
  else if (ownerType === 'sample') {
    found = await db.select({ id: samples.id }).from(samples)
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(and(eq(samples.id, ownerId), eq(investigationPoints.projectId, projectId))).limit(1)
  }
  else {
    found = await db.select({ id: oedometerTests.id }).from(oedometerTests)
      .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(and(eq(oedometerTests.id, ownerId), eq(investigationPoints.projectId, projectId))).limit(1)
  }
  if (found.length === 0) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: `The ${OWNER_LABEL[ownerType]} to attach to was not found in this project.` })
}

/** A photo's thumbnail: JPEG, longest side at most 320 px, turned upright from its EXIF orientation. */
export async function makeThumbnail(data: Buffer, filename: string, contentType: AttachmentContentType): Promise<Buffer> {
  try {
    return await sharp(data, { failOn: 'error', limitInputPixels: 100_000_000 })
      .rotate()
      .resize({ width: THUMBNAIL_MAX_PX, height: THUMBNAIL_MAX_PX, fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 78, mozjpeg: true })
      .toBuffer()
  }
  catch (err) {
    const detail = err instanceof Error && /pixel limit/i.test(err.message) ? ' It has more than 100 million pixels: reduce it and attach it again.' : ' It may be damaged or cut short.'
    throw new AttachmentContentError(`${filename} starts like a ${ATTACHMENT_TYPES[contentType].label} image but could not be read.${detail}`, 'wrong-type')
  }
}

/** The public shape of a row; the storage keys stay on the server. */
export function attachmentView(row: AttachmentRow, uploader: { id: string, displayName: string } | null): AttachmentView {
  const base = `/api/projects/${row.projectId}/attachments/${row.id}`
  return {
    id: row.id,
    ownerType: row.ownerType,
    ownerId: row.ownerId,
    filename: row.filename,
    contentType: row.contentType,
    kind: attachmentKind(row.contentType),
    size: row.size,
    sha256: row.sha256,
    caption: row.caption,
    uploadedBy: uploader,
    createdAt: row.createdAt.toISOString(),
    downloadUrl: `${base}/download`,
    thumbnailUrl: row.thumbnailKey ? `${base}/thumbnail` : null,
  }
}

/** What the audit log keeps of an attachment: its description, not its storage keys. */
function auditRecord(row: AttachmentRow) {
  return { ownerType: row.ownerType, ownerId: row.ownerId, filename: row.filename, contentType: row.contentType, size: row.size, sha256: row.sha256, caption: row.caption }
}

export interface NewAttachment {
  projectId: string
  ownerType: AttachmentOwnerType
  ownerId: string | null
  caption: string
  file: UploadedFile
  uploadedBy: string
}

/**
 * Checks the content, stores the file and a photo's thumbnail under random keys
 * (never derived from the name), then writes the row and its audit entry in one
 * transaction. Objects stored before a failed insert are removed again.
 * Throws `AttachmentContentError` (422) or `StorageUnavailableError` (503).
 */
export async function storeAttachment(input: NewAttachment): Promise<AttachmentRow> {
  const { file } = input
  const contentType = sniffAttachment(file.data, file.filename)
  const thumbnail = attachmentKind(contentType) === 'photo' ? await makeThumbnail(file.data, file.filename, contentType) : null
  const objectKey = `projects/${input.projectId}/${randomUUID()}`
  const thumbnailKey = thumbnail ? `projects/${input.projectId}/${randomUUID()}` : null
  await putObject(objectKey, file.data, contentType)
  try {
    if (thumbnail && thumbnailKey) await putObject(thumbnailKey, thumbnail, 'image/jpeg')
    return await useDb().transaction(async (tx) => {
      const row = returnedRow(await tx.insert(attachments).values({
        projectId: input.projectId,
        ownerType: input.ownerType,
        ownerId: input.ownerId,
        filename: file.filename,
        contentType,
        size: file.data.length,
        sha256: file.sha256,
        objectKey,
        thumbnailKey,
        caption: input.caption,
        uploadedBy: input.uploadedBy,
      }).returning())
      await recordAudit({ actorId: input.uploadedBy, projectId: input.projectId, action: 'create', entity: 'attachment', entityId: row.id, after: auditRecord(row) }, tx)
      return row
    })
  }
  catch (err) {
    await Promise.allSettled([deleteObject(objectKey), thumbnailKey ? deleteObject(thumbnailKey) : Promise.resolve()])
    throw err
  }
}

/** Deletes the row (with its audit entry) and its objects; a storage failure rolls the row back. */
export async function removeAttachment(projectId: string, attachmentId: string, actorId: string): Promise<void> {
  await useDb().transaction(async (tx) => {
    const [row] = await tx.select().from(attachments)
      .where(and(eq(attachments.id, attachmentId), eq(attachments.projectId, projectId)))
      .for('update')
    if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Attachment not found.' })
    const [issued] = await tx.select({ id: issuedReports.id }).from(issuedReports).where(eq(issuedReports.attachmentId, row.id)).limit(1)
    if (issued) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This file is an issued report: issued reports are kept for good and cannot be deleted.', data: { code: 'issued-report' } })
    await tx.delete(attachments).where(and(eq(attachments.id, attachmentId), eq(attachments.projectId, projectId)))
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'attachment', entityId: row.id, before: auditRecord(row) }, tx)
    await deleteObject(row.objectKey)
    if (row.thumbnailKey) await deleteObject(row.thumbnailKey)
  })
}

/** One attachment of the project (scoped in the WHERE clause), or 404. */
export async function requireAttachment(projectId: string, attachmentId: string): Promise<AttachmentRow> {
  const [row] = await useDb().select().from(attachments)
    .where(and(eq(attachments.id, attachmentId), eq(attachments.projectId, projectId)))
    .limit(1)
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Attachment not found.' })
  return row
}

export async function listAttachments(projectId: string, q: { ownerType?: AttachmentOwnerType, ownerId?: string, limit: number, offset: number }): Promise<{ attachments: AttachmentView[], total: number }> {
  const where: SQL[] = [eq(attachments.projectId, projectId)]
  if (q.ownerType) where.push(eq(attachments.ownerType, q.ownerType))
  if (q.ownerType === 'project') where.push(isNull(attachments.ownerId))
  if (q.ownerId) where.push(eq(attachments.ownerId, q.ownerId))
  const db = useDb()
  const [rows, [total]] = await Promise.all([
    db.select({ row: attachments, uploaderId: users.id, uploaderName: users.displayName })
      .from(attachments)
      .leftJoin(users, eq(users.id, attachments.uploadedBy))
      .where(and(...where))
      .orderBy(desc(attachments.createdAt), desc(attachments.id))
      .limit(q.limit).offset(q.offset),
    db.select({ n: count() }).from(attachments).where(and(...where)),
  ])
  return {
    attachments: rows.map(r => attachmentView(r.row, r.uploaderId && r.uploaderName ? { id: r.uploaderId, displayName: r.uploaderName } : null)),
    total: total?.n ?? 0,
  }
}

/** 503 unless object storage is configured; attachment routes check it before reading a body. */
export function requireStorage(): void {
  if (!storageConfigured()) throw attachmentHttpError(new StorageUnavailableError(NOT_CONFIGURED, 'not-configured'))
}

/** Turns the attachment errors into HTTP answers: unreadable content 422, storage down 503. */
export function attachmentHttpError(err: unknown): unknown {
  if (err instanceof AttachmentContentError) return unprocessableError(err.message, { code: err.code })
  if (err instanceof StorageUnavailableError) return createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: err.message, data: { code: `storage-${err.reason}` } })
  return err
}

/** `Content-Disposition` with an ASCII fallback and the UTF-8 name (RFC 6266, RFC 8187). */
export function contentDisposition(disposition: 'attachment' | 'inline', filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7E]/g, '_').replace(/["\\]/g, '_')
  const encoded = encodeURIComponent(filename).replace(/['()*]/g, c => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)
  return `${disposition}; filename="${fallback}"; filename*=UTF-8''${encoded}`
}

/**
 * Streams a stored object with the type decided at upload, never sniffed by the
 * browser (`nosniff`) and never run as a page (`sandbox`). A row whose object
 * is gone is 404; storage down is 503.
 */
export async function sendStoredObject(event: H3Event, key: string, opts: { contentType: string, disposition: 'attachment' | 'inline', filename: string, etag: string, cache: string }): Promise<void> {
  let stored
  try {
    stored = await getObject(key)
  }
  catch (err) {
    throw attachmentHttpError(err)
  }
  if (!stored) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The file is missing from object storage.' })
  setResponseHeaders(event, {
    'content-type': opts.contentType,
    'content-disposition': contentDisposition(opts.disposition, opts.filename),
    'x-content-type-options': 'nosniff',
    'content-security-policy': "default-src 'none'; sandbox",
    'cache-control': opts.cache,
    'etag': `"${opts.etag}"`,
  })
  if (stored.size !== undefined) setResponseHeader(event, 'content-length', stored.size)
  return sendStream(event, stored.body)
}

/**
 * Before a point, sample or oedometer test is deleted: its attachments, and
 * those of everything deleted with it (a point's samples and their tests, a
 * sample's tests), move to the project level with a caption saying where they
 * came from. A lab report or photo is never lost with the record it was filed
 * under, and no row is left pointing at an owner that no longer exists. Runs in
 * the deleting transaction, so it commits or rolls back with the delete.
 */
export async function rehomeAttachmentsOf(tx: Tx, args: { projectId: string, actorId: string, ownerType: Exclude<AttachmentOwnerType, 'project'>, ownerId: string, label: string }): Promise<number> {
  const { projectId, ownerType, ownerId } = args
  const owned: (SQL | undefined)[] = [and(eq(attachments.ownerType, ownerType), eq(attachments.ownerId, ownerId))]
  if (ownerType === 'point') {
    const sampleIds = (await tx.select({ id: samples.id }).from(samples).where(eq(samples.pointId, ownerId))).map(s => s.id)
    if (sampleIds.length) {
      owned.push(and(eq(attachments.ownerType, 'sample'), anyOf(attachments.ownerId, sampleIds)))
      const testIds = (await tx.select({ id: oedometerTests.id }).from(oedometerTests).where(anyOf(oedometerTests.sampleId, sampleIds))).map(t => t.id)
      if (testIds.length) owned.push(and(eq(attachments.ownerType, 'test'), anyOf(attachments.ownerId, testIds)))
    }
  }
  else if (ownerType === 'sample') {
    const testIds = (await tx.select({ id: oedometerTests.id }).from(oedometerTests).where(eq(oedometerTests.sampleId, ownerId))).map(t => t.id)
    if (testIds.length) owned.push(and(eq(attachments.ownerType, 'test'), anyOf(attachments.ownerId, testIds)))
  }
  const rows = await tx.select().from(attachments).where(and(eq(attachments.projectId, projectId), or(...owned))).for('update')
  for (const row of rows) {
    const from = `Moved to the project when ${args.label} was deleted.`
    const caption = (row.caption ? `${from} ${row.caption}` : from).slice(0, 500)
    const after = returnedRow(await tx.update(attachments).set({ ownerType: 'project', ownerId: null, caption }).where(eq(attachments.id, row.id)).returning())
    await recordAudit({ actorId: args.actorId, projectId, action: 'update', entity: 'attachment', entityId: row.id, before: auditRecord(row), after: auditRecord(after) }, tx)
  }
  return rows.length
}
