// How a worker script that imports the TypeScript engine becomes one plain file (esbuild, Vite's own): the build
// bundles them next to the server (nuxt.config.ts, `compiled` hook), and tests that start a worker bundle theirs the
// same way (tests/helpers/monte-carlo-worker.ts). `#shared/…` resolves through package.json's `imports`.
import { resolve } from 'node:path'
import type { BuildOptions } from 'esbuild'

export function workerBundleOptions(rootDir: string, entry: string, outfile: string, extra: Pick<BuildOptions, 'external'> = {}): BuildOptions {
  return {
    entryPoints: [resolve(rootDir, 'server/workers', entry)],
    outfile,
    bundle: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    logLevel: 'warning',
    ...extra,
  }
}
