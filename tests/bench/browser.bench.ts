// Browser benchmarks in Debian's Chromium against the built server: the stress
// canvas (frame times and edit → redrawn σ'v0 curve) and the point page's CPT
// plot drawn from 3 000 rows.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium } from 'playwright-core'
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../shared/demo/scenario'
import { runCanvasBench, type CanvasBenchResult } from './canvas.bench'

/** A project (the site admin creates it, the engineer joins) with one CPT point of `rows` readings. */
async function cptPoint(serverUrl: string, engineerEmail: string, rows: number) {
  const admin = DEMO_PEOPLE.find(p => p.isSiteAdmin)!
  const login = await fetch(`${serverUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': serverUrl }, body: JSON.stringify({ email: admin.email, password: DEMO_PASSWORD }) })
  const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const h = { 'content-type': 'application/json', 'origin': serverUrl, cookie }
  const proj = await (await fetch(`${serverUrl}/api/projects`, { method: 'POST', headers: h, body: JSON.stringify({ jobNumber: `BR-${Date.now().toString(36)}`, name: 'Browser benchmark' }) })).json() as { project: { id: string } }
  const base = `${serverUrl}/api/projects/${proj.project.id}`
  await fetch(`${base}/members`, { method: 'POST', headers: h, body: JSON.stringify({ email: engineerEmail, role: 'engineer' }) })
  const pt = await (await fetch(`${base}/points`, { method: 'POST', headers: h, body: JSON.stringify({ identifier: 'CPT-B2', kind: 'cpt', easting: 0, northing: 0, groundElevation: 0, finalDepth: 30 }) })).json() as { point: { id: string } }
  const depth = Array.from({ length: rows }, (_, i) => 0.01 * (i + 1))
  const put = await fetch(`${base}/points/${pt.point.id}/cpt`, { method: 'PUT', headers: h, body: JSON.stringify({ areaRatio: 0.8, depth, qc: depth.map(z => 400 + 30 * z + 50 * Math.sin(z * 7)), fs: depth.map(z => 8 + z), u2: depth.map(z => 9.81 * z + 20) }) })
  if (!put.ok) throw new Error(`CPT fixture failed: ${put.status}`)
  return `/projects/${proj.project.id}/points/${pt.point.id}`
}

export async function runBrowserBench(serverUrl: string): Promise<{ canvas: CanvasBenchResult, cptDrawMs: number[] }> {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-bench-'))
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    viewport: { width: 1440, height: 900 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  try {
    const engineer = DEMO_PEOPLE.find(p => p.role === 'engineer')!
    const page = await context.newPage()
    await page.goto(`${serverUrl}/login`)
    await page.getByLabel('E-mail').fill(engineer.email)
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByTestId('project-list').waitFor()
    const canvas = await runCanvasBench(serverUrl, page, { points: 200_000 })
    const path = await cptPoint(serverUrl, engineer.email, 3000)
    const cptDrawMs: number[] = []
    for (let i = 0; i < 5; i++) {
      await page.goto(`${serverUrl}${path}`)
      const plot = page.getByTestId('cpt-plot')
      await page.waitForFunction(() => document.querySelector('[data-testid="cpt-plot"]')?.getAttribute('data-draw-ms') !== null)
      cptDrawMs.push(Number(await plot.getAttribute('data-draw-ms')))
    }
    return { canvas, cptDrawMs }
  }
  finally {
    await context.close()
    rmSync(dir, { recursive: true, force: true })
  }
}
