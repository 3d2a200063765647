/**
 * Issued reports: what `POST /api/projects/{projectId}/reports` and `GET …/reports` answer. `Server…` is what
 * the service returns (dates as `Date`), the plain name what the page reads.
 */
import type { Serialize } from './serialize'

export const REPORT_KINDS = ['point-log', 'model-version', 'settlement-run'] as const
export type IssuedReportKind = (typeof REPORT_KINDS)[number]

export const REPORT_KIND_LABELS: Record<IssuedReportKind, string> = {
  'point-log': 'Stress-history log',
  'model-version': 'Site-model version',
  'settlement-run': 'Settlement run',
}

/** Where an issue stands: `issued` (stored), or for a long report made on the job queue `queued`, `running`, `failed`. */
export const REPORT_STATUSES = ['queued', 'running', 'issued', 'failed'] as const
export type ReportStatus = (typeof REPORT_STATUSES)[number]
/** The steps of a report made on the job queue, in order, with the words the Reports page shows for each. */
export const REPORT_STAGE_LABELS = { gathering: 'Gathering the data', drawing: 'Drawing the plots', writing: 'Writing the PDF', storing: 'Storing the PDF' } as const
export type ReportStage = keyof typeof REPORT_STAGE_LABELS

export interface ServerIssuedReport {
  id: string
  kind: IssuedReportKind
  /** The record it was made from (kept when the record is deleted). */
  source: { id: string, version: number | null, options: Record<string, unknown> }
  revision: string
  /** `issued` once the PDF is stored; a long report is `queued`, then `running`, until then (or `failed`). */
  status: ReportStatus
  /** While queued or running: the step and how far along (0–1). Null once issued or failed. */
  progress: { stage: ReportStage | null, fraction: number } | null
  /** Why a queued report could not be made; issuing the record again retries it under the same letter. */
  failure: { message: string, code: string | null } | null
  title: string
  subject: string
  /** The PDF's pages, size, SHA-256, attachment and download route: null until it is stored. */
  pages: number | null
  /** False: the record was not approved and the PDF carries the band. */
  approvedRecord: boolean
  filename: string
  size: number | null
  sha256: string | null
  attachmentId: string | null
  /** `GET …/reports/{reportId}/pdf`. */
  downloadUrl: string | null
  issuedBy: { id: string, name: string } | null
  issuedByName: string
  /** When it was issued (for a queued report: asked for; that date is printed on the PDF). */
  issuedAt: Date
}
export type IssuedReport = Serialize<ServerIssuedReport>

export interface ServerIssuedReportList { reports: ServerIssuedReport[], total: number }
export type IssuedReportList = Serialize<ServerIssuedReportList>
