// Monte Carlo realisations in a worker thread: one piscina task draws a range of chunks of a plan.
// This file is the entry of a bundle: the build (nuxt.config.ts, `compiled` hook) bundles it with the
// TypeScript engine it imports into `.output/server/workers/monte-carlo.bundle.mjs`.
// Task in: { input, options, chunkStart, chunkEnd }; out: the samples (typed arrays, copied back).
import { planMonteCarlo, simulateChunks } from '../../shared/probabilistic/monte-carlo.ts'

export default function drawChunks({ input, options, chunkStart, chunkEnd }) {
  return simulateChunks(planMonteCarlo(input, options), chunkStart, chunkEnd)
}
