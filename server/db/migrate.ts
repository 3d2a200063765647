import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import type { Database } from './client'

/**
 * Applies the committed drizzle-kit migrations. The folder is the repository's
 * `migrations/` (the start and test scripts run the server from the repository
 * root) unless PASTLOAD_MIGRATIONS_DIR says otherwise.
 */
export async function applyMigrations(db: Database): Promise<string> {
  const folder = resolve(process.env.PASTLOAD_MIGRATIONS_DIR ?? 'migrations')
  if (!existsSync(resolve(folder, 'meta', '_journal.json'))) {
    throw new Error(`No migrations found in ${folder} (expected meta/_journal.json). Run the server from the repository root or set PASTLOAD_MIGRATIONS_DIR.`)
  }
  await migrate(db, { migrationsFolder: folder })
  return folder
}
