import { createHash, randomUUID } from 'node:crypto'
import { and, count, desc, eq, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { reportSourceKey, revisionIndex, revisionLetter } from '#shared/reports/revision'
import type { IssueReport } from '#shared/schemas/reports'
import type { ServerIssuedReport, ServerIssuedReportList } from '#shared/types/reports'
import { useDb, type Tx } from '~~/server/db/client'
import { returnedRow } from '~~/server/db/rows'
import { attachments, issuedReports, users } from '~~/server/db/schema'
import { attachmentHttpError, cleanFilename, requireStorage, sendStoredObject } from '~~/server/services/attachments'
import { recordAudit } from '~~/server/services/audit'
import { notFound } from '~~/server/services/http-errors'
import { deleteObject, putObject } from '~~/server/services/storage'
import { buildReport, requestSource } from './registry'

/**
 * Issuing a report: the PDF is made with the next revision letter printed on it, stored in object storage as
 * a project attachment (application/pdf, with its SHA-256), and listed in `issued_reports` — all rows and
 * their audit entries in one transaction. Two people issuing the same record at once: the second gets 409
 * and nothing of it is kept. Issued reports are permanent (no delete).
 */

type Row = typeof issuedReports.$inferSelect

function view(row: Row, issuer: { id: string, name: string } | null): ServerIssuedReport {
  return {
    id: row.id,
    kind: row.kind,
    source: { id: row.sourceId, version: row.sourceVersion, options: row.sourceOptions },
    revision: row.revision,
    title: row.title,
    subject: row.subject,
    pages: row.pages,
    approvedRecord: row.approvedRecord,
    filename: row.filename,
    size: row.size,
    sha256: row.sha256,
    attachmentId: row.attachmentId,
    downloadUrl: `/api/projects/${row.projectId}/reports/${row.id}/pdf`,
    issuedBy: issuer,
    issuedByName: row.issuedByName,
    issuedAt: row.issuedAt,
  }
}

/** The next letter for a record: one past the highest issued (A for the first). */
async function nextRevision(db: Tx | ReturnType<typeof useDb>, projectId: string, kind: Row['kind'], sourceKey: string): Promise<string> {
  const rows = await db.select({ revision: issuedReports.revision }).from(issuedReports)
    .where(and(eq(issuedReports.projectId, projectId), eq(issuedReports.kind, kind), eq(issuedReports.sourceKey, sourceKey)))
  const top = Math.max(-1, ...rows.map(r => revisionIndex(r.revision)))
  return revisionLetter(top + 1)
}

export async function issueReport(projectId: string, issuer: { id: string, name: string }, req: IssueReport): Promise<{ report: ServerIssuedReport }> {
  requireStorage()
  const source = requestSource(req)
  const sourceKey = reportSourceKey(source)
  const db = useDb()
  const revision = await nextRevision(db, projectId, req.kind, sourceKey)
  const issuedAt = new Date()
  const build = await buildReport({ projectId, issue: { revision, issuedBy: { name: issuer.name, date: issuedAt.toISOString().slice(0, 10) } } }, req)
  const sha256 = createHash('sha256').update(build.pdf).digest('hex')
  const filename = cleanFilename(build.filename)
  const objectKey = `projects/${projectId}/${randomUUID()}`
  try {
    await putObject(objectKey, build.pdf, 'application/pdf')
  }
  catch (err) {
    throw attachmentHttpError(err)
  }
  try {
    const row = await db.transaction(async (tx) => {
      // One issuer at a time per record: the letter read before the build must still be the next one.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`issued-report:${projectId}:${req.kind}:${sourceKey}`}))`)
      if (await nextRevision(tx, projectId, req.kind, sourceKey) !== revision) {
        throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Revision ${revision} of this report was issued by someone else a moment ago: issue it again to make the next revision.`, data: { code: 'revision-taken' } })
      }
      const att = returnedRow(await tx.insert(attachments).values({
        projectId,
        ownerType: 'project',
        ownerId: null,
        filename,
        contentType: 'application/pdf',
        size: build.pdf.length,
        sha256,
        objectKey,
        caption: `${build.title} — ${build.subject}, revision ${revision} (issued report)`.slice(0, 500),
        uploadedBy: issuer.id,
        createdAt: issuedAt,
      }).returning())
      await recordAudit({ actorId: issuer.id, projectId, action: 'create', entity: 'attachment', entityId: att.id, after: { ownerType: 'project', filename, contentType: 'application/pdf', size: att.size, sha256 } }, tx)
      const r = returnedRow(await tx.insert(issuedReports).values({
        projectId,
        kind: req.kind,
        sourceId: source.id,
        sourceVersion: source.version,
        sourceOptions: source.options,
        sourceKey,
        revision,
        attachmentId: att.id,
        sha256,
        size: build.pdf.length,
        filename,
        title: build.title,
        subject: build.subject,
        pages: build.pages,
        approvedRecord: build.approvedRecord,
        issuedBy: issuer.id,
        issuedByName: issuer.name,
        issuedAt,
      }).returning())
      await recordAudit({ actorId: issuer.id, projectId, action: 'create', entity: 'issued-report', entityId: r.id, after: { kind: r.kind, source: source, revision, attachmentId: att.id, sha256, pages: r.pages, approvedRecord: r.approvedRecord } }, tx)
      return r
    })
    return { report: view(row, { id: issuer.id, name: issuer.name }) }
  }
  catch (err) {
    await Promise.allSettled([deleteObject(objectKey)])
    throw err
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
  return { reports: rows.map(r => view(r.row, r.issuerId ? { id: r.issuerId, name: r.issuerName ?? r.row.issuedByName } : null)), total: total?.n ?? 0 }
}

/** Streams an issued report's stored PDF (404 for another project's report). */
export async function sendIssuedReport(event: H3Event, projectId: string, reportId: string): Promise<void> {
  const [found] = await useDb().select({ report: issuedReports, objectKey: attachments.objectKey })
    .from(issuedReports).innerJoin(attachments, eq(attachments.id, issuedReports.attachmentId))
    .where(and(eq(issuedReports.id, reportId), eq(issuedReports.projectId, projectId))).limit(1)
  if (!found) notFound('Issued report')
  requireStorage()
  return sendStoredObject(event, found.objectKey, { contentType: 'application/pdf', disposition: 'inline', filename: found.report.filename, etag: found.report.sha256, cache: 'private, no-store' })
}
