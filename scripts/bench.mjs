// `npm run bench`: engine and API speed against bare baselines, measured in one
// run on this machine, on a private benchmark database, then Lighthouse on three pages.
// Writes docs/performance.md. `npm run bench -- --lighthouse` runs only the Lighthouse step; `-- --reports` only
// the report benchmarks (printed, not written).
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { externalObjectStore, startObjectStore } from './lib/object-store.mjs'
import { ensureCluster } from './lib/postgres.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = await ensureCluster({ projectRoot: root, name: 'pg-bench', port: Number(process.env.PASTLOAD_BENCH_DB_PORT ?? 54369), database: 'pastload_bench', fresh: true })
let status = 1
let store = null
try {
  store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: `s3-bench-${process.pid}`, port: 0, fresh: true })
  buildIfStale(root)
  status = spawnSync('npx', ['tsx', process.argv.includes('--lighthouse') ? 'tests/bench/lighthouse.ts' : process.argv.includes('--reports') ? 'tests/bench/reports-only.ts' : 'tests/bench/run.ts'], { cwd: root, stdio: 'inherit', env: { ...process.env, ...store?.env, DATABASE_URL: cluster.url, NODE_ENV: 'production' } }).status ?? 1
}
finally {
  store?.stop()
  cluster.stop()
}
process.exit(status)
