import { ExportQuerySchema, VersionParamsSchema } from '#shared/schemas/models'
import { exportVersion } from '~~/server/services/model-drafts'

/** A saved version for other tools: JSON (the settlement API's input) or the XLSX sublayer table. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'export.read')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const query = validateQuery(event, ExportQuerySchema)
  const out = await exportVersion(project, modelId, version, query)
  if (out.format === 'json') return out.document
  setResponseHeaders(event, {
    'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    'content-disposition': `attachment; filename="${out.filename}"`,
  })
  return out.workbook
})
