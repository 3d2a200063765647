import { eq } from 'drizzle-orm'
import { settlementRunReportTitle } from '#shared/reports/settlement-run'
import { useDb } from '~~/server/db/client'
import { projects } from '~~/server/db/schema'
import { notFound, unprocessableError } from '~~/server/services/http-errors'
import { runFileName } from '~~/server/services/settlement-run-export'
import { settlementRunForExport } from '~~/server/services/settlement-runs'
import type { ReportBuild, ReportContext } from './kinds'
import { renderSettlementRunReport } from './render-worker'

/**
 * A finished settlement run's PDF report, from the run as stored (its copy of the model version's standing,
 * its results and each named point's sublayer table). 404 for a run not in the project, 422 for one that has
 * not finished.
 */
export async function buildSettlementRunReport(ctx: ReportContext, runId: string): Promise<ReportBuild> {
  const { run, details } = await settlementRunForExport(ctx.projectId, runId)
  if (run.status !== 'finished' || !run.results) {
    throw unprocessableError(run.status === 'failed' ? 'The run failed: it has no results to report.' : `The run is ${run.status}: its report can be made when it has finished.`, { code: 'run-not-finished', status: run.status })
  }
  const [project] = await useDb().select({ name: projects.name, jobNumber: projects.jobNumber, client: projects.client, unitSystem: projects.unitSystem })
    .from(projects).where(eq(projects.id, ctx.projectId)).limit(1)
  if (!project) notFound('Project')
  // Rendered in a worker thread: a run with many named points makes hundreds of pages.
  const { pdf, pages } = await renderSettlementRunReport({ project, run: { ...run, results: run.results }, details, issue: ctx.issue })
  const { title, subject } = settlementRunReportTitle(run)
  return {
    pdf,
    pages,
    filename: runFileName(`${project.jobNumber}_${run.name}_report${ctx.issue ? `_rev${ctx.issue.revision}` : ''}`, 'pdf'),
    title,
    subject,
    approvedRecord: run.model.status === 'approved',
    source: { kind: 'settlement-run', id: run.id },
  }
}
