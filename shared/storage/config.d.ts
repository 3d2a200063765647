export interface StorageConfig {
  /** Unset: the SDK's regional endpoint for the region. */
  endpoint: string | undefined
  region: string
  bucket: string
  /** Both unset: the SDK's default credential chain (e.g. an instance role). */
  credentials: { accessKeyId: string, secretAccessKey: string } | undefined
  forcePathStyle: boolean
}

/** The S3 settings from PASTLOAD_S3_*, or null when no bucket is configured. */
export function storageConfigFromEnv(env?: Record<string, string | undefined>): StorageConfig | null
