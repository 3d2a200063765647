// A probabilistic settlement run's Monte Carlo across the pool (server/services/settlement-run-probabilistic.ts):
// the worker script bundled as the build bundles it; one thread (no pool), 2 and 3 threads give exactly the
// same blocks per point and grid node; progress reaches 1; an aborted signal stops it with RunCancelled.
import { describe, expect, it } from 'vitest'
import { useBundledMonteCarloWorker } from '../../helpers/monte-carlo-worker'
import { RunProbabilisticSchema, type RunOptions } from '../../../shared/schemas/settlement-runs'
import { computeRun, type RunComputeInput } from '../../../shared/settlement-run/compute'
import { addProbabilistic, RunCancelled } from '../../../server/services/settlement-run-probabilistic'
import { scenarioDefinition } from '../../helpers/scenario-definition'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.5, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 }
const INPUT: RunComputeInput = {
  definition: scenarioDefinition(),
  loads: [{ type: 'rectangle', x: 0, y: 0, width: 30, length: 40, rotation: 0, pressure: 80 }],
  points: [{ label: 'Centre', x: 0, y: 0 }, { label: 'Edge', x: 15, y: 0 }],
  grid: { spacing: 10, margin: 0 },
  options: OPTIONS,
}
const P = RunProbabilisticSchema.parse({ realizations: 2500, seed: 9, limit: 0.5, layers: { EST: { cc: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.4 } }, GLA: { preconsolidation: { cov: 0.2 } } } })

describe('a probabilistic run across worker threads', () => {
  const worker = useBundledMonteCarloWorker()

  const strip = (r: Awaited<ReturnType<typeof addProbabilistic>>) => ({
    points: r.results.points.map(p => p.probabilistic),
    grid: r.results.grid?.probabilistic,
    strata: r.results.probabilistic?.strata,
  })

  it('gives exactly the same blocks with one, two and three threads', async () => {
    const det = computeRun(INPUT)
    const progress: number[] = []
    const one = await addProbabilistic(INPUT, P, null, det, { threads: 1, workerFile: null, onProgress: f => progress.push(f) })
    const two = await addProbabilistic(INPUT, P, null, det, { threads: 2, workerFile: worker.file() })
    const three = await addProbabilistic(INPUT, P, null, det, { threads: 3, workerFile: worker.file() })
    expect(strip(two)).toEqual(strip(one))
    expect(strip(three)).toEqual(strip(one))
    expect(one.results.probabilistic!.threads).toBe(1)
    expect(two.results.probabilistic!.threads).toBe(2)
    expect(progress.at(-1)).toBe(1)
    // Progress only goes up.
    expect([...progress].sort((a, b) => a - b)).toEqual(progress)
    // The deterministic results are kept as they were, and the point's deterministic equals them.
    expect(one.results.points[0]!.settlement).toBe(det.results.points[0]!.settlement)
    expect(one.results.points[0]!.probabilistic!.deterministic).toBeCloseTo(det.results.points[0]!.settlement, 12)
    const grid = one.results.grid!
    expect(grid.probabilistic!.realizations).toBe(1000)
    expect(grid.probabilistic!.p50).toHaveLength(grid.ys.length)
    expect(grid.probabilistic!.p50[0]).toHaveLength(grid.xs.length)
  }, 120_000)

  const DRAINS = { strata: ['EST'], pattern: 'triangular', spacing: 1.5, diameter: 0.052, smearRatio: 3, permeabilityRatio: 3, chRatio: 2 } as const
  const STAGED_WARNING = 'The spread is of the final primary settlement under the loads left in place at the end; the construction schedule, a surcharge taken off and the drains are not varied.'

  it('draws t90 with the drains and ch when the loads are placed at once (ch in the sensitivity)', async () => {
    const drained: RunComputeInput = { ...INPUT, grid: null, options: { ...OPTIONS, drains: { ...DRAINS, strata: [...DRAINS.strata] } } }
    const withCh = { ...P, realizations: 500, layers: { ...P.layers, EST: { ...P.layers.EST, ch: { cov: 0.3 } } } }
    const out = await addProbabilistic(drained, withCh, null, computeRun(drained), { threads: 1, workerFile: null })
    const plain = await addProbabilistic({ ...INPUT, grid: null }, withCh, null, computeRun({ ...INPUT, grid: null }), { threads: 1, workerFile: null })
    const block = out.results.points[0]!.probabilistic!
    expect(out.results.probabilistic!.warnings).not.toContain(STAGED_WARNING)
    expect(out.results.probabilistic!.warnings.some(w => w.includes('ch is recorded but not varied'))).toBe(false)
    expect(block.sensitivity.some(e => e.stratum === 'EST' && e.variable === 'ch')).toBe(true)
    // The drains shorten t90; the settlement's spread is the same draws as without them.
    expect(block.t90!.quantiles.p50).toBeLessThan(plain.results.points[0]!.probabilistic!.t90!.quantiles.p50 / 2)
    expect(block.quantiles).toEqual(plain.results.points[0]!.probabilistic!.quantiles)
    // The drains reach the worker threads: the same numbers with two threads.
    const two = await addProbabilistic(drained, withCh, null, computeRun(drained), { threads: 2, workerFile: worker.file() })
    expect(strip(two)).toEqual(strip(out))
  }, 60_000)

  it('says that a staged run\'s spread is of the final primary settlement (the schedule and drains not varied)', async () => {
    const staged: RunComputeInput = { ...INPUT, grid: null, loads: [{ ...INPUT.loads[0]!, stages: [{ start: 0, duration: 0.5, fraction: 1 }] }], options: { ...OPTIONS, drains: { ...DRAINS, strata: [...DRAINS.strata] } } }
    const withCh = { ...P, realizations: 200, layers: { ...P.layers, EST: { ...P.layers.EST, ch: { cov: 0.3 } } } }
    const out = await addProbabilistic(staged, withCh, null, computeRun(staged), { threads: 1, workerFile: null })
    expect(out.results.probabilistic!.warnings).toContain(STAGED_WARNING)
    expect(out.results.probabilistic!.warnings).toContain('Stratum EST: ch is recorded but not varied; the spread is of final primary settlement and of t90 by vertical drainage.')
    expect(out.results.points[0]!.probabilistic!.realizations).toBe(200)
    expect(out.results.points[0]!.probabilistic!.sensitivity.some(e => e.variable === 'ch')).toBe(false)
  })

  it('stops with RunCancelled when its signal is aborted, in the pool and in this thread', async () => {
    const det = computeRun(INPUT)
    for (const opts of [{ threads: 2, workerFile: worker.file() }, { threads: 1, workerFile: null }]) {
      const stop = new AbortController()
      const running = addProbabilistic(INPUT, { ...P, realizations: 20_000 }, null, det, { ...opts, signal: stop.signal, onProgress: () => stop.abort() })
      await expect(running).rejects.toBeInstanceOf(RunCancelled)
    }
  }, 120_000)
})
