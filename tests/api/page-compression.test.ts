// Pages and the built scripts go out compressed when the browser accepts it, and as they are when it
// does not (JSON replies too); the page's security headers and nonces are the same either way.
import { request } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import { baseUrl } from '../helpers/http'

/** A raw GET (no automatic decompression), so the bytes on the wire can be checked. */
function rawGet(path: string, acceptEncoding?: string): Promise<{ status: number, headers: Record<string, string | string[] | undefined>, body: Buffer }> {
  return new Promise((resolve, reject) => {
    const req = request(new URL(path, baseUrl()), { headers: acceptEncoding ? { 'accept-encoding': acceptEncoding } : {} }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
      res.on('error', reject)
    })
    req.on('error', reject)
    req.end()
  })
}

describe('compressed pages and scripts', () => {
  it('the sign-in page is brotli-compressed for a browser that accepts it, with its CSP and nonces intact', async () => {
    const r = await rawGet('/login', 'gzip, deflate, br, zstd')
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBe('br')
    expect(String(r.headers.vary)).toMatch(/accept-encoding/i)
    const html = brotliDecompressSync(r.body).toString('utf8')
    expect(r.body.length).toBeLessThan(Buffer.byteLength(html) / 2)
    const nonce = /'nonce-([A-Za-z0-9+/=]{16,})'/.exec(String(r.headers['content-security-policy']))?.[1]
    expect(nonce).toBeDefined()
    expect(html).toContain('Sign in')
    for (const tag of html.match(/<script\b[^>]*>/g) ?? []) expect(tag).toContain(`nonce="${nonce}"`)
  })

  it('a client that accepts no coding gets the page as it is', async () => {
    const r = await rawGet('/login')
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBeUndefined()
    expect(r.body.toString('utf8')).toMatch(/^<!DOCTYPE html>/i)
  })

  it('the entry script is served from its precompressed copy', async () => {
    // A public page with scripts (the sign-in page has none).
    const html = (await rawGet('/forgot-password')).body.toString('utf8')
    const entry = /<script[^>]+type="module"[^>]+src="([^"]+\.js)"/.exec(html)?.[1]
    expect(entry).toMatch(/^\/_nuxt\//)
    const plain = await rawGet(entry!)
    const br = await rawGet(entry!, 'gzip, br')
    expect(br.headers['content-encoding']).toBe('br')
    expect(br.body.length).toBeLessThan(plain.body.length / 2)
    expect(brotliDecompressSync(br.body).equals(plain.body)).toBe(true)
  })
})

describe('compressed JSON replies', () => {
  it('a large JSON reply is brotli-compressed for a browser that accepts it and reads back the same', async () => {
    const plain = await rawGet('/api/openapi.json')
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(String(plain.headers['content-type'])).toMatch(/^application\/json/)
    const br = await rawGet('/api/openapi.json', 'gzip, deflate, br')
    expect(br.headers['content-encoding']).toBe('br')
    expect(String(br.headers['content-type'])).toMatch(/^application\/json/)
    expect(String(br.headers.vary)).toMatch(/accept-encoding/i)
    expect(br.body.length).toBeLessThan(plain.body.length / 3)
    expect(JSON.parse(brotliDecompressSync(br.body).toString('utf8'))).toEqual(JSON.parse(plain.body.toString('utf8')))
    const gz = await rawGet('/api/openapi.json', 'gzip')
    expect(gz.headers['content-encoding']).toBe('gzip')
    expect(JSON.parse(gunzipSync(gz.body).toString('utf8')).openapi).toMatch(/^3\.1/)
  })

  it('a small JSON reply goes out as it is', async () => {
    const r = await rawGet('/api/health', 'gzip, br')
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBeUndefined()
    expect(String(r.headers['content-type'])).toMatch(/^application\/json/)
    expect(JSON.parse(r.body.toString('utf8'))).toBeTypeOf('object')
  })
})
