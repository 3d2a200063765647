import { and, eq, inArray, sql } from 'drizzle-orm'
import { isGeotechError } from '#shared/geotech/errors'
import { ModelIncompleteError } from '#shared/site-model/convert'
import { computeRun, type RunComputeInput, type RunComputeOutput } from '#shared/settlement-run/compute'
import { useDb } from '~~/server/db/client'
import { settlementRunPoints, settlementRuns } from '~~/server/db/schema'
import { logServerError } from '~~/server/utils/error-log'
import { publishLiveEvent } from './live-events'
import { addProbabilistic, RunCancelled, type RunProbabilisticOptions } from './settlement-run-probabilistic'

/**
 * Running a settlement run, shared by the request (small runs, computed inline) and the job worker
 * (`settlement-run-jobs.ts`): claim the row (running, one more attempt), compute, then write the
 * results, the point tables and `finished` in ONE transaction, or `failed` with a plain message.
 * A run whose row is gone (deleted) or already finished or failed is left alone, so a retried job
 * does no harm.
 */

type RunRow = typeof settlementRuns.$inferSelect

/** Starts a run may have: a run whose worker died this many times is failed rather than started again. */
export const MAX_RUN_ATTEMPTS = 3

export function computeInputOf(row: Pick<RunRow, 'definition' | 'loads' | 'points' | 'grid' | 'options'>): RunComputeInput {
  return { definition: row.definition, loads: row.loads, points: row.points, grid: row.grid ?? null, options: row.options }
}

/** Marks the run running and counts the start; null when there is nothing to do (gone, finished or failed). */
export async function claimRun(runId: string): Promise<RunRow | null> {
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(settlementRuns)
      .set({ status: 'running', attempts: sql`${settlementRuns.attempts} + 1`, startedAt: new Date(), progress: 0 })
      .where(and(eq(settlementRuns.id, runId), inArray(settlementRuns.status, ['queued', 'running'])))
      .returning()
    if (!row) return null
    await publishLiveEvent({ type: 'run.changed', projectId: row.projectId, entityId: row.id }, tx)
    return row
  })
}

/** Writes a progress fraction (0–1) while the run is running; false when it no longer is (cancelled or deleted). */
export async function writeProgress(runId: string, projectId: string, progress: number): Promise<boolean> {
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(settlementRuns).set({ progress: Math.min(Math.max(progress, 0), 1) })
      .where(and(eq(settlementRuns.id, runId), eq(settlementRuns.status, 'running')))
      .returning({ id: settlementRuns.id })
    if (row) await publishLiveEvent({ type: 'run.changed', projectId, entityId: runId }, tx)
    return row !== undefined
  })
}

/** Results, point tables and `finished`, all in one transaction (nothing if the run was deleted meanwhile). */
export async function finishRun(runId: string, projectId: string, out: RunComputeOutput): Promise<boolean> {
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(settlementRuns)
      .set({ status: 'finished', progress: 1, results: out.results, finishedAt: new Date(), errorMessage: null, errorCode: null })
      .where(and(eq(settlementRuns.id, runId), inArray(settlementRuns.status, ['queued', 'running'])))
      .returning({ id: settlementRuns.id })
    if (!row) return false
    await tx.delete(settlementRunPoints).where(eq(settlementRunPoints.runId, runId))
    if (out.details.length) await tx.insert(settlementRunPoints).values(out.details.map(d => ({ runId, index: d.index, detail: d })))
    await publishLiveEvent({ type: 'run.changed', projectId, entityId: runId }, tx)
    return true
  })
}

export async function failRun(runId: string, projectId: string, message: string, code: string | null): Promise<void> {
  await useDb().transaction(async (tx) => {
    const [row] = await tx.update(settlementRuns)
      .set({ status: 'failed', errorMessage: message, errorCode: code, finishedAt: new Date() })
      .where(and(eq(settlementRuns.id, runId), inArray(settlementRuns.status, ['queued', 'running'])))
      .returning({ id: settlementRuns.id })
    if (row) await publishLiveEvent({ type: 'run.changed', projectId, entityId: runId }, tx)
  })
}

/** A refusal by the engine reported from a worker thread: its plain message and code. */
export class RunComputeFailure extends Error {
  constructor(message: string, readonly code: string) {
    super(message)
    this.name = 'RunComputeFailure'
  }
}

/** What a failed computation tells the user: the engine's plain message, or a general one for a fault. */
export function describeComputeError(err: unknown): { message: string, code: string | null } {
  if (err instanceof RunComputeFailure) return { message: err.message, code: err.code }
  if (isGeotechError(err)) return { message: err.message, code: err.code ?? 'engine' }
  if (err instanceof ModelIncompleteError) return { message: err.message, code: 'model-incomplete' }
  logServerError('settlement run computation failed', err)
  return { message: 'The run could not be computed because of a fault in the server. Try again; if it fails again, tell the site administrator.', code: 'fault' }
}

/**
 * Claims and computes a run in this thread (`compute` may hand the work elsewhere, e.g. a worker
 * thread) and writes the outcome. Returns the final status, or null when there was nothing to do.
 */
export async function executeRun(
  runId: string,
  compute: (input: RunComputeInput, onProgress: (f: number) => void) => Promise<RunComputeOutput> = input => Promise.resolve(computeRun(input)),
  monteCarlo: Pick<RunProbabilisticOptions, 'threads' | 'workerFile'> = {},
): Promise<'finished' | 'failed' | 'cancelled' | null> {
  const row = await claimRun(runId)
  if (!row) return null
  if (row.attempts > MAX_RUN_ATTEMPTS) {
    await failRun(runId, row.projectId, `The run stopped ${MAX_RUN_ATTEMPTS} times before it finished (a worker was stopped or ran out of time). Try a coarser grid or thicker sublayers, or ask the site administrator to check the workers.`, 'attempts-exhausted')
    return 'failed'
  }
  let lastWrite = 0
  let pending: Promise<void> = Promise.resolve()
  // A cancel (or delete) is seen when a progress write finds the run no longer running: the Monte Carlo stops between tasks.
  const stop = new AbortController()
  const onProgress = (f: number) => {
    const now = Date.now()
    // At most ~4 writes a second; never the final 1 (the finishing transaction writes it).
    if (f >= 1 || now - lastWrite < 250) return
    lastWrite = now
    pending = pending.then(async () => {
      if (!(await writeProgress(runId, row.projectId, f))) stop.abort()
    }).catch(err => logServerError('settlement run progress write failed', err))
  }
  const probabilistic = row.options.probabilistic
  // A probabilistic run: the deterministic part is the first tenth of the progress, the realisations the rest.
  const share = probabilistic ? 0.1 : 1
  let out: RunComputeOutput
  try {
    const input = computeInputOf(row)
    out = await compute(input, f => onProgress(f * share))
    if (probabilistic) {
      await pending
      if (stop.signal.aborted) throw new RunCancelled()
      out = await addProbabilistic(input, probabilistic, row.scatter ?? null, out, { ...monteCarlo, signal: stop.signal, onProgress: f => onProgress(share + (1 - share) * f) })
    }
  }
  catch (err) {
    await pending
    if (err instanceof RunCancelled) return 'cancelled'
    const { message, code } = describeComputeError(err)
    await failRun(runId, row.projectId, message, code)
    return 'failed'
  }
  await pending
  return (await finishRun(runId, row.projectId, out)) ? 'finished' : null
}
