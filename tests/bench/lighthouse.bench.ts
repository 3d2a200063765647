// Lighthouse (mobile profile, its default simulated throttling) on the sign-in page and, signed in
// through the API with the session cookie sent as an extra header, on a project's overview, a
// stress-model page and a settlement run. The machine's 1-minute load average is read beside each run: the
// CPU-bound figures (TBT above all) move with whatever else runs on the machine. One run of a page moves by
// up to ten points from the next, so each page is measured several times (PASTLOAD_LIGHTHOUSE_RUNS, 5 by
// default, pages interleaved) and the row is the run with the median score, its lowest and highest beside
// it; one run before them is not counted (the browser's own start would fall on the first page).
// The pages are loaded as a deployment serves them: over HTTPS with HTTP/2, through a local stand-in for the
// reverse proxy (`tls-proxy.ts`; docs/operations.md). Lighthouse's simulated network gives each plain HTTP/1.1
// connection its own handshake and slow start, which a deployed site does not pay. PASTLOAD_LIGHTHOUSE_TRANSPORT=http1
// measures the app's own port directly instead.
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { cpus, loadavg, tmpdir } from 'node:os'
import { join } from 'node:path'
import lighthouse from 'lighthouse'
import { VIEWER_ZONE_COOKIE } from '../../app/utils/dates'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PROJECT } from '../../shared/demo/scenario'
import { medianRun, type LighthouseRow } from './lighthouse-rows'
import { startTlsProxy } from './tls-proxy'

export const LIGHTHOUSE_GOALS: Record<string, { performance: number }> = {
  'sign-in': { performance: 95 },
  'project overview': { performance: 95 },
  'stress-model page': { performance: 90 },
  'settlement-run page': { performance: 90 },
}

/** How the pages reach the browser: through the HTTPS, HTTP/2 proxy (as deployed) or from the app's own port. */
export type LighthouseTransport = 'h2' | 'http1'

export function lighthouseTransport(): LighthouseTransport {
  const given = process.env.PASTLOAD_LIGHTHOUSE_TRANSPORT ?? 'h2'
  if (given !== 'h2' && given !== 'http1') throw new Error(`PASTLOAD_LIGHTHOUSE_TRANSPORT must be h2 or http1, not ${given}`)
  return given
}

/**
 * Debian's Chromium with a DevTools port for Lighthouse; resolves once the port is known. `acceptOwnCertificate`
 * lets it take the bench proxy's throwaway certificate (this browser profile loads nothing else).
 */
function startChromium(acceptOwnCertificate: boolean): Promise<{ port: number, stop: () => Promise<void> }> {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-lighthouse-'))
  const child: ChildProcess = spawn(process.env.CHROME_PATH ?? '/usr/bin/chromium', [
    '--headless=new', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run',
    '--disable-component-update', '--disable-sync', `--user-data-dir=${dir}`, '--remote-debugging-port=0',
    ...(acceptOwnCertificate ? ['--ignore-certificate-errors'] : []), 'about:blank',
  ], { stdio: ['ignore', 'ignore', 'pipe'] })
  const stop = async () => {
    // Chromium writes its profile as it exits: the folder is removed once the process is gone.
    const exited = new Promise<void>(resolve => child.exitCode !== null ? resolve() : child.once('exit', () => resolve()))
    child.kill('SIGTERM')
    await Promise.race([exited, new Promise(resolve => setTimeout(resolve, 10_000))])
    // Its helper processes can still write for a moment: a folder left in the temporary directory must not fail the bench.
    for (let attempt = 0; ; attempt++) {
      try {
        rmSync(dir, { recursive: true, force: true, maxRetries: 10 })
        return
      }
      catch (err) {
        if (attempt >= 5) {
          console.warn(`Chromium's profile folder ${dir} could not be removed (${(err as NodeJS.ErrnoException).code ?? 'error'}); left in place.`)
          return
        }
        await new Promise(resolve => setTimeout(resolve, 500))
      }
    }
  }
  return new Promise((resolve, reject) => {
    let seen = ''
    const timer = setTimeout(() => { void stop(); reject(new Error('Chromium did not open a DevTools port')) }, 60_000)
    child.stderr!.on('data', (chunk: Buffer) => {
      seen += chunk.toString()
      const m = /DevTools listening on ws:\/\/[^:]+:(\d+)\//.exec(seen)
      if (m) {
        clearTimeout(timer)
        resolve({ port: Number(m[1]), stop })
      }
    })
    child.on('exit', (code) => { clearTimeout(timer); reject(new Error(`Chromium exited (${code})`)) })
  })
}

async function signIn(serverUrl: string, email: string): Promise<string> {
  const login = await fetch(`${serverUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': serverUrl }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) })
  if (!login.ok) throw new Error(`Lighthouse sign-in failed: ${login.status}`)
  // A browser keeps its time zone in a cookie on its first page after signing in (rememberViewerZone), so pages come with
  // their dates already written in it: sent here as that browser would (this machine's zone).
  const zone = `${VIEWER_ZONE_COOKIE}=${encodeURIComponent(Intl.DateTimeFormat().resolvedOptions().timeZone)}`
  return [...login.headers.getSetCookie().map(c => c.split(';')[0]), zone].join('; ')
}

/**
 * The demo project, its stress model in force (the approved one every bench run finds the same; the canvas
 * benchmark adds models of its own beside it) and its seeded settlement run, as the engineer sees them.
 */
async function demoPaths(serverUrl: string, cookie: string): Promise<{ project: string, model: string, run: string | null }> {
  const get = async <T>(path: string) => (await (await fetch(`${serverUrl}${path}`, { headers: { cookie } })).json()) as T
  // The demo project by its job number: the full bench adds projects of its own (the import benchmark's) beside it.
  const { projects } = await get<{ projects: { id: string, jobNumber: string }[] }>('/api/projects')
  const projectId = projects.find(p => p.jobNumber === DEMO_PROJECT.jobNumber)?.id
  if (!projectId) throw new Error('the demo project is missing')
  const inForce = await get<{ modelId: string | null }>(`/api/projects/${projectId}/model-in-force`)
  const { models } = await get<{ models: { id: string }[] }>(`/api/projects/${projectId}/models`)
  let modelId = inForce.modelId ?? models[0]?.id
  if (!modelId) {
    // The demo has logs but no stress model yet: one is made from the logs, as a user would.
    const made = await fetch(`${serverUrl}/api/projects/${projectId}/models`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': serverUrl, cookie }, body: JSON.stringify({ name: 'Terminal platform', description: 'Made by the page benchmark' }) })
    if (!made.ok) throw new Error(`creating the stress model failed: ${made.status}`)
    modelId = ((await made.json()) as { model: { id: string } }).model.id
  }
  const { runs } = await get<{ runs: { id: string }[] }>(`/api/projects/${projectId}/settlement-runs`)
  const runId = runs[0]?.id
  return { project: `/projects/${projectId}`, model: `/projects/${projectId}/models/${modelId}`, run: runId ? `/projects/${projectId}/settlement/${runId}` : null }
}

export async function runLighthouseBench(serverUrl: string): Promise<LighthouseRow[]> {
  const engineer = DEMO_PEOPLE.find(p => p.role === 'engineer')!
  // Signed in and the demo's pages found on the app's own port; the session cookie is the same through the proxy.
  const cookie = await signIn(serverUrl, engineer.email)
  const paths = await demoPaths(serverUrl, cookie)
  const transport = lighthouseTransport()
  const proxy = transport === 'h2' ? await startTlsProxy(serverUrl) : null
  try {
    return await measurePages(proxy?.url ?? serverUrl, paths, cookie, transport)
  }
  finally {
    await proxy?.stop()
  }
}

async function measurePages(siteUrl: string, paths: Awaited<ReturnType<typeof demoPaths>>, cookie: string, transport: LighthouseTransport): Promise<LighthouseRow[]> {
  const pages: { page: string, url: string, cookie?: string }[] = [
    { page: 'sign-in', url: `${siteUrl}/login` },
    { page: 'project overview', url: `${siteUrl}${paths.project}`, cookie },
    { page: 'stress-model page', url: `${siteUrl}${paths.model}`, cookie },
    ...(paths.run ? [{ page: 'settlement-run page', url: `${siteUrl}${paths.run}`, cookie }] : []),
  ]
  // PASTLOAD_LIGHTHOUSE_PAGES (a comma-separated list of the row names above) measures only those pages.
  const only = process.env.PASTLOAD_LIGHTHOUSE_PAGES?.split(',').map(s => s.trim()).filter(Boolean)
  if (only?.length) {
    const unknown = only.filter(name => !pages.some(p => p.page === name))
    if (unknown.length) throw new Error(`PASTLOAD_LIGHTHOUSE_PAGES names no such page: ${unknown.join(', ')}`)
    pages.splice(0, pages.length, ...pages.filter(p => only.includes(p.page)))
  }
  const runs = Math.max(1, Math.min(9, Number(process.env.PASTLOAD_LIGHTHOUSE_RUNS ?? 5) || 5))
  const chromium = await startChromium(transport === 'h2')
  try {
    // Not counted: the browser's first page load also pays for its own start.
    await lighthouse(pages[0]!.url, { port: chromium.port, output: 'json', logLevel: 'error', onlyCategories: ['performance'] })
    const byPage = new Map<string, LighthouseRow[]>(pages.map(p => [p.page, []]))
    for (let run = 0; run < runs; run++) {
      for (const p of pages) byPage.get(p.page)!.push(await measurePage(chromium.port, p, run))
    }
    return pages.map(p => medianRun(byPage.get(p.page)!))
  }
  finally {
    await chromium.stop()
  }
}

/** One Lighthouse run of one page. */
async function measurePage(port: number, p: { page: string, url: string, cookie?: string }, run: number): Promise<LighthouseRow> {
  const load = loadavg()[0]!
  const result = await lighthouse(p.url, {
    port,
    output: 'json',
    logLevel: 'error',
    onlyCategories: ['performance', 'accessibility'],
    ...(p.cookie ? { extraHeaders: { Cookie: p.cookie } } : {}),
  })
  const lhr = result?.lhr
  if (!lhr) throw new Error(`Lighthouse gave no result for ${p.page}`)
  const keep = process.env.PASTLOAD_LIGHTHOUSE_REPORTS
  if (keep) {
    // The whole report of each page, to read which scripts and requests cost the time.
    mkdirSync(keep, { recursive: true })
    writeFileSync(join(keep, `${p.page.replace(/\W+/g, '-')}-${run + 1}.json`), JSON.stringify(lhr))
  }
  if (lhr.runtimeError) {
    // On a heavily loaded machine a run can time out; the row says so instead of stopping the bench.
    return { page: p.page, performance: Number.NaN, accessibility: Number.NaN, lcpMs: Number.NaN, tbtMs: Number.NaN, cls: Number.NaN, load, failed: [], error: lhr.runtimeError.code }
  }
  const a = lhr.audits
  const accessibilityIds = new Set((lhr.categories.accessibility?.auditRefs ?? []).map(r => r.id))
  return {
    page: p.page,
    performance: Math.round((lhr.categories.performance?.score ?? 0) * 100),
    accessibility: Math.round((lhr.categories.accessibility?.score ?? 0) * 100),
    lcpMs: a['largest-contentful-paint']?.numericValue ?? Number.NaN,
    tbtMs: a['total-blocking-time']?.numericValue ?? Number.NaN,
    cls: a['cumulative-layout-shift']?.numericValue ?? Number.NaN,
    load,
    failed: Object.values(a).filter(x => accessibilityIds.has(x.id) && x.score === 0).map(x => x.id),
  }
}

/** The rows as the Markdown section of docs/performance.md. */
export function lighthouseSection(rows: LighthouseRow[]): string {
  const date = new Date().toISOString().slice(0, 10)
  return [
    `Measured ${date} on ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}, Chromium headless (no GPU); ${lighthouseTransport() === 'h2' ? 'pages served over HTTPS with HTTP/2 through the bench\'s local TLS proxy (as deployed behind a reverse proxy)' : 'pages served over plain HTTP/1.1 from the app\'s own port'}; the load average is read just before each page's run.`,
    '',
    '| page (Lighthouse 12.8.2, mobile) | date | load avg (1 min) | performance (median run; lowest–highest of the runs) | goal | accessibility | LCP (s) | TBT (ms) | CLS |',
    '|---|---|---:|---:|---:|---:|---:|---:|---:|',
    ...rows.map(r => r.error
      ? `| ${r.page} | ${date} | ${r.load.toFixed(2)} | no result (${r.error}) | ≥ ${LIGHTHOUSE_GOALS[r.page]?.performance ?? 90} | – | – | – | – |`
      : `| ${r.page} | ${date} | ${r.load.toFixed(2)} | ${r.performance}${r.range ? ` (${r.range[0]}–${r.range[1]} in ${r.runs} run${r.runs === 1 ? '' : 's'})` : ''} | ≥ ${LIGHTHOUSE_GOALS[r.page]?.performance ?? 90} | ${r.accessibility}${r.failed.length ? ` (${r.failed.join(', ')})` : ''} | ${(r.lcpMs / 1000).toFixed(1)} | ${Math.round(r.tbtMs)} | ${r.cls.toFixed(3)} |`),
  ].join('\n')
}
