import { PointLogReportParamsSchema, PointLogReportQuerySchema } from '#shared/schemas/reports'
import { cleanFilename, contentDisposition } from '~~/server/services/attachments'
import { buildPointLogReport } from '~~/server/services/reports/point-log'

/** The point's stress-history log as a PDF at 1:50, 1:100 or 1:200 (a preview, not issued). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointLogReportParamsSchema)
  const { scale } = validateQuery(event, PointLogReportQuerySchema)
  const report = await buildPointLogReport({ projectId: project.id, issue: null }, pointId, { scale })
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': contentDisposition('inline', cleanFilename(report.filename)),
    'cache-control': 'private, no-store',
  })
  return report.pdf
})
