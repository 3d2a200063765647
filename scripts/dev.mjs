// `npm run dev`: the private demo cluster plus `nuxt dev` (hot reload). Stops
// the database server it started when nuxt dev exits.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { externalObjectStore, startObjectStore } from './lib/object-store.mjs'
import { ensureCluster } from './lib/postgres.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = process.env.DATABASE_URL ? null : await ensureCluster({ projectRoot: root, name: 'pg', port: Number(process.env.PASTLOAD_DB_PORT ?? 54329), database: 'pastload' })
const store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: 's3', port: Number(process.env.PASTLOAD_S3_PORT ?? 54331), optional: true })
const child = spawn('npx', ['nuxt', 'dev', '--host', process.env.HOST ?? '127.0.0.1', '--port', String(process.env.PORT ?? 3000)], {
  cwd: root,
  stdio: 'inherit',
  env: {
    ...process.env,
    ...store?.env,
    DATABASE_URL: process.env.DATABASE_URL ?? cluster.url,
    PASTLOAD_SEED: process.env.PASTLOAD_SEED ?? 'demo',
    NUXT_TELEMETRY_DISABLED: '1',
  },
})
const stop = () => child.kill('SIGTERM')
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
child.on('exit', (code) => {
  store?.stop()
  cluster?.stop()
  process.exit(code ?? 0)
})
