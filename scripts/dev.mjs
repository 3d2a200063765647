// `npm run dev`: the private demo cluster, the object store and the mail catcher plus
// `nuxt dev` (hot reload). Stops the servers it started when nuxt dev exits.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { externalSmtp, startMailCatcher } from './lib/mail-catcher.mjs'
import { externalObjectStore, startObjectStore } from './lib/object-store.mjs'
import { ensureCluster } from './lib/postgres.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const cluster = process.env.DATABASE_URL ? null : await ensureCluster({ projectRoot: root, name: 'pg', port: Number(process.env.PASTLOAD_DB_PORT ?? 54329), database: 'pastload' })
const store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: 's3', port: Number(process.env.PASTLOAD_S3_PORT ?? 54331), optional: true })
const mail = externalSmtp() ? null : await startMailCatcher({ projectRoot: root, name: 'mail', port: Number(process.env.PASTLOAD_SMTP_PORT ?? 54332), webPort: Number(process.env.PASTLOAD_MAIL_WEB_PORT ?? 54333), optional: true })
const child = spawn('npx', ['nuxt', 'dev', '--host', process.env.HOST ?? '127.0.0.1', '--port', String(process.env.PORT ?? 3000)], {
  cwd: root,
  stdio: 'inherit',
  env: {
    ...process.env,
    ...store?.env,
    ...mail?.env,
    DATABASE_URL: process.env.DATABASE_URL ?? cluster.url,
    PASTLOAD_SEED: process.env.PASTLOAD_SEED ?? 'demo',
    NUXT_TELEMETRY_DISABLED: '1',
  },
})
const stop = () => child.kill('SIGTERM')
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
child.on('exit', (code) => {
  mail?.stop()
  store?.stop()
  cluster?.stop()
  process.exit(code ?? 0)
})
