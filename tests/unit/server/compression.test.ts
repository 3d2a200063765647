import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import { acceptedCodings, compressText, MIN_COMPRESSED_BYTES } from '../../../server/utils/compression'

// Accept-Encoding as defined by RFC 9110 §12.5.3 (codings with optional quality values; q=0 means "not acceptable").
describe('acceptedCodings', () => {
  it('lists the codings a browser sends', () => {
    expect([...acceptedCodings('gzip, deflate, br, zstd')]).toEqual(['gzip', 'deflate', 'br', 'zstd'])
  })
  it('drops codings with q=0 and keeps those with a positive quality', () => {
    expect([...acceptedCodings('br;q=0, gzip;q=0.5, identity')]).toEqual(['gzip', 'identity'])
    expect([...acceptedCodings('BR ; Q=0.0')]).toEqual([])
  })
  it('accepts nothing when the header is missing or empty', () => {
    expect(acceptedCodings(undefined).size).toBe(0)
    expect(acceptedCodings('').size).toBe(0)
  })
})

describe('compressText', () => {
  const page = `<!DOCTYPE html><html><body>${'<p class="text-sm">σ\'p from the oedometer test</p>'.repeat(200)}</body></html>`

  it('prefers brotli and the bytes decompress to the same text', () => {
    const r = compressText(page, 'gzip, deflate, br')
    expect(r?.coding).toBe('br')
    expect(r!.bytes.length).toBeLessThan(Buffer.byteLength(page) / 10)
    expect(brotliDecompressSync(r!.bytes).toString('utf8')).toBe(page)
  })
  it('falls back to gzip when brotli is not accepted', () => {
    const r = compressText(page, 'gzip')
    expect(r?.coding).toBe('gzip')
    expect(gunzipSync(r!.bytes).toString('utf8')).toBe(page)
  })
  it('leaves the body alone when nothing is accepted or it is too small to gain', () => {
    expect(compressText(page, 'identity')).toBeNull()
    expect(compressText(page, undefined)).toBeNull()
    expect(compressText('x'.repeat(MIN_COMPRESSED_BYTES - 1), 'br')).toBeNull()
  })
})
