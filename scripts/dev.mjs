// `npm run dev`: the private demo cluster, the object store and the mail catcher plus
// `nuxt dev` (hot reload). Stops the servers it started when nuxt dev exits.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { ensureCluster } from './lib/postgres.mjs'
import { startAppServices } from './lib/services.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = process.env.DATABASE_URL ? null : await ensureCluster({ projectRoot: root, name: 'pg', port: Number(process.env.PASTLOAD_DB_PORT ?? 54329), database: 'pastload' })
const services = await startAppServices(root)
const child = spawn('npx', ['nuxt', 'dev', '--host', process.env.HOST ?? '127.0.0.1', '--port', String(process.env.PORT ?? 3000)], {
  cwd: root,
  stdio: 'inherit',
  env: services.appEnv(process.env.DATABASE_URL ?? cluster.url),
})
const stop = () => child.kill('SIGTERM')
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
child.on('exit', (code) => {
  services.stop()
  cluster?.stop()
  process.exit(code ?? 0)
})
