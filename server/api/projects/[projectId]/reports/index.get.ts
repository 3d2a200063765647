import { ReportListQuerySchema } from '#shared/schemas/reports'
import { listIssuedReports } from '~~/server/services/reports/issued'

/** The project's issued reports, newest first (any member). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const page = validateQuery(event, ReportListQuerySchema)
  return listIssuedReports(project.id, page)
})
