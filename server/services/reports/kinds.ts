import type { ReportSignOff } from '#shared/reports/sheet'
import type { ReportStage } from '#shared/types/reports'

/**
 * What every report kind's builder takes and gives, so the PDF routes (a preview) and issuing (stored with
 * a revision letter) share one path. Each kind has its own service in this folder
 * (`point-log.ts`, `model-version.ts`, `settlement-run.ts`) exporting a `build…Report(ctx, …)`.
 */

export type ReportKind = 'point-log' | 'model-version' | 'settlement-run'

export interface ReportContext {
  projectId: string
  /** Set when the report is being issued: printed in the header and footer. Null for a preview. */
  issue: { revision: string, issuedBy: ReportSignOff } | null
  /**
   * Set when the report is made on the job queue: hears each step ('drawing', 'writing') as the builder reaches
   * it, and the builder renders in the worker pool rather than in this thread.
   */
  onStage?: (stage: ReportStage) => void
}

/** What a long report is listed with while it is being made (from cheap reads, before the work). */
export interface ReportHeading {
  title: string
  subject: string
  filename: string
  approvedRecord: boolean
}

export interface ReportBuild {
  pdf: Buffer
  /** Download name, e.g. `TRN-0417_BH-03_log.pdf` (cleaned by `cleanFilename`). */
  filename: string
  /** Report kind words and subject, as in the header ("Stress-history log", "BH-03"). */
  title: string
  subject: string
  /** False when the record (a version, or the version a run used) is not approved: the band is on every page. */
  approvedRecord: boolean
  /** The record it was made from, kept with an issued report. */
  source: { kind: ReportKind, id: string, version?: number, options?: Record<string, unknown> }
  pages: number
}
