import { ModelVersionReportParamsSchema } from '#shared/schemas/reports'
import { contentDisposition } from '~~/server/services/attachments'
import { buildModelVersionReport } from '~~/server/services/reports/model-version'

/** The site-model version report as a PDF preview (not issued): every member who can read the model. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId, version } = validateParams(event, ModelVersionReportParamsSchema)
  const report = await buildModelVersionReport({ projectId: project.id, issue: null }, modelId, version)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': contentDisposition('inline', report.filename),
    'cache-control': 'private, no-store',
  })
  return report.pdf
})
