// Security headers on every kind of response: a page (CSP with a per-request
// nonce on every script and style element), API JSON (never cached), an API
// error, downloads (an attachment, the logs workbook) and a static asset.
import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { attach, fetchBytes, TINY_PDF } from '../helpers/attach'
import { demoEmail, signIn, type Client } from '../helpers/http'

const PERMISSIONS = ['camera=()', 'microphone=()', 'geolocation=()', 'payment=()', 'usb=()']

/** A project of this file's own, with one attachment. */
async function projectWithFile(): Promise<{ owner: Client, projectId: string, downloadUrl: string }> {
  const owner = await signIn(demoEmail('owner'))
  const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `HDR-${randomUUID().slice(0, 8)}`, name: 'Header checks' })
  expect(p.status).toBe(201)
  const up = await attach<{ attachment: { downloadUrl: string } }>(owner, p.body.project.id, 'report.pdf', TINY_PDF, { ownerType: 'project' })
  expect(up.status).toBe(201)
  return { owner, projectId: p.body.project.id, downloadUrl: up.body.attachment.downloadUrl }
}

function get(c: Client, path: string): Promise<Response> {
  return fetch(c.base + path, { headers: { cookie: c.cookie } })
}

function cspDirectives(header: string | null): Map<string, string[]> {
  const map = new Map<string, string[]>()
  for (const part of (header ?? '').split(';').map(s => s.trim()).filter(Boolean)) {
    const [name, ...sources] = part.split(/\s+/)
    map.set(name!, sources)
  }
  return map
}

function expectEveryResponseHeaders(h: Headers) {
  expect(h.get('x-content-type-options')).toBe('nosniff')
  expect(h.get('x-frame-options')).toBe('DENY')
  expect(h.get('referrer-policy')).toBe('same-origin')
  expect(h.get('x-powered-by')).toBeNull()
}

/** Error replies keep the server's hardened error headers: no referrer at all, no script, never framed. */
function expectErrorHeaders(h: Headers) {
  expect(h.get('x-content-type-options')).toBe('nosniff')
  expect(h.get('x-frame-options')).toBe('DENY')
  expect(['same-origin', 'no-referrer']).toContain(h.get('referrer-policy'))
  expect(h.get('content-security-policy')).toMatch(/frame-ancestors 'none'/)
  expect(h.get('x-powered-by')).toBeNull()
}

describe('security headers', () => {
  it('a page carries a nonce-based CSP that Nuxt\'s scripts and styles satisfy, and the other page headers', async () => {
    const { owner, projectId } = await projectWithFile()
    for (const path of ['/login', `/projects/${projectId}`]) {
      const r = await get(owner, path)
      expect(r.status).toBe(200)
      expectEveryResponseHeaders(r.headers)
      for (const p of PERMISSIONS) expect(r.headers.get('permissions-policy')).toContain(p)
      const csp = cspDirectives(r.headers.get('content-security-policy'))
      expect(csp.get('default-src')).toEqual(["'none'"])
      expect(csp.get('frame-ancestors')).toEqual(["'none'"])
      expect(csp.get('object-src')).toEqual(["'none'"])
      expect(csp.get('base-uri')).toEqual(["'none'"])
      expect(csp.get('script-src-attr')).toEqual(["'none'"])
      const scriptSrc = csp.get('script-src') ?? []
      expect(scriptSrc).not.toContain("'unsafe-eval'")
      expect(scriptSrc).not.toContain("'unsafe-inline'")
      expect(csp.get('style-src')).not.toContain("'unsafe-inline'")
      const nonce = /^'nonce-([A-Za-z0-9+/=]{16,})'$/.exec(scriptSrc.find(s => s.startsWith("'nonce-")) ?? '')?.[1]
      expect(nonce).toBeDefined()
      expect(csp.get('style-src')).toContain(`'nonce-${nonce}'`)
      const html = await r.text()
      const scripts = html.match(/<script\b[^>]*>/g) ?? []
      // The entry module, the inline config and the hydration payload at least.
      expect(scripts.length).toBeGreaterThanOrEqual(3)
      for (const tag of [...scripts, ...(html.match(/<style\b[^>]*>/g) ?? []), ...(html.match(/<link\b[^>]*rel="(?:stylesheet|modulepreload)"[^>]*>/g) ?? [])]) {
        expect(tag).toContain(`nonce="${nonce}"`)
      }
    }
    const a = cspDirectives((await get(owner, '/login')).headers.get('content-security-policy')).get('script-src')
    const b = cspDirectives((await get(owner, '/login')).headers.get('content-security-policy')).get('script-src')
    expect(a).not.toEqual(b)
  })

  it('API JSON, an API error and a static asset are never framed or sniffed; JSON is never stored', async () => {
    const { owner, projectId } = await projectWithFile()
    const ok = await get(owner, `/api/projects/${projectId}`)
    expect(ok.status).toBe(200)
    expect(ok.headers.get('content-type')).toMatch(/^application\/json/)
    expectEveryResponseHeaders(ok.headers)
    expect(ok.headers.get('cache-control')).toBe('no-store')
    expect(ok.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'")
    expect(ok.headers.get('permissions-policy')).toContain('camera=()')

    const missing = await get(owner, `/api/projects/${randomUUID()}`)
    expect(missing.status).toBe(404)
    expect(missing.headers.get('content-type')).toMatch(/^application\/json/)
    expectErrorHeaders(missing.headers)
    expect(missing.headers.get('cache-control')).toMatch(/^no-(store|cache)$/)

    const signedOut = await fetch(`${owner.base}/api/projects`)
    expect(signedOut.status).toBe(401)
    expectErrorHeaders(signedOut.headers)
    expect(signedOut.headers.get('cache-control')).toBe('no-store')

    const page = await (await get(owner, '/login')).text()
    const asset = /<script[^>]*src="(\/_nuxt\/[^"]+\.js)"/.exec(page)?.[1]
    expect(asset).toBeDefined()
    const js = await fetch(owner.base + asset!)
    expect(js.status).toBe(200)
    expectEveryResponseHeaders(js.headers)
  })

  it('downloads still work and are never run as a page', async () => {
    const { owner, projectId, downloadUrl } = await projectWithFile()
    const file = await fetchBytes(owner, downloadUrl)
    expect(file.status).toBe(200)
    expect(file.bytes.toString('latin1')).toBe(TINY_PDF)
    expectEveryResponseHeaders(file.headers)
    expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="report\.pdf"/)
    expect(file.headers.get('content-security-policy')).toBe("default-src 'none'; sandbox")
    expect(file.headers.get('cache-control')).toBe('private, no-store')

    const xlsx = await fetchBytes(owner, `/exports/${projectId}/logs.xlsx`)
    expect(xlsx.status).toBe(200)
    // An XLSX workbook is a zip archive.
    expect(xlsx.bytes.subarray(0, 2).toString('latin1')).toBe('PK')
    expectEveryResponseHeaders(xlsx.headers)
    expect(xlsx.headers.get('cache-control')).toBe('no-store')
    expect(xlsx.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'")
  })
})
