import { describe, expect, it } from 'vitest'
import { loadConfig } from '../../../server/config'
import { createStorage } from '../../../server/storage'
import { sizeText } from '../../../server/uploads/size-text'

const base = { DATABASE_URL: 'postgres://postgres@127.0.0.1:5434/gridcue_test', JWT_SECRET: 'x'.repeat(40) }

describe('storage settings', () => {
  it('should keep recordings on disk in .data/recordings, up to 4 GiB each, when nothing is set', () => {
    const config = loadConfig(base)
    expect(config.storage).toEqual({ driver: 'disk', dir: '.data/recordings' })
    expect(config.uploads.maxBytes).toBe(4 * 1024 ** 3)
    expect(createStorage(config.storage).driver).toBe('disk')
  })

  it('should build the S3 driver from the S3 settings', () => {
    const config = loadConfig({ ...base, STORAGE: 's3', S3_BUCKET: 'takes', S3_ENDPOINT: 'http://127.0.0.1:4569', S3_ACCESS_KEY_ID: 'id', S3_SECRET_ACCESS_KEY: 'secret' })
    expect(config.storage).toEqual({
      driver: 's3',
      endpoint: 'http://127.0.0.1:4569',
      bucket: 'takes',
      region: 'us-east-1',
      credentials: { accessKeyId: 'id', secretAccessKey: 'secret' },
    })
    expect(createStorage(config.storage).driver).toBe('s3')
  })

  it('should refuse STORAGE=s3 without a bucket, and a storage it does not know', () => {
    expect(() => loadConfig({ ...base, STORAGE: 's3' })).toThrow('S3_BUCKET: S3_BUCKET is required when STORAGE=s3')
    expect(() => loadConfig({ ...base, STORAGE: 'tape' })).toThrow(/STORAGE:/)
  })
})

describe('sizeText', () => {
  it('should say a limit as people do, in GB from 1 GiB up and in MB below', () => {
    expect(sizeText(4 * 1024 ** 3)).toBe('4 GB')
    expect(sizeText(1.5 * 1024 ** 3)).toBe('1.5 GB')
    expect(sizeText(12 * 1024 ** 2)).toBe('12 MB')
    expect(sizeText(512 * 1024)).toBe('0.5 MB')
  })
})
