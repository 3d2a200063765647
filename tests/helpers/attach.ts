import sharp from 'sharp'
import type { Client } from './http'

/** Uploads an attachment (multipart `file` plus the text fields) with the client's cookie and Origin. */
export async function attach<T = Record<string, unknown>>(c: Client, projectId: string, filename: string, content: Uint8Array | string, fields: Record<string, string> = {}) {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, v)
  form.append('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)]), filename)
  const headers: Record<string, string> = {}
  if (c.cookie) headers.cookie = c.cookie
  if (c.origin) headers.origin = c.origin
  const res = await fetch(`${c.base}/api/projects/${projectId}/attachments`, { method: 'POST', body: form, headers })
  const text = await res.text()
  let body: unknown = text
  try { body = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, body: body as T }
}

/** A GET whose body is kept as bytes (downloads, thumbnails). */
export async function fetchBytes(c: Client, path: string): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const headers: Record<string, string> = {}
  if (c.cookie) headers.cookie = c.cookie
  const res = await fetch(c.base + path, { headers })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

/** A photo-like PNG: a gradient with noise, so it neither compresses to nothing nor looks blank. */
export async function testPhoto(width = 1000, height = 600): Promise<Buffer> {
  const raw = Buffer.alloc(width * height * 3)
  let seed = 17
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      seed = (seed * 1103515245 + 12345) & 0x7FFFFFFF
      const i = (y * width + x) * 3
      raw[i] = (x * 255) / width
      raw[i + 1] = 90 + (seed % 40)
      raw[i + 2] = (y * 255) / height
    }
  }
  return sharp(raw, { raw: { width, height, channels: 3 } }).png().toBuffer()
}

/** A minimal one-page PDF. */
export const TINY_PDF = '%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 200]>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n'
