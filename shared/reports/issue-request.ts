import type { IssueReport } from '../schemas/reports'
import type { IssuedReportKind } from '../types/reports'

/**
 * The issue request that names the record an issued report was made from (the inverse of the server's
 * `requestSource`): the job worker makes a queued report from it, and the Reports page issues a failed one again
 * with it. Null when the stored source does not make a request (a log without its scale).
 */
export function issueRequestOf(kind: IssuedReportKind, source: { id: string, version: number | null, options: Record<string, unknown> }): IssueReport | null {
  switch (kind) {
    case 'settlement-run': return { kind, runId: source.id }
    case 'model-version': return source.version ? { kind, modelId: source.id, version: source.version } : null
    case 'point-log': {
      const scale = source.options.scale
      return scale === 50 || scale === 100 || scale === 200 ? { kind, pointId: source.id, scale } : null
    }
  }
}
