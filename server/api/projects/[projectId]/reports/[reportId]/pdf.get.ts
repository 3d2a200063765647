import { ReportParamsSchema } from '#shared/schemas/reports'
import { sendIssuedReport } from '~~/server/services/reports/issued'

/** An issued report's stored PDF, byte for byte as issued (any member). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { reportId } = validateParams(event, ReportParamsSchema)
  return sendIssuedReport(event, project.id, reportId)
})
