import { readImportUpload, storeUpload } from '~~/server/services/imports/upload'
import type { ServerImportUpload } from '#shared/types/imports'

const MAX_BYTES = 25 * 1024 * 1024

/**
 * Upload one CSV, XLSX or AGS4 file (multipart field `file`). The format is read
 * from the content; nothing is imported yet: the answer is a preview to map.
 */
export default defineEventHandler(async (event): Promise<ServerImportUpload> => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  // Streamed, with the 25 MB limit (413) enforced while reading.
  const file = await readImportUpload(event, MAX_BYTES)
  const stored = await storeUpload(project.id, user.id, file)
  setResponseStatus(event, 201)
  return stored
})
