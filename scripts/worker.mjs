// `npm run worker`: a settlement-run worker of its own against DATABASE_URL (no PostgreSQL started
// here). It runs the BUILT server (.output, built when stale) in this process with the job worker on,
// no demo seed, no mail delivery, and its HTTP side bound to 127.0.0.1 on an unused port
// (PASTLOAD_WORKER_PORT to choose it): the compute code is the server's own bundle and its bundled
// worker thread, so nothing here needs TypeScript. Stop it with Ctrl-C / SIGTERM: the run in progress
// may finish first (up to 20 s); one cut short goes back to the queue and is started again by the next worker.
import { resolve } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { freePort } from './lib/free-port.mjs'
import { log } from './lib/log.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))

if (!process.env.DATABASE_URL) {
  log('worker', 'DATABASE_URL is not set: point the worker at the database the app uses.')
  process.exit(1)
}
if (process.env.PASTLOAD_WORKER_SKIP_BUILD !== '1') buildIfStale(root)
const port = Number(process.env.PASTLOAD_WORKER_PORT ?? 0) || await freePort()
Object.assign(process.env, {
  NITRO_HOST: '127.0.0.1',
  NITRO_PORT: String(port),
  PASTLOAD_SEED: 'none',
  PASTLOAD_MAIL_WORKER: 'off',
  PASTLOAD_SETTLEMENT_WORKER: 'on',
  PASTLOAD_MIGRATIONS_DIR: process.env.PASTLOAD_MIGRATIONS_DIR ?? resolve(root, 'migrations'),
  NUXT_TELEMETRY_DISABLED: '1',
})
log('worker', `Settlement-run worker starting (pid ${process.pid}, HTTP on 127.0.0.1:${port})`)
await import(pathToFileURL(resolve(root, process.env.PASTLOAD_OUTPUT_DIR ?? '.output', 'server/index.mjs')).href)
