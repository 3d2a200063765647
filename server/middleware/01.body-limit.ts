import type { H3Event } from 'h3'

// Bodies above the limit are refused with 413: by their Content-Length before they are read, and a chunked
// body (no Content-Length) by counting its bytes as they arrive, the moment it passes the limit.
const JSON_LIMIT = Number(process.env.PASTLOAD_BODY_LIMIT ?? 1_048_576)
const UPLOAD_LIMIT = Number(process.env.PASTLOAD_UPLOAD_LIMIT ?? 25 * 1_048_576)

/** Where h3's body readers (readBody, readRawBody) take a body already read. */
const H3_RAW_BODY = Symbol.for('h3RawBody')

const tooLarge = (message: string) => createError({ statusCode: 413, statusMessage: 'Payload Too Large', message })

export default defineEventHandler(async (event) => {
  const method = event.method
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return
  const req = event.node.req
  const length = Number(req.headers['content-length'] ?? 0)
  const type = req.headers['content-type'] ?? ''
  const upload = type.startsWith('multipart/form-data') || type === 'application/octet-stream'
  const limit = upload ? UPLOAD_LIMIT : JSON_LIMIT
  if (length > limit) {
    throw tooLarge(`The request body is ${length} bytes; the limit is ${limit} bytes.`)
  }
  // With a Content-Length, Node's parser reads exactly that many bytes: nothing more to count.
  if (!/\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))) return
  const slot = req as unknown as Record<symbol, unknown>
  if (upload) {
    // Uploads are streamed by their routes with the upload limit (server/services/multipart.ts). Any other
    // route that reads such a body as data gets it through here, within the JSON limit, read when first asked.
    let read: Promise<Buffer> | null = null
    slot[H3_RAW_BODY] = {
      then<T, E>(onRead: (buf: Buffer) => T, onFail: (err: unknown) => E) {
        read ??= readWithin(event, JSON_LIMIT)
        return read.then(onRead, onFail)
      },
    }
    return
  }
  slot[H3_RAW_BODY] = Promise.resolve(await readWithin(event, limit))
})

/** The whole body, or a 413 as soon as more than `limit` bytes have arrived (the rest is dropped, the connection closed soon after the answer). */
function readWithin(event: H3Event, limit: number): Promise<Buffer> {
  const req = event.node.req
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const done = () => {
      req.off('data', onData)
      req.off('end', onEnd)
      req.off('error', onError)
      req.off('close', onClose)
    }
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size <= limit) {
        chunks.push(chunk)
        return
      }
      done()
      chunks.length = 0
      dropRestOfBody(event)
      reject(tooLarge(`The request body is larger than ${limit} bytes, the limit for this request.`))
    }
    const onEnd = () => {
      done()
      resolve(Buffer.concat(chunks))
    }
    const onError = (err: Error) => {
      done()
      reject(createError({ statusCode: 400, statusMessage: 'Bad Request', message: `The request body could not be read (${err.message}).` }))
    }
    // The sender went away before the end of the body.
    const onClose = () => onError(new Error('the connection closed'))
    req.on('data', onData)
    req.on('end', onEnd)
    req.on('error', onError)
    req.on('close', onClose)
  })
}
