// The database and bucket a maintenance script works on: DATABASE_URL and
// PASTLOAD_S3_* when set, else the private demo cluster and local store of
// `npm start` (started for the script when they are not running, reused when they are).
import { externalObjectStore, startObjectStore } from './object-store.mjs'
import { ensureCluster } from './postgres.mjs'
import { storageConfigFromEnv } from '../../shared/storage/config.js'

export async function openTargets(projectRoot) {
  let cluster = null
  let store = null
  try {
    const databaseUrl = process.env.DATABASE_URL
      || (cluster = await ensureCluster({ projectRoot, name: process.env.PASTLOAD_DB_DIR ?? 'pg', port: Number(process.env.PASTLOAD_DB_PORT ?? 54329), database: 'pastload' })).url
    if (!externalObjectStore()) store = await startObjectStore({ projectRoot, name: 's3', port: Number(process.env.PASTLOAD_S3_PORT ?? 54331) })
    const s3 = storageConfigFromEnv(store ? { ...process.env, ...store.env } : process.env)
    return { databaseUrl, s3, close: () => { store?.stop(); cluster?.stop() } }
  }
  catch (err) {
    store?.stop()
    cluster?.stop()
    throw err
  }
}
