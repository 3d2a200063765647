import { registerReportQueue, startReportWorker, stopReportQueue } from '../services/reports/jobs'
import { closeReportPool } from '../services/reports/render-worker'
import { runJobSettingsFromEnv } from '../services/settlement-run-jobs'
import { logServerError } from '../utils/error-log'
import { databaseReady } from '../utils/ready'

// Long reports (services/reports/jobs.ts) go to the job queue the settlement runs use. A process that takes
// settlement-run jobs (PASTLOAD_SETTLEMENT_WORKER not off, or `npm run worker`) takes report jobs too. On close
// the queue is forgotten (the settlement-worker plugin stops pg-boss) and the render pool's threads stop.
export default defineNitroPlugin((nitro) => {
  const settings = runJobSettingsFromEnv()
  const work = process.env.PASTLOAD_SETTLEMENT_WORKER !== 'off'
  let closed = false
  registerReportQueue(settings)
  databaseReady.then(async () => {
    if (closed || !work) return
    await startReportWorker(settings)
  }).catch((err: unknown) => logServerError('report queue start failed', err))
  nitro.hooks.hook('close', async () => {
    closed = true
    stopReportQueue()
    await closeReportPool()
  })
})
