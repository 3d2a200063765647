// The object store's settings: one reading of PASTLOAD_S3_* for the server and the backup scripts.
import { describe, expect, it } from 'vitest'
import { storageConfigFromEnv } from '../../../shared/storage/config.js'

describe('storage settings from the environment', () => {
  it('is null without a bucket (attachments then answer 503, nothing else changes)', () => {
    expect(storageConfigFromEnv({})).toBeNull()
    expect(storageConfigFromEnv({ PASTLOAD_S3_BUCKET: '  ' })).toBeNull()
  })

  it('reads every setting, trimming spaces, with us-east-1 as the default region', () => {
    expect(storageConfigFromEnv({
      PASTLOAD_S3_BUCKET: ' pastload ',
      PASTLOAD_S3_ENDPOINT: 'http://127.0.0.1:54331',
      PASTLOAD_S3_ACCESS_KEY_ID: 'id',
      PASTLOAD_S3_SECRET_ACCESS_KEY: 'secret',
      PASTLOAD_S3_FORCE_PATH_STYLE: 'Yes',
    })).toEqual({
      endpoint: 'http://127.0.0.1:54331',
      region: 'us-east-1',
      bucket: 'pastload',
      credentials: { accessKeyId: 'id', secretAccessKey: 'secret' },
      forcePathStyle: true,
    })
  })

  it('uses the SDK default credentials unless both key parts are set, and virtual-hosted style unless asked', () => {
    const s = storageConfigFromEnv({ PASTLOAD_S3_BUCKET: 'b', PASTLOAD_S3_ACCESS_KEY_ID: 'id', PASTLOAD_S3_REGION: 'eu-west-1' })
    expect(s?.credentials).toBeUndefined()
    expect(s?.endpoint).toBeUndefined()
    expect(s?.region).toBe('eu-west-1')
    expect(s?.forcePathStyle).toBe(false)
  })
})
