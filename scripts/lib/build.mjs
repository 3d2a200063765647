// Builds the app when the sources are newer than the last build.
import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { log } from './log.mjs'

const SOURCES = ['app', 'server', 'shared', 'public', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json']

function newestMtime(path) {
  if (!existsSync(path)) return 0
  const st = statSync(path)
  if (!st.isDirectory()) return st.mtimeMs
  let newest = st.mtimeMs
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)))
  return newest
}

export function buildIfStale(projectRoot, { force = false } = {}) {
  const stamp = join(projectRoot, process.env.PASTLOAD_OUTPUT_DIR ?? '.output', 'nitro.json')
  const built = existsSync(stamp) ? statSync(stamp).mtimeMs : 0
  const newest = Math.max(...SOURCES.map(s => newestMtime(join(projectRoot, s))))
  if (!force && built > newest) {
    log('build', 'The build is up to date.')
    return
  }
  log('build', 'Building the app (nuxt build)…')
  const r = spawnSync('npx', ['nuxt', 'build'], { cwd: projectRoot, stdio: 'inherit', env: { ...process.env, NUXT_TELEMETRY_DISABLED: '1' } })
  if (r.status !== 0) throw new Error('nuxt build failed (see above).')
}
