// Bodies above the limit are refused before they are read: 413.
const JSON_LIMIT = Number(process.env.PASTLOAD_BODY_LIMIT ?? 1_048_576)
const UPLOAD_LIMIT = Number(process.env.PASTLOAD_UPLOAD_LIMIT ?? 25 * 1_048_576)

export default defineEventHandler((event) => {
  const method = event.method
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  const type = getRequestHeader(event, 'content-type') ?? ''
  const limit = type.startsWith('multipart/form-data') || type === 'application/octet-stream' ? UPLOAD_LIMIT : JSON_LIMIT
  if (length > limit) {
    throw createError({
      statusCode: 413,
      statusMessage: 'Payload Too Large',
      message: `The request body is ${length} bytes; the limit is ${limit} bytes.`,
    })
  }
})
