// Development aid: runs vitest (any arguments) against the test database and a
// fresh build, without lint and typecheck. `npm test` is the full gate.
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { ensureCluster } from './lib/postgres.mjs'
import { startTestServices } from './lib/services.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = await ensureCluster({ projectRoot: root, name: process.env.PASTLOAD_TEST_DB_DIR ?? 'pg-test', port: Number(process.env.PASTLOAD_TEST_DB_PORT ?? 54339), database: 'pastload_test', fresh: true })
let status = 1
let services = null
try {
  services = await startTestServices(root)
  buildIfStale(root)
  status = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit', env: { ...process.env, ...services.env, DATABASE_URL: cluster.url } }).status ?? 1
}
finally {
  services?.stop()
  cluster.stop()
}
process.exit(status)
