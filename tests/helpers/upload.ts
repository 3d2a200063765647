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
