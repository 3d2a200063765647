// Development aid: runs vitest (any arguments) against the test database and a
// fresh build, without lint and typecheck. `npm test` is the full gate.
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { externalSmtp, startMailCatcher } from './lib/mail-catcher.mjs'
import { externalObjectStore, startObjectStore } from './lib/object-store.mjs'
import { ensureCluster } from './lib/postgres.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = await ensureCluster({ projectRoot: root, name: process.env.PASTLOAD_TEST_DB_DIR ?? 'pg-test', port: Number(process.env.PASTLOAD_TEST_DB_PORT ?? 54339), database: 'pastload_test', fresh: true })
let status = 1
let store = null
let mail = null
try {
  store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: `s3-test-${process.pid}`, port: Number(process.env.PASTLOAD_TEST_S3_PORT ?? 0), fresh: true })
  mail = externalSmtp() ? null : await startMailCatcher({ projectRoot: root, name: `mail-test-${process.pid}`, port: Number(process.env.PASTLOAD_TEST_SMTP_PORT ?? 0), webPort: 0, fresh: true })
  buildIfStale(root)
  status = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit', env: { ...process.env, ...store?.env, ...mail?.env, DATABASE_URL: cluster.url } }).status ?? 1
}
finally {
  mail?.stop()
  store?.stop()
  cluster.stop()
}
process.exit(status)
