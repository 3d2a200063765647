import type { IssueReport } from '#shared/schemas/reports'
import { unprocessableError } from '~~/server/services/http-errors'
import type { ReportBuild, ReportContext, ReportKind } from './kinds'
import { buildModelVersionReport } from './model-version'
import { buildSettlementRunReport } from './settlement-run'

/**
 * Which builder makes each kind of report, from an issue request's body. Issuing goes through `buildReport`;
 * each kind's preview route calls its builder directly.
 */
type Request<K extends ReportKind> = Extract<IssueReport, { kind: K }>
type Builder<K extends ReportKind> = (ctx: ReportContext, req: Request<K>) => Promise<ReportBuild>

/** A kind whose builder is not part of this server yet: 422, nothing stored. */
function notAvailable<K extends ReportKind>(kind: K): Builder<K> {
  return () => Promise.reject(unprocessableError(`Issuing a ${kind} report is not available yet on this server.`, { code: 'report-kind-unavailable', kind }))
}

export const REPORT_BUILDERS: { [K in ReportKind]: Builder<K> } = {
  'settlement-run': (ctx, req) => buildSettlementRunReport(ctx, req.runId),
  // Point log: `(ctx, req) => buildPointLogReport(ctx, req.pointId, { scale: req.scale })` from './point-log'.
  'point-log': notAvailable('point-log'),
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
