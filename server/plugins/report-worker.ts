import { registerReportQueue, startReportWorker, stopReportQueue } from '../services/reports/jobs'
import { closeReportPool } from '../services/reports/render-worker'
import { runQueueWithServer } from '../utils/job-queue-plugin'

// Long reports (services/reports/jobs.ts) go to the job queue the settlement runs use. A process that takes
// settlement-run jobs (PASTLOAD_SETTLEMENT_WORKER not off, or `npm run worker`) takes report jobs too. On close
// the queue is forgotten (the settlement-worker plugin stops pg-boss) and the render pool's threads stop.
export default defineNitroPlugin((nitro) => {
  runQueueWithServer(nitro, {
    name: 'report queue',
    register: registerReportQueue,
    startWorker: startReportWorker,
    stop: async () => {
      stopReportQueue()
      await closeReportPool()
    },
  })
})
