import { createHash, randomUUID } from 'node:crypto'
import { and, count, desc, eq, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { nextRevisionOf, reportSourceKey } from '#shared/reports/revision'
import type { IssueReport } from '#shared/schemas/reports'
import type { ServerIssuedReport, ServerIssuedReportList } from '#shared/types/reports'
import { useDb, type Tx } from '~~/server/db/client'
import { returnedRow } from '~~/server/db/rows'
import { attachments, issuedReports, users } from '~~/server/db/schema'
import { attachmentHttpError, cleanFilename, requireStorage, sendStoredObject } from '~~/server/services/attachments'
import { recordAudit } from '~~/server/services/audit'
import { notFound } from '~~/server/services/http-errors'
import { publishLiveEvent } from '~~/server/services/live-events'
import { deleteObject, putObject } from '~~/server/services/storage'
import { logServerError } from '~~/server/utils/error-log'
import type { ReportBuild, ReportHeading } from './kinds'
import { buildReport, longReportHeading, requestSource } from './registry'

/**
 * Issuing a report. A short report (a point log, most site-model versions) is made in the request: the PDF with
 * the next revision letter printed on it is stored in object storage as a project attachment (application/pdf,
 * with its SHA-256) and listed in `issued_reports`, all rows and their audit entries in one transaction (201).
 * A long one (`longReportHeading`: every settlement-run report, a site-model version with many strata) is
 * listed at once as `queued` with its letter and made by a job on the queue (`jobs.ts`, 202): the row goes
 * `running` with its stage and progress, then `issued` with the same attachment, SHA-256 and audit entries,
 * or `failed` with a plain reason. Issuing a record whose latest letter failed makes that letter again, so a
 * letter is never handed out twice. Two people issuing the same record at once: the second gets 409 and
 * nothing of it is kept. Issued reports are permanent (no delete).
 */

type Row = typeof issuedReports.$inferSelect

export function issuedReportView(row: Row, issuer: { id: string, name: string } | null): ServerIssuedReport {
  const stored = row.status === 'issued' && row.attachmentId !== null
  return {
    id: row.id,
    kind: row.kind,
    source: { id: row.sourceId, version: row.sourceVersion, options: row.sourceOptions },
    revision: row.revision,
    status: row.status,
    progress: row.status === 'queued' || row.status === 'running' ? { stage: row.stage, fraction: row.progress } : null,
    failure: row.status === 'failed' ? { message: row.errorMessage ?? 'The report could not be made.', code: row.errorCode } : null,
    title: row.title,
    subject: row.subject,
    pages: row.pages,
    approvedRecord: row.approvedRecord,
    filename: row.filename,
    size: row.size,
    sha256: row.sha256,
    attachmentId: row.attachmentId,
    downloadUrl: stored ? `/api/projects/${row.projectId}/reports/${row.id}/pdf` : null,
    issuedBy: issuer,
    issuedByName: row.issuedByName,
    issuedAt: row.issuedAt,
  }
}

/** The letter the next issue of a record gets (a failed letter again), and the failed row it retries. */
async function nextRevision(db: Tx | ReturnType<typeof useDb>, projectId: string, kind: Row['kind'], sourceKey: string): Promise<{ revision: string, retryId: string | null }> {
  const rows = await db.select({ id: issuedReports.id, revision: issuedReports.revision, status: issuedReports.status }).from(issuedReports)
    .where(and(eq(issuedReports.projectId, projectId), eq(issuedReports.kind, kind), eq(issuedReports.sourceKey, sourceKey)))
  const next = nextRevisionOf(rows)
  return { revision: next.revision, retryId: next.retry ? rows.find(r => r.revision === next.revision)?.id ?? null : null }
}

/** Holds the record's letters for the rest of the transaction; 409 when the letter read before is no longer next. */
async function lockRevision(tx: Tx, projectId: string, kind: Row['kind'], sourceKey: string, revision: string): Promise<{ retryId: string | null }> {
  // One issuer at a time per record: the letter read before the work must still be the next one.
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`issued-report:${projectId}:${kind}:${sourceKey}`}))`)
  const now = await nextRevision(tx, projectId, kind, sourceKey)
  if (now.revision !== revision) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Revision ${revision} of this report was issued by someone else a moment ago: issue it again to make the next revision.`, data: { code: 'revision-taken' } })
  }
  return now
}

/** Hands a queued report to the job queue; set by the job service when it starts (else it is made in this process, after the answer). */
let enqueue: ((reportId: string) => Promise<void>) | null = null
export function setReportEnqueuer(fn: ((reportId: string) => Promise<void>) | null): void {
  enqueue = fn
}
let runHere: ((reportId: string) => Promise<unknown>) | null = null
/** What makes a queued report in this process when there is no queue (set by `jobs.ts`, which imports this file). */
export function setReportRunner(fn: ((reportId: string) => Promise<unknown>) | null): void {
  runHere = fn
}

export async function issueReport(projectId: string, issuer: { id: string, name: string }, req: IssueReport): Promise<{ report: ServerIssuedReport, queued: boolean }> {
  requireStorage()
  const source = requestSource(req)
  const sourceKey = reportSourceKey(source)
  const db = useDb()
  const { revision } = await nextRevision(db, projectId, req.kind, sourceKey)
  const heading = await longReportHeading(projectId, req, revision)
  if (heading) return { report: await queueReport(projectId, issuer, req, revision, heading), queued: true }

  const issuedAt = new Date()
  const build = await buildReport({ projectId, issue: { revision, issuedBy: { name: issuer.name, date: issuedAt.toISOString().slice(0, 10) } } }, req)
  const stored = await storePdf(projectId, build.pdf)
  try {
    const row = await db.transaction(async (tx) => {
      const { retryId } = await lockRevision(tx, projectId, req.kind, sourceKey, revision)
      return recordIssued(tx, { projectId, issuer, issuedAt, build, stored, revision, target: retryId ? { retryId } : { insert: { kind: req.kind, source, sourceKey } } })
    })
    return { report: issuedReportView(row, { id: issuer.id, name: issuer.name }), queued: false }
  }
  catch (err) {
    await Promise.allSettled([deleteObject(stored.objectKey)])
    throw err
  }
}

/** Lists a long report as queued with its letter (or makes a failed letter again) and hands it to the queue. */
async function queueReport(projectId: string, issuer: { id: string, name: string }, req: IssueReport, revision: string, heading: ReportHeading): Promise<ServerIssuedReport> {
  const source = requestSource(req)
  const sourceKey = reportSourceKey(source)
  const waiting = {
    status: 'queued' as const, stage: null, progress: 0, attempts: 0, errorMessage: null, errorCode: null,
    title: heading.title, subject: heading.subject, filename: cleanFilename(heading.filename), approvedRecord: heading.approvedRecord,
    issuedBy: issuer.id, issuedByName: issuer.name, issuedAt: new Date(),
  }
  const row = await useDb().transaction(async (tx) => {
    const { retryId } = await lockRevision(tx, projectId, req.kind, sourceKey, revision)
    const r = retryId
      ? returnedRow(await tx.update(issuedReports).set(waiting).where(eq(issuedReports.id, retryId)).returning())
      : returnedRow(await tx.insert(issuedReports).values({ ...waiting, projectId, kind: req.kind, sourceId: source.id, sourceVersion: source.version, sourceOptions: source.options, sourceKey, revision }).returning())
    await publishLiveEvent({ type: 'report.changed', projectId, entityId: r.id }, tx)
    return r
  })
  if (enqueue) {
    try {
      await enqueue(row.id)
    }
    catch (err) {
      // Listed but not queued: say so on the row (the letter stays; issuing again retries it) and answer busy.
      logServerError('report could not be queued', err)
      const message = 'The report could not be handed to the job queue. Issue it again in a minute; if it fails again, tell the site administrator.'
      await useDb().update(issuedReports).set({ status: 'failed', errorMessage: message, errorCode: 'queue-unavailable' }).where(and(eq(issuedReports.id, row.id), eq(issuedReports.status, 'queued')))
      throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message, data: { code: 'queue-unavailable' } })
    }
  }
  else if (runHere) {
    // No job queue in this process: made here, after the answer.
    void runHere(row.id).catch(err => logServerError('report made without the queue', err))
  }
  return issuedReportView(row, { id: issuer.id, name: issuer.name })
}

/** Puts a PDF in object storage under a new key. */
export async function storePdf(projectId: string, pdf: Buffer): Promise<{ objectKey: string, sha256: string }> {
  const sha256 = createHash('sha256').update(pdf).digest('hex')
  const objectKey = `projects/${projectId}/${randomUUID()}`
  try {
    await putObject(objectKey, pdf, 'application/pdf')
  }
  catch (err) {
    throw attachmentHttpError(err)
  }
  return { objectKey, sha256 }
}

/**
 * The attachment of a stored PDF and the issued row (a new one, or the queued / failed row it completes) with
 * their audit entries, in the caller's transaction. Null when the queued row is no longer running (left alone).
 */
export async function recordIssued(tx: Tx, args: {
  projectId: string
  issuer: { id: string | null, name: string }
  issuedAt: Date
  build: ReportBuild
  stored: { objectKey: string, sha256: string }
  revision: string
  target: { insert: { kind: Row['kind'], source: { id: string, version: number | null, options: Record<string, unknown> }, sourceKey: string } } | { retryId: string } | { runningId: string }
}): Promise<Row> {
  const { projectId, issuer, issuedAt, build, stored, revision } = args
  const filename = cleanFilename(build.filename)
  const att = returnedRow(await tx.insert(attachments).values({
    projectId,
    ownerType: 'project',
    ownerId: null,
    filename,
    contentType: 'application/pdf',
    size: build.pdf.length,
    sha256: stored.sha256,
    objectKey: stored.objectKey,
    caption: `${build.title} — ${build.subject}, revision ${revision} (issued report)`.slice(0, 500),
    uploadedBy: issuer.id,
    createdAt: issuedAt,
  }).returning())
  const done = {
    status: 'issued' as const, stage: null, progress: 1, errorMessage: null, errorCode: null,
    attachmentId: att.id, sha256: stored.sha256, size: build.pdf.length, filename, title: build.title, subject: build.subject, pages: build.pages, approvedRecord: build.approvedRecord,
  }
  let r: Row
  if ('insert' in args.target) {
    const { kind, source, sourceKey } = args.target.insert
    r = returnedRow(await tx.insert(issuedReports).values({ ...done, projectId, kind, sourceId: source.id, sourceVersion: source.version, sourceOptions: source.options, sourceKey, revision, issuedBy: issuer.id, issuedByName: issuer.name, issuedAt }).returning())
  }
  else {
    const where = 'retryId' in args.target
      ? eq(issuedReports.id, args.target.retryId)
      : and(eq(issuedReports.id, args.target.runningId), eq(issuedReports.status, 'running'))
    const extra = 'retryId' in args.target ? { issuedBy: issuer.id, issuedByName: issuer.name, issuedAt } : {}
    const [u] = await tx.update(issuedReports).set({ ...done, ...extra }).where(where).returning()
    if (!u) throw new ReportNoLongerWanted()
    r = u
  }
  await recordAudit({ actorId: issuer.id, projectId, action: 'create', entity: 'attachment', entityId: att.id, after: { ownerType: 'project', filename, contentType: 'application/pdf', size: att.size, sha256: stored.sha256 } }, tx)
  await recordAudit({ actorId: issuer.id, projectId, action: 'create', entity: 'issued-report', entityId: r.id, after: { kind: r.kind, source: { id: r.sourceId, version: r.sourceVersion, options: r.sourceOptions }, revision: r.revision, attachmentId: att.id, sha256: stored.sha256, pages: r.pages, approvedRecord: r.approvedRecord } }, tx)
  await publishLiveEvent({ type: 'report.changed', projectId, entityId: r.id }, tx)
  return r
}

/** The queued row a job was completing is no longer running (another worker finished or failed it). */
export class ReportNoLongerWanted extends Error {
  constructor() {
    super('the queued report is no longer running')
    this.name = 'ReportNoLongerWanted'
  }
}

export async function listIssuedReports(projectId: string, page: { limit: number, offset: number }): Promise<ServerIssuedReportList> {
  const db = useDb()
  const rows = await db.select({ row: issuedReports, issuerId: users.id, issuerName: users.displayName })
    .from(issuedReports).leftJoin(users, eq(users.id, issuedReports.issuedBy))
    .where(eq(issuedReports.projectId, projectId))
    .orderBy(desc(issuedReports.issuedAt), desc(issuedReports.id))
    .limit(page.limit).offset(page.offset)
  const [total] = await db.select({ n: count() }).from(issuedReports).where(eq(issuedReports.projectId, projectId))
  return { reports: rows.map(r => issuedReportView(r.row, r.issuerId ? { id: r.issuerId, name: r.issuerName ?? r.row.issuedByName } : null)), total: total?.n ?? 0 }
}

/** Streams an issued report's stored PDF (404 for another project's report). */
export async function sendIssuedReport(event: H3Event, projectId: string, reportId: string): Promise<void> {
  const [found] = await useDb().select({ report: issuedReports, objectKey: attachments.objectKey })
    .from(issuedReports).innerJoin(attachments, eq(attachments.id, issuedReports.attachmentId))
    .where(and(eq(issuedReports.id, reportId), eq(issuedReports.projectId, projectId))).limit(1)
  if (!found) notFound('Issued report')
  if (found.report.status !== 'issued') notFound('Issued report PDF')
  requireStorage()
  return sendStoredObject(event, found.objectKey, { contentType: 'application/pdf', disposition: 'inline', filename: found.report.filename, etag: found.report.sha256 ?? found.report.id, cache: 'private, no-store' })
}
