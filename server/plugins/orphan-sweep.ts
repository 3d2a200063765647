import { sweepOrphanedObjects, sweepSettingsFromEnv } from '../services/orphan-sweep'
import { storageConfigured } from '../services/storage'
import { databaseReady } from '../utils/ready'

// Removes attachment objects that no row refers to: once the database is ready, then on an interval
// (PASTLOAD_ORPHAN_AGE_MS, PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS). A store or database that is down skips a round.
export default defineNitroPlugin((nitro) => {
  if (!storageConfigured()) return
  const { olderThanMs, intervalMs } = sweepSettingsFromEnv()
  let running = false
  let timer: ReturnType<typeof setInterval> | undefined
  const round = async () => {
    if (running) return
    running = true
    try {
      const r = await sweepOrphanedObjects({ olderThanMs })
      if (r.removed > 0) console.info(`[pastload:storage] removed ${r.removed} object(s) no attachment refers to (${r.scanned} scanned)`)
    }
    catch (err) {
      console.warn(`[pastload:storage] orphaned-object sweep skipped: ${err instanceof Error ? err.message : 'unknown error'}`)
    }
    finally {
      running = false
    }
  }
  databaseReady.then(() => {
    void round()
    timer = setInterval(() => void round(), intervalMs)
    timer.unref()
  }, () => { /* the database plugin stops the server */ })
  nitro.hooks.hook('close', () => {
    if (timer) clearInterval(timer)
  })
})
