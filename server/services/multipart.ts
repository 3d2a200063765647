import { createHash } from 'node:crypto'
import busboy from 'busboy'
import type { H3Event } from 'h3'

/**
 * Streams a multipart upload with its size limit enforced while reading, so a
 * body without a Content-Length cannot grow past it. The first part named
 * `file` is the upload; text fields are collected. The chunks are joined once at
 * the end; nothing else copies the file. Used by the import and attachment
 * uploads, each with its own limits and words.
 */
export interface MultipartFile {
  /** As the browser sent it (may be empty); callers clean it for their use. */
  filename: string
  data: Buffer
  /** SHA-256 of the bytes, when asked for (computed on the way). */
  sha256?: string
}

export interface MultipartOptions {
  maxBytes: number
  /** The 413 message. */
  tooLarge: string
  /** The 400 message when the body is not multipart or has no boundary. */
  notMultipart: string
  /** Busboy limits besides the file size. */
  limits: { fields: number, fieldSize: number, parts: number, files?: number }
  /** What a second file, or too many parts, answers (400). */
  tooManyParts: string
  /** Only a `file` part with a file name counts (others are skipped). */
  requireFilename?: boolean
  hash?: boolean
}

const bad = (message: string) => createError({ statusCode: 400, statusMessage: 'Bad Request', message })

export function readMultipart(event: H3Event, opts: MultipartOptions & { hash: true }): Promise<{ file: (MultipartFile & { sha256: string }) | null, fields: Record<string, string> }>
export function readMultipart(event: H3Event, opts: MultipartOptions): Promise<{ file: MultipartFile | null, fields: Record<string, string> }>
export function readMultipart(event: H3Event, opts: MultipartOptions): Promise<{ file: MultipartFile | null, fields: Record<string, string> }> {
  const req = event.node.req
  const type = req.headers['content-type'] ?? ''
  if (!type.startsWith('multipart/form-data')) throw bad(opts.notMultipart)
  return new Promise((resolve, reject) => {
    let bb: busboy.Busboy
    try {
      bb = busboy({ headers: req.headers, limits: { ...opts.limits, fileSize: opts.maxBytes } })
    }
    catch {
      reject(bad(opts.notMultipart))
      return
    }
    const fields: Record<string, string> = {}
    let file: MultipartFile | null = null
    let reading = false
    let failed = false
    const fail = (err: Error) => {
      if (failed) return
      failed = true
      req.unpipe(bb)
      // The rest of the body is dropped as it arrives, so the client can finish sending and read the answer;
      // the connection is cut soon after the answer if the sender goes on (server/utils/refused-body.ts).
      dropRestOfBody(event)
      reject(err)
    }
    bb.on('field', (name, value) => { fields[name] = value })
    bb.on('file', (name, stream, info) => {
      const filename = info.filename ?? ''
      if (name !== 'file' || reading || (opts.requireFilename && !filename)) {
        stream.resume()
        return
      }
      reading = true
      const hash = opts.hash ? createHash('sha256') : null
      const chunks: Buffer[] = []
      let size = 0
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length
        hash?.update(chunk)
        chunks.push(chunk)
      })
      stream.on('limit', () => fail(createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: opts.tooLarge })))
      stream.on('end', () => {
        if (failed) return
        file = { filename, data: chunks.length === 1 && chunks[0] ? chunks[0] : Buffer.concat(chunks, size), ...(hash ? { sha256: hash.digest('hex') } : {}) }
      })
    })
    bb.on('filesLimit', () => fail(bad(opts.tooManyParts)))
    bb.on('partsLimit', () => fail(bad(opts.tooManyParts)))
    bb.on('error', () => fail(bad('The multipart body could not be read.')))
    bb.on('close', () => {
      if (!failed) resolve({ file, fields })
    })
    req.on('error', () => fail(bad('The upload was interrupted.')))
    req.pipe(bb)
  })
}
