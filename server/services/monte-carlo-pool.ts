import { availableParallelism } from 'node:os'
import { Piscina } from 'piscina'
import type { SettlementInput } from '#shared/geotech/settlement'
import {
  joinSamples,
  MONTE_CARLO_CHUNK,
  planMonteCarlo,
  runMonteCarlo,
  summariseMonteCarlo,
  type MonteCarloOptions,
  type MonteCarloResult,
  type MonteCarloSamples,
} from '#shared/probabilistic/monte-carlo'
import { findWorkerScript } from '~~/server/utils/worker-script'

/**
 * Large Monte Carlo settlements split across worker threads (piscina), one per core by default
 * (PASTLOAD_MONTE_CARLO_WORKERS, 1–64). The plan is checked here first, so a refusal is the
 * engine's GeotechError as in one thread; the chunks of 1000 realisations are shared out in
 * contiguous ranges, and since each chunk draws from its own streams the numbers are the same
 * for any number of threads. Without the bundled worker (development, unit tests), an input
 * that cannot cross to a thread (a Δσ function) or fewer realisations than two chunks, the work
 * runs in this thread. Settlement runs use the same pool (`monteCarloTaskPool`) for their points and grid nodes.
 */

const WORKER_FILE = 'monte-carlo.bundle.mjs'
const IDLE_MS = 30_000

/** PASTLOAD_MONTE_CARLO_WORKERS: a whole number from 1 to 64, else the cores available. */
export function monteCarloWorkerCount(env: NodeJS.ProcessEnv = process.env): number {
  const n = Number(env.PASTLOAD_MONTE_CARLO_WORKERS)
  return Number.isInteger(n) && n >= 1 && n <= 64 ? n : Math.max(1, availableParallelism())
}

const pools = new Map<string, Piscina>()

function poolFor(file: string, threads: number): Piscina {
  const key = `${file}\u0000${threads}`
  let pool = pools.get(key)
  if (!pool) {
    pool = new Piscina({ filename: file, minThreads: 0, maxThreads: threads, idleTimeout: IDLE_MS })
    pools.set(key, pool)
  }
  return pool
}

/** Chunk ranges [start, end) for `parts` threads, contiguous and as even as whole chunks allow. */
export function chunkRanges(chunks: number, parts: number): Array<[number, number]> {
  const n = Math.max(1, Math.min(parts, chunks))
  return Array.from({ length: n }, (_, i) => [Math.floor((i * chunks) / n), Math.floor(((i + 1) * chunks) / n)] as [number, number])
}

/**
 * The pool of Monte Carlo threads for other tasks of the worker script (its named exports, e.g. a
 * settlement run's points and grid nodes), or null without the bundled worker or with one thread.
 */
export function monteCarloTaskPool(threads = monteCarloWorkerCount(), workerFile?: string | null): Piscina | null {
  const file = workerFile === undefined ? findWorkerScript(WORKER_FILE) : workerFile
  return file && threads >= 2 ? poolFor(file, threads) : null
}

export interface PooledMonteCarloOptions {
  /** Threads to use (default `monteCarloWorkerCount()`). */
  threads?: number
  /** The worker script (default the bundle next to the built server). */
  workerFile?: string | null
  /** Called as each thread's share finishes: realisations done so far, and in all. */
  onProgress?: (done: number, total: number) => void
}

export async function runMonteCarloPooled(input: SettlementInput, options: MonteCarloOptions, pooled: PooledMonteCarloOptions = {}): Promise<MonteCarloResult> {
  const plan = planMonteCarlo(input, options)
  const chunks = Math.ceil(plan.realizations / MONTE_CARLO_CHUNK)
  const threads = pooled.threads ?? monteCarloWorkerCount()
  const file = pooled.workerFile === undefined ? findWorkerScript(WORKER_FILE) : pooled.workerFile
  if (!file || threads < 2 || chunks < 2 || input.stressIncrease !== undefined) {
    return runMonteCarlo(input, options, pooled.onProgress)
  }
  const pool = poolFor(file, threads)
  let done = 0
  const parts = await Promise.all(chunkRanges(chunks, threads).map(async ([chunkStart, chunkEnd]) => {
    const part = await pool.run({ input, options, chunkStart, chunkEnd }) as MonteCarloSamples
    done += part.settlement.length
    pooled.onProgress?.(done, plan.realizations)
    return part
  }))
  return summariseMonteCarlo(plan, joinSamples(plan, parts))
}

/** Stops the pools' threads (tests, shutdown). */
export async function closeMonteCarloPools(): Promise<void> {
  const all = [...pools.values()]
  pools.clear()
  await Promise.all(all.map(p => p.destroy()))
}
