import { registerRunQueue, runJobSettingsFromEnv, startRunQueue, startRunWorker, stopRunQueue } from '../services/settlement-run-jobs'
import { logServerError } from '../utils/error-log'
import { databaseReady } from '../utils/ready'

// Settlement runs too large for a request go to the job queue (services/settlement-run-jobs.ts).
// Every app process can send jobs; it also takes them unless PASTLOAD_SETTLEMENT_WORKER=off (then
// `npm run worker` or another app process computes them). On close, the run in progress may
// finish (up to 20 s) before the queue stops; one cut short is started again by another worker.
export default defineNitroPlugin((nitro) => {
  const settings = runJobSettingsFromEnv()
  const work = process.env.PASTLOAD_SETTLEMENT_WORKER !== 'off'
  let closed = false
  registerRunQueue(settings)
  databaseReady.then(async () => {
    if (closed) return
    if (work) await startRunWorker(settings)
    else await startRunQueue(settings)
  }).catch((err: unknown) => logServerError('settlement-run queue start failed', err))
  nitro.hooks.hook('close', async () => {
    closed = true
    await stopRunQueue()
  })
})
