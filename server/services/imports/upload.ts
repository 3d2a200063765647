import busboy from 'busboy'
import type { H3Event } from 'h3'

/**
 * Streams an import upload (one part named `file`) with the size limit enforced
 * while reading, so a body without a Content-Length cannot grow past it. The
 * chunks are joined once at the end; nothing else copies the file.
 */
export interface ImportUpload {
  filename: string
  data: Buffer
}

const NO_FILE = 'Send the file as multipart form data in a field named "file".'

export function readImportUpload(event: H3Event, maxBytes: number): Promise<ImportUpload> {
  const req = event.node.req
  const type = req.headers['content-type'] ?? ''
  if (!type.startsWith('multipart/form-data')) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: NO_FILE })
  return new Promise((resolve, reject) => {
    let bb: busboy.Busboy
    try {
      bb = busboy({ headers: req.headers, limits: { fileSize: maxBytes, fields: 20, fieldSize: 4096, parts: 40 } })
    }
    catch {
      reject(createError({ statusCode: 400, statusMessage: 'Bad Request', message: NO_FILE }))
      return
    }
    let file: ImportUpload | null = null
    let reading = false
    let failed = false
    const fail = (err: Error) => {
      if (failed) return
      failed = true
      req.unpipe(bb)
      // The rest of an oversized or broken body is not worth reading: close the connection after the answer.
      setResponseHeader(event, 'connection', 'close')
      reject(err)
    }
    bb.on('file', (name, stream, info) => {
      // The first part named "file" with a file name is the upload; any other part is skipped.
      const filename = info.filename
      if (name !== 'file' || reading || !filename) {
        stream.resume()
        return
      }
      reading = true
      const chunks: Buffer[] = []
      let size = 0
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length
        chunks.push(chunk)
      })
      stream.on('limit', () => fail(createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `The file is larger than ${(maxBytes / 1048576).toFixed(0)} MB, the limit for an import.` })))
      stream.on('end', () => {
        if (!failed) file = { filename, data: chunks.length === 1 ? chunks[0]! : Buffer.concat(chunks, size) }
      })
    })
    bb.on('partsLimit', () => fail(createError({ statusCode: 400, statusMessage: 'Bad Request', message: NO_FILE })))
    bb.on('error', () => fail(createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The multipart body could not be read.' })))
    bb.on('close', () => {
      if (failed) return
      if (!file) reject(createError({ statusCode: 400, statusMessage: 'Bad Request', message: NO_FILE }))
      else resolve(file)
    })
    req.on('error', () => fail(createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The upload was interrupted.' })))
    req.pipe(bb)
  })
}
