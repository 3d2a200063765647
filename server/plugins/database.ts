import { applyMigrations } from '../db/migrate'
import { seedDemoIfEmpty } from '../services/demo-seed'
import { seedDemoAttachmentsAfterDemoSeed } from '../services/demo-seed-attachments'
import { seedDemoModelAfterDemoSeed } from '../services/demo-seed-model'
import { seedDemoRunsAfterDemoSeed } from '../services/demo-seed-runs'
import { logServerError } from '../utils/error-log'
import { markDatabaseFailed, markDatabaseReady } from '../utils/ready'

// Applies migrations at start; a failing migration stops the server with its error.
export default defineNitroPlugin(() => {
  const start = async () => {
    const db = useDb()
    const folder = await applyMigrations(db)
    console.info(`[pastload:db] migrations applied from ${folder}`)
    if (process.env.PASTLOAD_SEED === 'demo') {
      const seeded = await seedDemoIfEmpty(db)
      console.info(seeded ? '[pastload:db] demo scenario seeded' : '[pastload:db] database has data: demo seed skipped')
      if (seeded) {
        await seedDemoModelAfterDemoSeed(db)
        await seedDemoAttachmentsAfterDemoSeed(db)
        await seedDemoRunsAfterDemoSeed(db)
      }
    }
  }
  start().then(markDatabaseReady, (err: unknown) => {
    markDatabaseFailed(err)
    logServerError('database start-up failed', err)
    process.exit(1)
  })
})
