import { getRequestHeader, getResponseHeader, setResponseHeader, type H3Event } from 'h3'
import { compressText } from '../utils/compression'

/**
 * Server-rendered pages and JSON replies go out compressed (brotli, else gzip) when the browser accepts it:
 * the HTML with its hydration payload is the first thing a page waits for, and a page's large replies (the
 * σ'p data of a stress-model page is about 180 kB of JSON) are the next. The built files under /_nuxt are
 * compressed once at build time (nitro.compressPublicAssets). Downloads (PDF, XLSX, attachments) and the live
 * event stream are left as they are: their handlers send bytes or a stream, not a value.
 * The page hook runs after the page's HTML is final (nonces, integrity attributes and security headers set).
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:response', (response, { event }) => {
    if (typeof response.body !== 'string') return
    const headers = (response.headers ??= {})
    if (headers['content-encoding']) return
    headers.vary = headers.vary ? `${headers.vary}, Accept-Encoding` : 'Accept-Encoding'
    const compressed = compressText(response.body, getRequestHeader(event, 'accept-encoding'))
    if (!compressed) return
    ;(response as { body: unknown }).body = compressed.bytes
    headers['content-encoding'] = compressed.coding
  })

  nitroApp.hooks.hook('beforeResponse', (event, response) => {
    const body = compressibleJson(event, response.body)
    if (body === null) return
    setResponseHeader(event, 'vary', 'Accept-Encoding')
    setResponseHeader(event, 'content-type', 'application/json')
    const compressed = compressText(body, getRequestHeader(event, 'accept-encoding'))
    // The JSON text made here is the one sent, compressed or not: h3 does not serialise the value again.
    if (!compressed) {
      response.body = body
      return
    }
    setResponseHeader(event, 'content-encoding', compressed.coding)
    response.body = compressed.bytes
  })
})

/** The JSON text h3 would send for an API handler's plain value, or null when the reply is not one. */
function compressibleJson(event: H3Event, body: unknown): string | null {
  if (!event.path.startsWith('/api/') || event.handled) return null
  if (body === null || typeof body !== 'object' || Buffer.isBuffer(body) || ArrayBuffer.isView(body)) return null
  if (typeof (body as { pipe?: unknown }).pipe === 'function' || body instanceof ReadableStream || body instanceof Response || body instanceof Blob) return null
  if (getResponseHeader(event, 'content-encoding')) return null
  const type = getResponseHeader(event, 'content-type')
  if (type !== undefined && !String(type).startsWith('application/json')) return null
  return JSON.stringify(body)
}
