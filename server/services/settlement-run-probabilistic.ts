import { setMaxListeners } from 'node:events'
import type { Piscina } from 'piscina'
import { joinSamples, MONTE_CARLO_CHUNK, planMonteCarlo, summariseMonteCarlo, type MonteCarloOptions, type MonteCarloSamples } from '#shared/probabilistic/monte-carlo'
import type { RunProbabilistic } from '#shared/schemas/settlement-runs'
import { RUN_PROBABILISTIC_WORK } from '#shared/schemas/settlement-run-limits'
import type { RunComputeInput, RunComputeOutput } from '#shared/settlement-run/compute'
import {
  gridNodeQuantiles,
  gridNodeRealizations,
  pointChunks,
  pointProbabilistic,
  loadsPlacedAtOnce,
  resolveScatter,
  runMonteCarloDrains,
  runMonteCarloOptions,
  runSettlementInputAt,
  type RunScatterData,
} from '#shared/settlement-run/probabilistic'
import { isTreated } from '#shared/settlement-run/treatment'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { groupThousands } from '#shared/text/count'
import type { RunGridResult } from '#shared/types/settlement-runs'
import { monteCarloTaskPool, monteCarloWorkerCount } from './monte-carlo-pool'

/**
 * The Monte Carlo part of a probabilistic settlement run, after its deterministic part: the named
 * points' realisations in tasks of one chunk (1000) each and the grid nodes in batches, shared
 * across the Monte Carlo pool's threads (one per core). Each chunk and node draws from its own
 * seeded streams, so the numbers are the same for any number of threads. Progress is reported as
 * tasks finish; an aborted signal stops the remaining tasks (a cancelled run) and rejects.
 */

/** Grid nodes per task: enough to outweigh a task's set-up (a plan per node), few enough to share out. */
const NODES_PER_TASK = 40

export class RunCancelled extends Error {
  constructor() {
    super('The run was cancelled.')
    this.name = 'RunCancelled'
  }
}

/** The definition without what the draws never read (fit point ids, flags): smaller tasks to copy to threads. */
function slimDefinition(def: SiteModelDefinition): SiteModelDefinition {
  return {
    ...def,
    flagsInForce: [],
    strata: def.strata.map(s => (s.trend ? { ...s, trend: { ...s.trend, includedPointIds: [], excludedPointIds: [] } } : s)),
  }
}

export interface RunProbabilisticOptions {
  onProgress?: (fraction: number) => void
  signal?: AbortSignal
  /** Threads (default one per core, PASTLOAD_MONTE_CARLO_WORKERS). */
  threads?: number
  /** The worker script (default the bundle next to the built server; null: this thread). */
  workerFile?: string | null
  /** At most this many realisations per grid node (the demo seed keeps its grid light). */
  gridNodeCap?: number
}

/** Runs one task in the pool, or in this thread without one (one at a time, a turn of the event loop apart, so a cancel is heard between them). */
function taskRunner(pool: Piscina | null, signal?: AbortSignal) {
  let line: Promise<unknown> = Promise.resolve()
  return <T>(name: 'runPointChunks' | 'runGridNodes', task: Record<string, unknown>, local: () => T): Promise<T> => {
    if (signal?.aborted) return Promise.reject(new RunCancelled())
    if (!pool) {
      const next = line.catch(() => undefined).then(() => new Promise<void>(r => setImmediate(r))).then(() => {
        if (signal?.aborted) throw new RunCancelled()
        return local()
      })
      line = next
      return next
    }
    return (pool.run(task, { name, ...(signal ? { signal } : {}) }) as Promise<T>).catch((err: unknown) => {
      if (signal?.aborted) throw new RunCancelled()
      throw err
    })
  }
}

/** Adds the probabilistic blocks to a computed run: per point, the grid's P50/P95 and the set-up used. */
export async function addProbabilistic(input: RunComputeInput, p: RunProbabilistic, data: RunScatterData | null, out: RunComputeOutput, opts: RunProbabilisticOptions = {}): Promise<RunComputeOutput> {
  const started = Date.now()
  const threads = opts.threads ?? monteCarloWorkerCount()
  const pool = monteCarloTaskPool(threads, opts.workerFile)
  // Drains enter the draws' t90 when the loads are placed at once (Carrillo's combination, ch drawn).
  const drains = runMonteCarloDrains(input)
  const resolved = resolveScatter(input.definition, p, data, new Set(Object.keys(drains ?? {})))
  const options = runMonteCarloOptions(p, resolved.variation, p.realizations, drains)
  // Every task in the pool listens to the one signal.
  if (opts.signal) setMaxListeners(0, opts.signal)
  const runTask = taskRunner(pool, opts.signal)
  const slim: RunComputeInput = { ...input, definition: slimDefinition(input.definition) }
  const chunks = Math.ceil(p.realizations / MONTE_CARLO_CHUNK)
  const grid = out.results.grid
  const nodes: [number, number][] = grid ? grid.ys.flatMap(y => grid.xs.map(x => [x, y] as [number, number])) : []
  const plans = input.points.map(pt => planMonteCarlo(runSettlementInputAt(input, pt.x, pt.y), options))
  const firstNode = nodes[0]
  const sublayers = plans[0]?.count ?? (firstNode ? planMonteCarlo(runSettlementInputAt(input, firstNode[0], firstNode[1]), options).count : 0)
  const perNode = Math.min(gridNodeRealizations(p.realizations, nodes.length, sublayers), opts.gridNodeCap ?? Infinity)
  const nodeOptions: MonteCarloOptions = { ...options, realizations: Math.max(perNode, 1), limit: undefined }

  const total = input.points.length * p.realizations + nodes.length * perNode
  let done = 0
  const advance = (n: number) => {
    done += n
    opts.onProgress?.(total > 0 ? done / total : 1)
  }

  const pointTasks = input.points.map((pt, i) => Promise.all(Array.from({ length: chunks }, (_, c) =>
    runTask<MonteCarloSamples>('runPointChunks', { input: slim, options, x: pt.x, y: pt.y, chunkStart: c, chunkEnd: c + 1 }, () => pointChunks(slim, options, pt.x, pt.y, c, c + 1))
      .then((part) => {
        advance(part.settlement.length)
        return part
      }))).then((parts) => {
    const plan = plans[i]
    if (!plan) throw new Error('a point without its plan')
    const samples = joinSamples(plan, parts)
    return pointProbabilistic(summariseMonteCarlo(plan, samples), samples.settlement)
  }))
  const gridTasks: Promise<{ p50: number[], p95: number[] }>[] = []
  if (perNode > 0) {
    for (let k = 0; k < nodes.length; k += NODES_PER_TASK) {
      const batch = nodes.slice(k, k + NODES_PER_TASK)
      gridTasks.push(runTask<{ p50: number[], p95: number[] }>('runGridNodes', { input: slim, options: nodeOptions, nodes: batch }, () => gridNodeQuantiles(slim, nodeOptions, batch))
        .then((r) => {
          advance(batch.length * perNode)
          return r
        }))
    }
  }
  let pointBlocks, gridParts
  try {
    [pointBlocks, gridParts] = await Promise.all([Promise.all(pointTasks), Promise.all(gridTasks)])
  }
  catch (err) {
    // Let the tasks already running settle before the caller writes anything.
    await Promise.allSettled([...pointTasks, ...gridTasks])
    throw err
  }
  if (opts.signal?.aborted) throw new RunCancelled()

  const warnings = [...resolved.warnings]
  if (isTreated(input.loads, input.options.drains) && !loadsPlacedAtOnce(input.loads)) {
    warnings.push('The spread is of the final primary settlement under the loads left in place at the end; the construction schedule, a surcharge taken off and the drains are not varied.')
  }
  let gridBlock: RunGridResult['probabilistic'] | undefined
  if (grid && perNode > 0) {
    const p50 = gridParts.flatMap(g => g.p50)
    const p95 = gridParts.flatMap(g => g.p95)
    const nx = grid.xs.length
    gridBlock = {
      realizations: perNode,
      p50: grid.ys.map((_, j) => p50.slice(j * nx, (j + 1) * nx)),
      p95: grid.ys.map((_, j) => p95.slice(j * nx, (j + 1) * nx)),
    }
    if (perNode < p.realizations) warnings.push(`The grid's P50 and P95 are from ${perNode} realisations per node (the named points use ${p.realizations}), to keep the work within ${groupThousands(RUN_PROBABILISTIC_WORK.grid, ',')} realisation-sublayers.`)
  }
  else if (grid) {
    warnings.push('The grid has too many nodes and sublayers for P50 and P95 within the work budget; only the named points are probabilistic. Use a larger spacing or thicker sublayers.')
  }
  const points = out.results.points.map((pt, i) => ({ ...pt, probabilistic: pointBlocks[i] }))
  return {
    details: out.details,
    results: {
      ...out.results,
      points,
      ...(grid ? { grid: { ...grid, ...(gridBlock ? { probabilistic: gridBlock } : {}) } } : {}),
      probabilistic: {
        realizations: p.realizations,
        seed: p.seed,
        ccE0Correlation: p.ccE0Correlation,
        limit: p.limit ?? null,
        fromData: p.fromData,
        strata: resolved.strata,
        warnings,
        threads: pool ? threads : 1,
        computeMs: Date.now() - started,
      },
      warnings: [...out.results.warnings, ...warnings.filter(w => !out.results.warnings.includes(w))],
    },
  }
}
