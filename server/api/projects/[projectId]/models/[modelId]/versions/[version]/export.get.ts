import { ExportQuerySchema, VersionParamsSchema } from '#shared/schemas/models'
import { exportDocument, exportWorkbook } from '~~/server/services/model-export'
import { requireModel, requireVersion } from '~~/server/services/model-versions'
import { exportName } from '~~/server/services/exports/logs'

/** A saved version for other tools: JSON (the settlement API's input) or the XLSX sublayer table. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'export.read')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const { format, maxThickness } = validateQuery(event, ExportQuerySchema)
  const model = await requireModel(project.id, modelId)
  const v = await requireVersion(modelId, version)
  if (format === 'xlsx') {
    const buf = exportWorkbook(project, model, v, maxThickness)
    setResponseHeaders(event, {
      'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
      'content-disposition': `attachment; filename="${exportName(project, `${model.name}-v${version}-sublayers`, 'xlsx')}"`,
    })
    return buf
  }
  return exportDocument(project, model, v, maxThickness)
})
