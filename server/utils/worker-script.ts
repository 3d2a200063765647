import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

/**
 * Where a worker thread's script is: `workers/<file>` next to the built server (`.output/server/workers/`,
 * copied or bundled there by the build, nuxt.config.ts `compiled` hook), looked for from this module upwards.
 * With `sources`, also `server/workers/<file>` in the sources (a plain script that runs as it is, e.g. the
 * workbook reader). Null when there is none: a bundled worker is missing in development and unit tests, and
 * the caller then does the work in its own thread.
 */
export function findWorkerScript(file: string, opts: { sources?: boolean } = {}): string | null {
  let dir = dirname(fileURLToPath(import.meta.url))
  for (;;) {
    const candidates = [join(dir, 'workers', file), ...(opts.sources ? [join(dir, 'server', 'workers', file)] : [])]
    for (const candidate of candidates) {
      if (existsSync(candidate)) return candidate
    }
    const up = dirname(dir)
    if (up === dir) return null
    dir = up
  }
}
