import { eq } from 'drizzle-orm'
import { settlementRunReportTitle } from '#shared/reports/settlement-run'
import { useDb } from '~~/server/db/client'
import { projects } from '~~/server/db/schema'
import { notFound, unprocessableError } from '~~/server/services/http-errors'
import { runFileName } from '~~/server/services/settlement-run-export'
import { getSettlementRun, settlementRunForExport } from '~~/server/services/settlement-runs'
import type { ServerSettlementRun } from '#shared/types/settlement-runs'
import type { ReportBuild, ReportContext, ReportHeading } from './kinds'
import { renderSettlementRunReport } from './render-worker'

/**
 * A finished settlement run's PDF report, from the run as stored (its copy of the model version's standing,
 * its results and each named point's sublayer table). 404 for a run not in the project, 422 for one that has
 * not finished.
 */
export async function buildSettlementRunReport(ctx: ReportContext, runId: string): Promise<ReportBuild> {
  const { run, details } = await settlementRunForExport(ctx.projectId, runId)
  const results = requireFinished(run)
  const project = await reportProject(ctx.projectId)
  ctx.onStage?.('drawing')
  // Rendered in the worker pool: a run with many named points makes hundreds of pages.
  const { pdf, pages } = await renderSettlementRunReport({ project, run: { ...run, results }, details, issue: ctx.issue }, ctx.onStage)
  const { title, subject } = settlementRunReportTitle(run)
  return {
    pdf,
    pages,
    filename: reportFileName(project.jobNumber, run.name, ctx.issue?.revision ?? null),
    title,
    subject,
    approvedRecord: run.model.status === 'approved',
    source: { kind: 'settlement-run', id: run.id },
  }
}

function requireFinished(run: ServerSettlementRun): NonNullable<ServerSettlementRun['results']> {
  if (run.status !== 'finished' || !run.results) {
    throw unprocessableError(run.status === 'failed' ? 'The run failed: it has no results to report.' : `The run is ${run.status}: its report can be made when it has finished.`, { code: 'run-not-finished', status: run.status })
  }
  return run.results
}

async function reportProject(projectId: string) {
  const [project] = await useDb().select({ name: projects.name, jobNumber: projects.jobNumber, client: projects.client, unitSystem: projects.unitSystem, usStressUnit: projects.usStressUnit })
    .from(projects).where(eq(projects.id, projectId)).limit(1)
  if (!project) notFound('Project')
  return project
}

function reportFileName(jobNumber: string, runName: string, revision: string | null): string {
  return runFileName(`${jobNumber}_${runName}_report${revision ? `_rev${revision}` : ''}`, 'pdf')
}

/**
 * The checks of `buildSettlementRunReport` without the work (404 for a run not in the project, 422 for one not
 * finished), and what the issued list shows while the report is made on the job queue.
 */
export async function settlementRunReportHeading(projectId: string, runId: string, revision: string): Promise<ReportHeading> {
  const { run } = await getSettlementRun(projectId, runId)
  requireFinished(run)
  const project = await reportProject(projectId)
  return { ...settlementRunReportTitle(run), filename: reportFileName(project.jobNumber, run.name, revision), approvedRecord: run.model.status === 'approved' }
}
