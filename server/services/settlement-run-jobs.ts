import { Worker } from 'node:worker_threads'
import PgBoss from 'pg-boss'
import { computeRun, type RunComputeInput, type RunComputeOutput } from '#shared/settlement-run/compute'
import { databaseUrl } from '~~/server/db/client'
import { logServerError } from '~~/server/utils/error-log'
import { findWorkerScript } from '~~/server/utils/worker-script'
import { executeRun, MAX_RUN_ATTEMPTS, RunComputeFailure } from './settlement-run-execution'
import { setRunEnqueuer } from './settlement-runs'

/**
 * Settlement runs too large to compute in the request go through a pg-boss queue (10.4.2) in
 * PostgreSQL. Any app process with the worker on (the plugin `server/plugins/settlement-worker.ts`,
 * or `npm run worker`) takes jobs; the run itself is computed in a worker thread
 * (`server/workers/settlement-run.mjs`, bundled by the build) so the process keeps answering.
 * A worker that dies leaves its job active until the job's expiry; pg-boss then hands it to
 * another worker, which starts the run again (`attempts` counts the starts). The handler is
 * idempotent: a run already finished, failed or deleted is skipped (`executeRun`).
 *
 * Environment: PASTLOAD_JOBS_SCHEMA (default `pgboss`), PASTLOAD_RUN_JOB_EXPIRY_S (default 900),
 * PASTLOAD_JOBS_MAINTENANCE_S (how often expired jobs are looked for, default 30).
 */

export const RUN_QUEUE = 'settlement-run'
/** Retries after a worker died or a job expired: one start more than MAX_RUN_ATTEMPTS, which marks the run failed at once. */
const RUN_RETRY_LIMIT = MAX_RUN_ATTEMPTS

export interface RunJobSettings {
  schema: string
  expirySeconds: number
  maintenanceSeconds: number
}

export function runJobSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): RunJobSettings {
  const int = (v: string | undefined, d: number, min: number) => {
    const n = Number(v)
    return Number.isInteger(n) && n >= min ? n : d
  }
  const schema = env.PASTLOAD_JOBS_SCHEMA?.trim() || 'pgboss'
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(schema)) throw new Error('PASTLOAD_JOBS_SCHEMA must be a plain lower-case PostgreSQL name (letters, digits, underscore).')
  return {
    schema,
    expirySeconds: int(env.PASTLOAD_RUN_JOB_EXPIRY_S, 900, 1),
    maintenanceSeconds: int(env.PASTLOAD_JOBS_MAINTENANCE_S, 30, 1),
  }
}

let boss: PgBoss | null = null
let starting: Promise<PgBoss> | null = null

/** Starts pg-boss in this process (its tables in the settings' schema) and creates the queue. */
export async function startRunQueue(settings = runJobSettingsFromEnv()): Promise<PgBoss> {
  if (boss) return boss
  starting ??= (async () => {
    const b = new PgBoss({
      connectionString: databaseUrl(),
      schema: settings.schema,
      max: 3,
      maintenanceIntervalSeconds: settings.maintenanceSeconds,
    })
    b.on('error', err => logServerError('settlement-run job queue', err))
    await b.start()
    await b.createQueue(RUN_QUEUE, { name: RUN_QUEUE, expireInSeconds: settings.expirySeconds, retryLimit: RUN_RETRY_LIMIT, retryDelay: 1 })
    boss = b
    return b
  })()
  try {
    return await starting
  }
  finally {
    starting = null
  }
}

/**
 * Lets the run service hand large runs to the queue from now on (the queue starts on first use,
 * so a run created while the process is still starting waits for it rather than running inline).
 */
export function registerRunQueue(settings = runJobSettingsFromEnv()): void {
  setRunEnqueuer(async (runId) => {
    const b = await startRunQueue(settings)
    await b.send(RUN_QUEUE, { runId }, { expireInSeconds: settings.expirySeconds, retryLimit: RUN_RETRY_LIMIT, retryDelay: 1 })
  })
}

/** The bundled worker-thread script next to the built server, or null (development: compute in this thread). */
function workerScript(): string | null {
  return findWorkerScript('settlement-run.bundle.mjs')
}

const active = new Set<Worker>()

/** Computes a run in a worker thread (or in this thread when there is no bundled worker script). */
export function computeInWorker(input: RunComputeInput, onProgress: (f: number) => void): Promise<RunComputeOutput> {
  const script = workerScript()
  if (!script) return Promise.resolve(computeRun(input, onProgress))
  return new Promise((resolve, reject) => {
    const w = new Worker(script, { workerData: { input } })
    active.add(w)
    let settled = false
    w.on('message', (m: { type: 'progress', fraction: number } | { type: 'done', output: RunComputeOutput } | { type: 'error', error: { kind: string, message: string, code: string | null } }) => {
      if (m.type === 'progress') onProgress(m.fraction)
      else if (m.type === 'done') {
        settled = true
        resolve(m.output)
      }
      else {
        settled = true
        reject(m.error.kind === 'fault' ? new Error(m.error.message) : new RunComputeFailure(m.error.message, m.error.code ?? m.error.kind))
      }
    })
    w.on('error', (err: Error) => {
      if (!settled) reject(err)
      settled = true
    })
    w.on('exit', (code) => {
      active.delete(w)
      if (!settled) reject(new Error(`the settlement-run worker thread stopped (exit code ${code})`))
      settled = true
    })
  })
}

let working = false

/** Takes jobs from the queue in this process, one run at a time. */
export async function startRunWorker(settings = runJobSettingsFromEnv()): Promise<void> {
  const b = await startRunQueue(settings)
  if (working) return
  working = true
  await b.work<{ runId: string }>(RUN_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) {
      const status = await executeRun(job.data.runId, computeInWorker)
      console.info(`[pastload:runs] run ${job.data.runId}: ${status ?? 'nothing to do'}`)
    }
  })
  console.info(`[pastload:runs] settlement-run worker started (schema ${settings.schema}; runs computed ${workerScript() ? 'in a worker thread' : 'in this thread'})`)
}

/** Stops taking jobs, lets a run in progress finish (up to `timeoutMs`), then closes the queue. */
export async function stopRunQueue(timeoutMs = 20_000): Promise<void> {
  const b = boss
  boss = null
  working = false
  setRunEnqueuer(null)
  if (!b) return
  await b.stop({ graceful: true, wait: true, timeout: timeoutMs })
  for (const w of active) await w.terminate()
}
