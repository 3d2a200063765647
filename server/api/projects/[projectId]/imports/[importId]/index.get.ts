import { ImportParamsSchema, ImportPreviewQuerySchema } from '#shared/schemas/imports'
import { loadImportFile, previewTable } from '~~/server/services/imports/preview'
import type { ServerImportPreviewReply } from '#shared/types/imports'

/** The preview again, for another sheet or target (the mapping follows the target). */
export default defineEventHandler(async (event): Promise<ServerImportPreviewReply> => {
  const { project } = await requireProjectRole(event, 'logs.write')
  const { importId } = validateParams(event, ImportParamsSchema)
  const { target, sheet } = validateQuery(event, ImportPreviewQuerySchema)
  const file = await loadImportFile(project.id, importId)
  return { importId, filename: file.filename, format: file.format, preview: await previewTable(project.id, file, target, sheet) }
})
