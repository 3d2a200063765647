// `npm test`: lint, typecheck (the app, then tests/ through tests/tsconfig.json), then unit, API and browser tests against a separate
// test database on its own port (never the demo data). Starts and stops the test
// PostgreSQL itself; installs Debian's chromium and poppler-utils for the browser and report tests when missing.
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { log } from './lib/log.mjs'
import { ensureCluster } from './lib/postgres.mjs'
import { startTestServices } from './lib/services.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const env = { ...process.env, NUXT_TELEMETRY_DISABLED: '1' }

function step(name, cmd, args, extraEnv = {}) {
  log('test', `${name}…`)
  const t0 = Date.now()
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env: { ...env, ...extraEnv } })
  const secs = ((Date.now() - t0) / 1000).toFixed(1)
  if (r.status !== 0) {
    log('test', `${name} FAILED after ${secs} s`)
    return false
  }
  log('test', `${name} passed in ${secs} s`)
  return true
}

/** Debian packages the browser and report tests use: chromium, and poppler-utils (pdftotext, pdftoppm). */
const TOOL_PACKAGES = [['/usr/bin/chromium', 'chromium'], ['/usr/bin/pdftotext', 'poppler-utils']]

function ensureTestTools() {
  const missing = TOOL_PACKAGES.filter(([bin]) => !existsSync(bin)).map(([, pkg]) => pkg)
  if (!missing.length) return
  if (process.getuid?.() !== 0) throw new Error(`Missing test tools: run \`sudo apt-get install -y ${missing.join(' ')}\` once.`)
  log('test', `Installing Debian's ${missing.join(', ')} for the browser and report tests…`)
  execFileSync('apt-get', ['update', '-q'], { stdio: 'inherit' })
  execFileSync('apt-get', ['install', '-y', '-q', ...missing], { stdio: 'inherit', env: { ...env, DEBIAN_FRONTEND: 'noninteractive' } })
}

async function main() {
  const only = process.argv.slice(2)
  // Nuxt's generated types and lint config follow the tree (new server utils, pages), as after `npm ci`.
  if (!step('prepare', 'npx', ['nuxt', 'prepare'])) return 1
  if (!step('lint', 'npx', ['eslint', '.'])) return 1
  if (!step('typecheck', 'npx', ['nuxt', 'typecheck'])) return 1
  // tests/ is outside the app's tsconfigs: its own project, on the types nuxt typecheck just generated.
  if (!step('typecheck tests', 'npx', ['tsc', '--noEmit', '-p', 'tests'])) return 1
  ensureTestTools()
  const cluster = await ensureCluster({
    projectRoot: root,
    name: process.env.PASTLOAD_TEST_DB_DIR ?? 'pg-test',
    port: Number(process.env.PASTLOAD_TEST_DB_PORT ?? 54339),
    database: 'pastload_test',
    fresh: true,
  })
  let ok = false
  let services = null
  try {
    services = await startTestServices(root)
    buildIfStale(root)
    ok = step('vitest (unit, api, e2e)', 'npx', ['vitest', 'run', ...only], { ...services.env, DATABASE_URL: cluster.url })
  }
  finally {
    services?.stop()
    cluster.stop()
  }
  return ok ? 0 : 1
}

main().then(code => process.exit(code), (err) => {
  console.error(`[pastload:test] ${err.message}`)
  process.exit(1)
})
