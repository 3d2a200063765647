import { lt } from 'drizzle-orm'
import { preferFastCompression } from '~~/server/db/binary'
import { importFiles } from '~~/server/db/schema'
import { detectFormat, UploadError } from '~~/server/services/imports/files'
import { analyseAgsOrThrow, asRowErrors } from '~~/server/services/imports/ags'
import { previewTable } from '~~/server/services/imports/preview'
import { readImportUpload } from '~~/server/services/imports/upload'
import { unprocessableError } from '~~/server/services/http-errors'
import type { AgsPreview, ServerImportUpload } from '#shared/types/imports'

const MAX_BYTES = 25 * 1024 * 1024

/**
 * Upload one CSV, XLSX or AGS4 file (multipart field `file`). The format is read
 * from the content; nothing is imported yet: the answer is a preview to map.
 */
export default defineEventHandler(async (event): Promise<ServerImportUpload> => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  // Streamed, with the 25 MB limit (413) enforced while reading.
  const file = await readImportUpload(event, MAX_BYTES)
  const filename = (file.filename ?? 'upload').slice(0, 200)
  let format
  try {
    format = detectFormat(file.data, filename)
  }
  catch (err) {
    if (err instanceof UploadError) throw unprocessableError(err.message, { code: err.code })
    throw err
  }
  // Read (and refused if over a limit) before anything is stored.
  const preview = format === 'ags4' ? null : await previewTable(project.id, { content: file.data, format, filename })
  const ags = format === 'ags4' ? agsPreview(file.data, filename) : null
  const db = useDb()
  // Uploads nobody committed within a day are dropped.
  await db.delete(importFiles).where(lt(importFiles.createdAt, new Date(Date.now() - 24 * 3600 * 1000)))
  // The bytes go in as a binary parameter (node-postgres sends a Buffer as is), compressed with lz4 where available.
  const row = await db.transaction(async (tx) => {
    await preferFastCompression(tx)
    const [inserted] = await tx.insert(importFiles).values({ projectId: project.id, uploadedBy: user.id, filename, format, size: file.data.length, content: file.data }).returning({ id: importFiles.id })
    return inserted
  })
  setResponseStatus(event, 201)
  return { importId: row!.id, filename, format, size: file.data.length, preview, ags }
})

function agsPreview(content: Buffer, filename: string): AgsPreview {
  const a = analyseAgsOrThrow(content, filename)
  return { groups: a.groups, unknownGroups: a.unknownGroups, undefinedStrata: a.undefinedStrata, summary: a.summary, errors: asRowErrors(a.errors).slice(0, 500), warnings: asRowErrors(a.warnings).slice(0, 500) }
}
