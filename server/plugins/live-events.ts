import { closeLiveEvents, pruneLiveEvents } from '../services/live-events'
import { databaseReady } from '../utils/ready'

// Live updates: the LISTEN connection opens with the first event stream (services/live-events.ts);
// this plugin closes it with the server and removes day-old events every hour.
export default defineNitroPlugin((nitro) => {
  let timer: ReturnType<typeof setInterval> | undefined
  const prune = () => void pruneLiveEvents().catch(() => { /* the database is down: next round */ })
  databaseReady.then(() => {
    prune()
    timer = setInterval(prune, 3600_000)
    timer.unref()
  }, () => { /* the database plugin stops the server */ })
  nitro.hooks.hook('close', async () => {
    if (timer) clearInterval(timer)
    await closeLiveEvents()
  })
})
