import { registerRunQueue, startRunQueue, startRunWorker, stopRunQueue } from '../services/settlement-run-jobs'
import { runQueueWithServer } from '../utils/job-queue-plugin'

// Settlement runs too large for a request go to the job queue (services/settlement-run-jobs.ts).
// Every app process can send jobs; it also takes them unless PASTLOAD_SETTLEMENT_WORKER=off (then
// `npm run worker` or another app process computes them). On close, the run in progress may
// finish (up to 20 s) before the queue stops; one cut short is started again by another worker.
export default defineNitroPlugin((nitro) => {
  runQueueWithServer(nitro, {
    name: 'settlement-run queue',
    register: registerRunQueue,
    startWorker: startRunWorker,
    startSender: startRunQueue,
    stop: stopRunQueue,
  })
})
