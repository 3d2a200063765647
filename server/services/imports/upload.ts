import type { H3Event } from 'h3'
import { lt } from 'drizzle-orm'
import { useDb } from '~~/server/db/client'
import { preferFastCompression } from '~~/server/db/binary'
import { importFiles } from '~~/server/db/schema'
import { unprocessableError } from '../http-errors'
import { readMultipart } from '../multipart'
import type { IntervalWords } from '#shared/investigation/intervals'
import { projectDepthWords } from '../project-units'
import { analyseAgsOrThrow, asRowErrors } from './ags'
import { detectFormat, UploadError } from './files'
import { previewTable } from './preview'

/** An import upload: one part named `file`, streamed within the size limit (`../multipart.ts`). */
export interface ImportUpload {
  filename: string
  data: Buffer
}

const NO_FILE = 'Send the file as multipart form data in a field named "file".'

export async function readImportUpload(event: H3Event, maxBytes: number): Promise<ImportUpload> {
  const { file } = await readMultipart(event, {
    maxBytes,
    tooLarge: `The file is larger than ${(maxBytes / 1048576).toFixed(0)} MB, the limit for an import.`,
    notMultipart: NO_FILE,
    limits: { fields: 20, fieldSize: 4096, parts: 40 },
    tooManyParts: NO_FILE,
    // The first part named "file" with a file name is the upload; any other part is skipped.
    requireFilename: true,
  })
  if (!file) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: NO_FILE })
  return { filename: file.filename, data: file.data }
}

/**
 * Stores an uploaded CSV, XLSX or AGS4 file for mapping and answers its preview. The format is read
 * from the content, and the file is read (and refused if over a limit) before anything is stored;
 * uploads nobody committed within a day are dropped.
 */
export async function storeUpload(projectId: string, actorId: string, upload: { data: Buffer, filename?: string | null }) {
  const filename = (upload.filename ?? 'upload').slice(0, 200)
  let format
  try {
    format = detectFormat(upload.data, filename)
  }
  catch (err) {
    if (err instanceof UploadError) throw unprocessableError(err.message, { code: err.code })
    throw err
  }
  const preview = format === 'ags4' ? null : await previewTable(projectId, { content: upload.data, format, filename })
  const ags = format === 'ags4' ? agsPreview(upload.data, filename, (await projectDepthWords(projectId)).intervals) : null
  const db = useDb()
  await db.delete(importFiles).where(lt(importFiles.createdAt, new Date(Date.now() - 24 * 3600 * 1000)))
  // The bytes go in as a binary parameter (node-postgres sends a Buffer as is), compressed with lz4 where available.
  const row = await db.transaction(async (tx) => {
    await preferFastCompression(tx)
    const [inserted] = await tx.insert(importFiles).values({ projectId, uploadedBy: actorId, filename, format, size: upload.data.length, content: upload.data }).returning({ id: importFiles.id })
    return inserted
  })
  return { importId: row!.id, filename, format, size: upload.data.length, preview, ags }
}

function agsPreview(content: Buffer, filename: string, words: IntervalWords) {
  const a = analyseAgsOrThrow(content, filename, words)
  return { groups: a.groups, unknownGroups: a.unknownGroups, undefinedStrata: a.undefinedStrata, summary: a.summary, errors: asRowErrors(a.errors).slice(0, 500), errorCount: a.errors.length, warnings: asRowErrors(a.warnings).slice(0, 500) }
}
