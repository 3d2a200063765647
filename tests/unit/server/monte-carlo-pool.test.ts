// The Monte Carlo split across worker threads (server/services/monte-carlo-pool.ts): the worker
// script is bundled here as the build bundles it, and the pooled result must equal the one-thread
// result exactly for any number of threads (each chunk of realisations draws from its own streams).
import { describe, expect, it } from 'vitest'
import { useBundledMonteCarloWorker } from '../../helpers/monte-carlo-worker'
import { runMonteCarlo, type MonteCarloOptions } from '../../../shared/probabilistic/monte-carlo'
import type { SettlementInput } from '../../../shared/geotech/settlement'
import { chunkRanges, runMonteCarloPooled } from '../../../server/services/monte-carlo-pool'

const INPUT: SettlementInput = {
  layers: [
    { name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
    { name: 'Clay', thickness: 8, unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.85, cr: 0.09, e0: 2.1, preconsolidation: { type: 'pop', value: 20 }, cv: 1.2 },
    { name: 'Silt', thickness: 4, unitWeight: 18, unitWeightSaturated: 18, compressible: true, cc: 0.3, cr: 0.04, e0: 0.9, preconsolidation: { type: 'ocr', value: 1.5 }, cv: 4 },
  ],
  groundwater: { waterTableDepth: 1 },
  load: { type: 'uniform', pressure: 80 },
}
const OPTIONS: MonteCarloOptions = {
  realizations: 5500,
  seed: 21,
  strata: { Clay: { cc: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.5 } }, Silt: { preconsolidation: { cov: 0.25 }, cr: { cov: 0.3 } } },
  limit: 0.9,
}

describe('Monte Carlo across worker threads', () => {
  const worker = useBundledMonteCarloWorker()

  it('chunk ranges cover every chunk once, contiguous', () => {
    expect(chunkRanges(6, 4)).toEqual([[0, 1], [1, 3], [3, 4], [4, 6]])
    expect(chunkRanges(2, 8)).toEqual([[0, 1], [1, 2]])
  })

  it('2 and 3 threads give exactly the one-thread result, with progress to the total', async () => {
    const one = runMonteCarlo(INPUT, OPTIONS)
    const seen: number[] = []
    const two = await runMonteCarloPooled(INPUT, OPTIONS, { threads: 2, workerFile: worker.file(), onProgress: d => seen.push(d) })
    const three = await runMonteCarloPooled(INPUT, OPTIONS, { threads: 3, workerFile: worker.file() })
    expect(two).toEqual(one)
    expect(three).toEqual(one)
    expect(seen.at(-1)).toBe(5500)
  }, 60_000)

  it('refusals come from the plan in this thread (the engine\'s GeotechError)', async () => {
    await expect(runMonteCarloPooled(INPUT, { ...OPTIONS, strata: { Peat: { cc: { cov: 0.2 } } } }, { threads: 2, workerFile: worker.file() })).rejects.toMatchObject({ code: 'stratum-unknown' })
  })
})
