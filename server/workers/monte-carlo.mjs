// Monte Carlo realisations in a worker thread: one piscina task draws a range of chunks of a plan.
// This file is the entry of a bundle: the build (nuxt.config.ts, `compiled` hook) bundles it with the
// TypeScript engine it imports into `.output/server/workers/monte-carlo.bundle.mjs`.
// Task in: { input, options, chunkStart, chunkEnd }; out: the samples (typed arrays, copied back).
// Named tasks `runPointChunks` and `runGridNodes` do the same for a settlement run (services/settlement-run-probabilistic.ts).
import { planMonteCarlo, simulateChunks } from '#shared/probabilistic/monte-carlo'
import { gridNodeQuantiles, pointChunks } from '#shared/settlement-run/probabilistic'

export default function drawChunks({ input, options, chunkStart, chunkEnd }) {
  return simulateChunks(planMonteCarlo(input, options), chunkStart, chunkEnd)
}

// A settlement run's named point: chunks [chunkStart, chunkEnd) of its draws (task name `runPointChunks`).
export function runPointChunks({ input, options, x, y, chunkStart, chunkEnd }) {
  return pointChunks(input, options, x, y, chunkStart, chunkEnd)
}

// A settlement run's grid nodes: P50 and P95 at each (task name `runGridNodes`).
export function runGridNodes({ input, options, nodes }) {
  return gridNodeQuantiles(input, options, nodes)
}
