import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import { logServerError } from '../utils/error-log'
import * as schema from './schema'

export type Database = ReturnType<typeof createDatabase>['db']

/** The transaction handed to `useDb().transaction(async (tx) => …)`; services take it to write in the caller's transaction. */
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

function createDatabase(url: string) {
  const pool = new pg.Pool({
    connectionString: url,
    max: Number(process.env.PASTLOAD_DB_POOL ?? 10),
    // Fail fast when the server is gone so /api/health can answer 503 quickly.
    connectionTimeoutMillis: 3000,
    idleTimeoutMillis: 30_000,
  })
  // An idle client losing its connection (database restarted) must not crash the app;
  // the pool replaces it on the next checkout.
  pool.on('error', (err) => {
    logServerError('database: idle connection lost', err, { stack: false, level: 'warn' })
  })
  // A checked-out client (inside a transaction, between queries) has no pool listener: an
  // 'error' event with no listener would be an uncaught exception. The query in flight or
  // the next one fails and its request answers 503; this listener only keeps it quiet.
  pool.on('connect', (client) => {
    client.on('error', () => {})
  })
  return { pool, db: drizzle(pool, { schema, casing: 'snake_case' }) }
}

let instance: ReturnType<typeof createDatabase> | undefined

export function databaseUrl(): string {
  const url = process.env.DATABASE_URL || process.env.NUXT_DATABASE_URL
  if (!url) throw new Error('DATABASE_URL is not set. `npm start` and `npm test` set it for you; see README.md.')
  return url
}

/** The process-wide Drizzle client over one pg pool. */
export function useDb(): Database {
  instance ??= createDatabase(databaseUrl())
  return instance.db
}

export function usePool(): pg.Pool {
  instance ??= createDatabase(databaseUrl())
  return instance.pool
}

export async function closeDb(): Promise<void> {
  if (!instance) return
  const { pool } = instance
  instance = undefined
  await pool.end()
}

export { schema }
