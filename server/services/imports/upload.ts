import type { H3Event } from 'h3'
import { readMultipart } from '../multipart'

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
