import { boolean, index, integer, jsonb, pgEnum, pgTable, real, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { moment, ownedRow } from './columns'
import { attachments } from './attachments'
import { projects } from './projects'
import { namedUser } from './users'

export const reportKind = pgEnum('report_kind', ['point-log', 'model-version', 'settlement-run'])
/**
 * Where an issue stands: a short report is stored in the request (`issued` at once); a long one is made on the
 * job queue (`queued` → `running` → `issued`, or `failed` with a plain reason — issuing the record again retries
 * it under the same letter).
 */
export const reportStatus = pgEnum('report_status', ['queued', 'running', 'issued', 'failed'])
/** The step a queued report is at while running (server/services/reports/jobs.ts). */
export const reportStage = pgEnum('report_stage', ['gathering', 'drawing', 'writing', 'storing'])

/**
 * An issued report: the PDF of one record stored as a project attachment, with its revision letter (A, B, …
 * per project, kind and record), who issued it and its SHA-256. Permanent: no route deletes one, and the
 * record it was made from is kept by id only (no foreign key), so deleting the run, model or point leaves
 * the issued list whole. The attachment cannot be deleted while a report refers to it. A report made on the job
 * queue holds its letter from the moment it is asked for; its attachment, SHA-256, size and pages are set when
 * it is stored (null until then).
 */
export const issuedReports = pgTable('issued_reports', {
  ...ownedRow('projectId', () => projects.id),
  kind: reportKind().notNull(),
  /** The run, model or point id. */
  sourceId: uuid().notNull(),
  /** The model's version for a site-model report; null otherwise. */
  sourceVersion: integer(),
  /** What the report was made with (a log's scale). */
  sourceOptions: jsonb().$type<Record<string, unknown>>().notNull().default({}),
  /** The record the letters count on: the source id, with `@v<version>` for a model version. */
  sourceKey: text().notNull(),
  revision: text().notNull(),
  status: reportStatus().notNull().default('issued'),
  stage: reportStage(),
  /** 0–1 while queued or running; 1 once issued. */
  progress: real().notNull().default(1),
  /** Starts of the job (a worker that died leaves the job to be started again). */
  attempts: integer().notNull().default(0),
  /** Why a queued report could not be made, in words for the issuer. */
  errorMessage: text(),
  errorCode: text(),
  attachmentId: uuid().references(() => attachments.id),
  sha256: text(),
  size: integer(),
  filename: text().notNull(),
  title: text().notNull(),
  subject: text().notNull(),
  pages: integer(),
  /** False when the record (or the version a run used) was not approved: the PDF carries the band. */
  approvedRecord: boolean().notNull(),
  issuedBy: namedUser(),
  /** The issuer's name as printed on the report. */
  issuedByName: text().notNull(),
  issuedAt: moment().notNull().defaultNow(),
}, t => [
  uniqueIndex('issued_reports_revision_idx').on(t.projectId, t.kind, t.sourceKey, t.revision),
  index('issued_reports_project_idx').on(t.projectId, t.issuedAt),
  index('issued_reports_attachment_idx').on(t.attachmentId),
  index('issued_reports_status_idx').on(t.status),
])
