import { SettlementRunReportParamsSchema } from '#shared/schemas/reports'
import { buildSettlementRunReport } from '~~/server/services/reports/settlement-run'
import { contentDisposition } from '~~/server/services/attachments'

/** A finished run's PDF report (a preview, not issued): any member who can read the run. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { runId } = validateParams(event, SettlementRunReportParamsSchema)
  const report = await buildSettlementRunReport({ projectId: project.id, issue: null }, runId)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': contentDisposition('inline', report.filename),
    'cache-control': 'private, no-store',
  })
  return report.pdf
})
