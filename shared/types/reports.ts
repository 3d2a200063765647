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

export interface ServerIssuedReport {
  id: string
  kind: IssuedReportKind
  /** The record it was made from (kept when the record is deleted). */
  source: { id: string, version: number | null, options: Record<string, unknown> }
  revision: string
  title: string
  subject: string
  pages: number
  /** False: the record was not approved and the PDF carries the band. */
  approvedRecord: boolean
  filename: string
  size: number
  sha256: string
  attachmentId: string
  /** `GET …/reports/{reportId}/pdf`. */
  downloadUrl: string
  issuedBy: { id: string, name: string } | null
  issuedByName: string
  issuedAt: Date
}
export type IssuedReport = Serialize<ServerIssuedReport>

export interface ServerIssuedReportList { reports: ServerIssuedReport[], total: number }
export type IssuedReportList = Serialize<ServerIssuedReportList>
