// A settlement run computed in a worker thread, so the app process keeps answering requests.
// This file is the entry of a bundle: the build (nuxt.config.ts, `compiled` hook) bundles it with
// the TypeScript engine it imports into `.output/server/workers/settlement-run.bundle.mjs`.
// Messages out: { type: 'progress', fraction } while the grid is computed, then
// { type: 'done', output } or { type: 'error', error: { name, message, code } }.
import { parentPort, workerData } from 'node:worker_threads'
import { computeRun } from '#shared/settlement-run/compute'
import { isGeotechError } from '#shared/geotech/errors'
import { ModelIncompleteError } from '#shared/site-model/convert'

try {
  const output = computeRun(workerData.input, fraction => parentPort.postMessage({ type: 'progress', fraction }))
  parentPort.postMessage({ type: 'done', output })
}
catch (err) {
  const kind = isGeotechError(err) ? 'geotech' : err instanceof ModelIncompleteError ? 'model-incomplete' : 'fault'
  parentPort.postMessage({ type: 'error', error: { kind, message: err instanceof Error ? err.message : String(err), code: kind === 'geotech' ? err.code ?? null : null, depth: kind === 'geotech' ? err.depth ?? null : null } })
}
