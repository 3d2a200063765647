// `npm run restore -- <backup folder> [--force]`: the database and the
// attachment files of a backup into the private cluster and local store (or
// DATABASE_URL and PASTLOAD_S3_*). A database that already holds tables is
// refused without --force. See docs/operations.md.
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { describePath, restore } from './lib/backup.mjs'
import { log } from './lib/log.mjs'
import { openTargets } from './lib/targets.mjs'

const USAGE = 'Usage: npm run restore -- <backup folder> [--force]'
const root = fileURLToPath(new URL('..', import.meta.url))
let parsed
try {
  parsed = parseArgs({ options: { force: { type: 'boolean' }, help: { type: 'boolean' } }, allowPositionals: true })
}
catch (err) {
  console.error(`${err.message}\n${USAGE}`)
  process.exit(2)
}
if (parsed.values.help || parsed.positionals.length !== 1) {
  console.error(USAGE)
  process.exit(parsed.values.help ? 0 : 2)
}

const folder = resolve(parsed.positionals[0])
let targets
let status = 0
try {
  targets = await openTargets(root)
  const r = await restore({ folder, databaseUrl: targets.databaseUrl, s3: targets.s3, force: Boolean(parsed.values.force), log: msg => log('restore', msg) })
  log('restore', `Restored ${describePath(root, folder)} (taken ${r.manifest.createdAt}) in ${(r.durationMs.total / 1000).toFixed(1)} s: database ${(r.durationMs.database / 1000).toFixed(1)} s, ${r.manifest.objects.length} file(s) in ${(r.durationMs.objects / 1000).toFixed(1)} s.`)
}
catch (err) {
  log('restore', `Restore failed: ${err.message}`)
  status = err.code === 'NOT_EMPTY' ? 4 : 1
}
finally {
  targets?.close()
}
process.exit(status)
