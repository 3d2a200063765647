import { getRequestHeader } from 'h3'
import { compressText } from '../utils/compression'

/**
 * Server-rendered pages go out compressed (brotli, else gzip) when the browser accepts it: the HTML with
 * its hydration payload is the first thing a page waits for. The built files under /_nuxt are compressed
 * once at build time (nitro.compressPublicAssets); JSON replies and downloads are left as they are.
 * The hook runs after the page's HTML is final (nonces, integrity attributes and security headers set).
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
})
