// `npm start`: PostgreSQL (installed and created when missing), the object store, the mail catcher, a build when stale,
// then the app on 127.0.0.1, which applies the migrations and seeds the demo on an
// empty database as it starts (server/plugins/database.ts).
// If the app process dies it is started again after a growing pause (1 s, 2 s …
// 30 s; it gives up at the sixth crash within ten minutes) while PostgreSQL and
// the object store (and the mail catcher) keep running. Ctrl-C / SIGTERM stops the app and the servers
// this script started.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { buildIfStale } from './lib/build.mjs'
import { log } from './lib/log.mjs'
import { ensureCluster } from './lib/postgres.mjs'
import { startAppServices } from './lib/services.mjs'
import { supervise } from './lib/supervise.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const port = Number(process.env.PORT ?? 3000)
const dbPort = Number(process.env.PASTLOAD_DB_PORT ?? 54329)

async function main() {
  const external = process.env.DATABASE_URL
  const cluster = external ? null : await ensureCluster({ projectRoot: root, name: process.env.PASTLOAD_DB_DIR ?? 'pg', port: dbPort, database: 'pastload' })
  const databaseUrl = external ?? cluster.url
  const services = await startAppServices(root)
  const stopAll = () => { services.stop(); cluster?.stop() }

  try {
    buildIfStale(root)
  }
  catch (err) {
    stopAll()
    throw err
  }

  log('app', `Starting Pastload on http://127.0.0.1:${port}`)
  const runApp = () => spawn(process.execPath, [`${process.env.PASTLOAD_OUTPUT_DIR ?? '.output'}/server/index.mjs`], {
    cwd: root,
    stdio: 'inherit',
    env: services.appEnv(databaseUrl, {
      PASTLOAD_MIGRATIONS_DIR: `${root}migrations`,
      NITRO_HOST: process.env.HOST ?? '127.0.0.1',
      NITRO_PORT: String(port),
    }),
  })
  // The app is restarted when it dies (back-off, see lib/supervise.mjs); PostgreSQL and the store stay up.
  const app = supervise(runApp)
  let stopping = false
  const shutdown = (signal) => {
    if (stopping) return
    stopping = true
    log('app', `${signal}: stopping…`)
    app.stop('SIGTERM')
  }
  process.on('SIGINT', () => shutdown('SIGINT'))
  process.on('SIGTERM', () => shutdown('SIGTERM'))
  const { reason, code } = await app.done
  stopAll()
  process.exit(reason === 'stopped' ? 0 : code)
}

main().catch((err) => {
  console.error(`[pastload] ${err.message}`)
  process.exit(1)
})
