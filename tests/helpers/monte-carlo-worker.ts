// The Monte Carlo worker script bundled as the build bundles it (esbuild, into a temporary folder),
// for unit tests of the thread pool; the pools are closed and the folder removed after the file.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { build } from 'esbuild'
import { afterAll, beforeAll } from 'vitest'
import { closeMonteCarloPools } from '../../server/services/monte-carlo-pool'
import { workerBundleOptions } from '../../server/workers/bundle-options'

/** Call inside a `describe`; `file()` is the bundled worker once the suite has started. */
export function useBundledMonteCarloWorker(): { file: () => string } {
  let dir = ''
  let bundled = ''
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'pastload-mc-'))
    bundled = join(dir, 'monte-carlo.bundle.mjs')
    await build(workerBundleOptions(resolve(import.meta.dirname, '../..'), 'monte-carlo.mjs', bundled))
  }, 60_000)
  afterAll(async () => {
    await closeMonteCarloPools()
    rmSync(dir, { recursive: true, force: true })
  })
  return {
    file: () => {
      if (!bundled) throw new Error('the Monte Carlo worker is not bundled yet')
      return bundled
    },
  }
}
