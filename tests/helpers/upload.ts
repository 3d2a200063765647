import type { Client } from './http'

/** Uploads one file as multipart form data (field "file") with the client's cookie and Origin. */
export async function upload<T = Record<string, unknown>>(c: Client, path: string, filename: string, content: string | Uint8Array, type = 'text/csv') {
  const form = new FormData()
  // A copy into a plain ArrayBuffer: a Blob takes no view of a shared buffer.
  form.append('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)], { type }), filename)
  const headers: Record<string, string> = {}
  if (c.cookie) headers.cookie = c.cookie
  if (c.origin) headers.origin = c.origin
  const res = await fetch(c.base + path, { method: 'POST', body: form, headers })
  const text = await res.text()
  let body: unknown = text
  try { body = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, body: body as T }
}

/**
 * Streams a multipart body of one file of `megabytes` MiB without a Content-Length (chunked),
 * so only the route's own reading can stop it: the file starts with `firstBytes`, then spaces.
 */
export async function uploadChunked(c: Client, path: string, filename: string, type: string, firstBytes: string, megabytes: number): Promise<Response> {
  const boundary = 'pastload-test-boundary'
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n${firstBytes}`)
  const chunk = Buffer.alloc(1024 * 1024, 0x20)
  let sent = 0
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent === 0) controller.enqueue(head)
      if (sent >= megabytes) {
        controller.enqueue(Buffer.from(`\r\n--${boundary}--\r\n`))
        controller.close()
        return
      }
      sent += 1
      controller.enqueue(chunk)
    },
  })
  const headers: Record<string, string> = { 'content-type': `multipart/form-data; boundary=${boundary}` }
  if (c.cookie) headers.cookie = c.cookie
  if (c.origin) headers.origin = c.origin
  return fetch(c.base + path, { method: 'POST', body, duplex: 'half', headers } as RequestInit)
}
