// `npm run backup [-- --out <folder>]`: the database (pg_dump -Fc) and the
// attachment bucket (S3 API) into one dated folder under .data/backups/.
// See docs/operations.md.
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { backup, defaultBackupFolder, describePath } from './lib/backup.mjs'
import { log } from './lib/log.mjs'
import { openTargets } from './lib/targets.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
let args
try {
  args = parseArgs({ options: { out: { type: 'string' }, help: { type: 'boolean' } }, allowPositionals: false }).values
}
catch (err) {
  console.error(`${err.message}\nUsage: npm run backup [-- --out <folder>]`)
  process.exit(2)
}
if (args.help) {
  console.log('Usage: npm run backup [-- --out <folder>]\nWrites database.dump, objects/ and manifest.json into the folder (default .data/backups/<date and time>).')
  process.exit(0)
}

const folder = args.out ? resolve(args.out) : defaultBackupFolder(root)
let targets
let status = 0
try {
  targets = await openTargets(root)
  const m = await backup({ databaseUrl: targets.databaseUrl, s3: targets.s3, folder, log: msg => log('backup', msg) })
  const store = m.objectStore
  log('backup', `Backup written to ${describePath(root, folder)} in ${(m.durationMs.total / 1000).toFixed(1)} s: database ${(m.durationMs.database / 1000).toFixed(1)} s, ${store ? `${store.count} file(s), ${(store.bytes / 1048576).toFixed(1)} MB in ${(m.durationMs.objects / 1000).toFixed(1)} s` : 'no bucket configured'}.`)
  if (store?.missing.length) {
    log('backup', `Warning: ${store.missing.length} file(s) the rows refer to were deleted from the bucket while the backup ran; they are not in it.`)
    status = 3
  }
}
catch (err) {
  log('backup', `Backup failed: ${err.message}`)
  status = 1
}
finally {
  targets?.close()
}
process.exit(status)
