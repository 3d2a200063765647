// The object store's settings from the environment: one reading for the server
// (server/services/storage.ts) and the backup/restore scripts (scripts/lib/backup.mjs).
// Plain JavaScript (types in config.d.ts) so the scripts run it under Node without a build.

const YES = ['1', 'true', 'yes']

/**
 * The S3 settings from PASTLOAD_S3_*, or null when no bucket is configured.
 * @param {Record<string, string | undefined>} [env]
 * @returns {import('./config').StorageConfig | null}
 */
export function storageConfigFromEnv(env = process.env) {
  const bucket = env.PASTLOAD_S3_BUCKET?.trim()
  if (!bucket) return null
  const accessKeyId = env.PASTLOAD_S3_ACCESS_KEY_ID?.trim()
  const secretAccessKey = env.PASTLOAD_S3_SECRET_ACCESS_KEY?.trim()
  return {
    endpoint: env.PASTLOAD_S3_ENDPOINT?.trim() || undefined,
    region: env.PASTLOAD_S3_REGION?.trim() || 'us-east-1',
    bucket,
    credentials: accessKeyId && secretAccessKey ? { accessKeyId, secretAccessKey } : undefined,
    forcePathStyle: YES.includes((env.PASTLOAD_S3_FORCE_PATH_STYLE ?? '').trim().toLowerCase()),
  }
}
