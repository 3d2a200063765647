import type { IssueReport } from '#shared/schemas/reports'
import type { ReportBuild, ReportContext, ReportHeading, ReportKind } from './kinds'
import { buildModelVersionReport, longModelVersionReportHeading } from './model-version'
import { buildPointLogReport } from './point-log'
import { buildSettlementRunReport, settlementRunReportHeading } from './settlement-run'

/**
 * Which builder makes each kind of report, from an issue request's body. Issuing goes through `buildReport`;
 * each kind's preview route calls its builder directly.
 */
type Request<K extends ReportKind> = Extract<IssueReport, { kind: K }>
type Builder<K extends ReportKind> = (ctx: ReportContext, req: Request<K>) => Promise<ReportBuild>

export const REPORT_BUILDERS: { [K in ReportKind]: Builder<K> } = {
  'settlement-run': (ctx, req) => buildSettlementRunReport(ctx, req.runId),
  'point-log': (ctx, req) => buildPointLogReport(ctx, req.pointId, { scale: req.scale }),
  'model-version': (ctx, req) => buildModelVersionReport(ctx, req.modelId, req.version),
}

/** The record a request names, as stored with an issued report. */
export function requestSource(req: IssueReport): { id: string, version: number | null, options: Record<string, unknown> } {
  switch (req.kind) {
    case 'settlement-run': return { id: req.runId, version: null, options: {} }
    case 'model-version': return { id: req.modelId, version: req.version, options: {} }
    case 'point-log': return { id: req.pointId, version: null, options: { scale: req.scale } }
  }
}

export function buildReport(ctx: ReportContext, req: IssueReport): Promise<ReportBuild> {
  switch (req.kind) {
    case 'settlement-run': return REPORT_BUILDERS['settlement-run'](ctx, req)
    case 'model-version': return REPORT_BUILDERS['model-version'](ctx, req)
    case 'point-log': return REPORT_BUILDERS['point-log'](ctx, req)
  }
}

/**
 * Which reports are long, and so made on the job queue rather than in the request: every settlement-run report
 * (one page or more per named point, its contour map and time curves) and a site-model report of a version with
 * more than LONG_MODEL_REPORT_STRATA strata. For a long one, the record's checks (404, 422) and the heading the
 * issued list shows meanwhile; null for a short one. `revision` is the letter the report will carry.
 */
export function longReportHeading(projectId: string, req: IssueReport, revision: string): Promise<ReportHeading | null> {
  switch (req.kind) {
    case 'settlement-run': return settlementRunReportHeading(projectId, req.runId, revision)
    case 'model-version': return longModelVersionReportHeading(projectId, req.modelId, req.version)
    case 'point-log': return Promise.resolve(null)
  }
}
