import { brotliCompressSync, constants, gzipSync } from 'node:zlib'

/** Bodies smaller than this go out as they are: compressing them saves less than a packet. */
export const MIN_COMPRESSED_BYTES = 1024

/** The content codings an Accept-Encoding header accepts (`br`, `gzip` …), honouring `;q=0`. */
export function acceptedCodings(header: string | undefined): Set<string> {
  const accepted = new Set<string>()
  for (const part of (header ?? '').split(',')) {
    const [name = '', ...params] = part.trim().toLowerCase().split(';')
    const q = params.map(p => p.trim()).find(p => p.startsWith('q='))
    if (q !== undefined && !(Number(q.slice(2)) > 0)) continue
    if (name) accepted.add(name)
  }
  return accepted
}

/**
 * A text body compressed the way the request accepts (brotli, else gzip), or null when it accepts neither
 * or the body is too small to gain. Brotli at quality 5 compresses a 50 kB page in about a millisecond,
 * close to its best ratio for HTML.
 */
export function compressText(body: string, acceptEncoding: string | undefined): { coding: 'br' | 'gzip', bytes: Buffer } | null {
  if (Buffer.byteLength(body) < MIN_COMPRESSED_BYTES) return null
  const accepted = acceptedCodings(acceptEncoding)
  if (accepted.has('br')) {
    return { coding: 'br', bytes: brotliCompressSync(body, { params: { [constants.BROTLI_PARAM_QUALITY]: 5, [constants.BROTLI_PARAM_SIZE_HINT]: body.length } }) }
  }
  if (accepted.has('gzip')) return { coding: 'gzip', bytes: gzipSync(body, { level: 6 }) }
  return null
}
