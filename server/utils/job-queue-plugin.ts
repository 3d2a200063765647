import type { NitroApp } from 'nitropack'
import { runJobSettingsFromEnv, type RunJobSettings } from '../services/settlement-run-jobs'
import { logServerError } from './error-log'
import { databaseReady } from './ready'

/** One queue on the settlement runs' pg-boss, as a server plugin starts and stops it. */
export interface PluginQueue {
  /** What the queue is, for the log line when its start fails. */
  name: string
  /** Called at once: the process may send jobs from now on. */
  register: (settings: RunJobSettings) => void
  /** Called once the database is ready, unless the server closed first or PASTLOAD_SETTLEMENT_WORKER=off: the process takes jobs. */
  startWorker: (settings: RunJobSettings) => Promise<unknown>
  /** Called instead of `startWorker` under PASTLOAD_SETTLEMENT_WORKER=off, where the queue needs starting to send jobs. */
  startSender?: (settings: RunJobSettings) => Promise<unknown>
  /** Called when the server closes. */
  stop: () => Promise<void> | void
}

/**
 * Ties a job queue to the server's life: registered at once, started when the database is
 * ready (not after the server closed), stopped on close. A failed start is logged, redacted.
 */
export function runQueueWithServer(nitro: NitroApp, queue: PluginQueue): void {
  const settings = runJobSettingsFromEnv()
  const work = process.env.PASTLOAD_SETTLEMENT_WORKER !== 'off'
  let closed = false
  queue.register(settings)
  databaseReady.then(async () => {
    if (closed) return
    if (work) await queue.startWorker(settings)
    else await queue.startSender?.(settings)
  }).catch((err: unknown) => logServerError(`${queue.name} start failed`, err))
  nitro.hooks.hook('close', async () => {
    closed = true
    await queue.stop()
  })
}
