// Starts a built Pastload server (.output) as a child process on a free port.
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { freePort } from '../../scripts/lib/free-port.mjs'

export const ROOT = resolve(import.meta.dirname, '../..')

export { freePort }

export interface RunningServer {
  url: string
  child: ChildProcess
  output: () => string
  stop: () => Promise<void>
}

export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  const output = process.env.PASTLOAD_OUTPUT_DIR ?? '.output'
  if (!existsSync(resolve(ROOT, output, 'server/index.mjs'))) throw new Error(`No build in ${output}: run npm test (it builds first) or npx nuxt build.`)
  const databaseUrl = env.DATABASE_URL ?? process.env.DATABASE_URL
  if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the API and browser tests through `npm test`, which starts the test database.')
  const port = await freePort()
  const url = `http://127.0.0.1:${port}`
  let log = ''
  const child = spawn(process.execPath, [`${output}/server/index.mjs`], {
    cwd: ROOT,
    env: {
      ...process.env,
      NITRO_HOST: '127.0.0.1',
      NITRO_PORT: String(port),
      PASTLOAD_SEED: 'demo',
      PASTLOAD_TRUST_PROXY: '1',
      PASTLOAD_MIGRATIONS_DIR: resolve(ROOT, 'migrations'),
      ...env,
      DATABASE_URL: databaseUrl,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout?.on('data', (d: Buffer) => { log += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { log += d.toString() })
  const deadline = Date.now() + 60_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`The test server exited (${child.exitCode}):\n${log}`)
    if (Date.now() > deadline) throw new Error(`The test server's database check did not pass in 60 s:\n${log}`)
    try {
      // Ready once the database answers: a server started with its object store down on purpose answers 503 here.
      const r = await fetch(`${url}/api/health`)
      const health = await r.json() as { db?: string }
      if (health.db === 'ok') break
    }
    catch { /* not listening yet */ }
    await new Promise(r => setTimeout(r, 150))
  }
  return {
    url,
    child,
    output: () => log,
    stop: async () => {
      if (child.exitCode !== null) return
      child.kill('SIGTERM')
      await new Promise(r => child.once('exit', r))
    },
  }
}
