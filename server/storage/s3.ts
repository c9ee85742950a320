import { createWriteStream } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import { Upload } from '@aws-sdk/lib-storage'
import { byteCounter } from './byte-counter'
import { assertKey, type Storage } from './storage'

interface S3Settings {
  /** another provider's or the local fake's address; absent for AWS itself */
  endpoint?: string
  bucket: string
  region: string
  /** absent: the SDK's own chain (environment, instance role) */
  credentials?: { accessKeyId: string; secretAccessKey: string }
}

// 8 MiB parts, two in flight: at most about 16 MiB of a recording in memory at any time, whatever its size
const PART_SIZE = 8 * 1024 * 1024
const PARTS_IN_FLIGHT = 2

/** Objects in an S3-compatible bucket, streamed in and out: a put is a multipart upload, a range a ranged GetObject. */
export function s3Storage({ endpoint, bucket, region, credentials }: S3Settings): Storage {
  const client = new S3Client({
    region,
    endpoint,
    // a self-hosted or fake store answers on one address, not on a host name per bucket
    forcePathStyle: endpoint !== undefined,
    credentials,
    // checksums only where S3 demands them: the parts are checked by their length, and compatible stores differ in the rest
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  const object = (key: string) => {
    assertKey(key)
    return { Bucket: bucket, Key: key }
  }

  async function remove(key: string): Promise<void> {
    // S3 answers a delete of an absent key with success
    await client.send(new DeleteObjectCommand(object(key)))
  }

  return {
    driver: 's3',
    async put(key, body, { contentType, signal } = {}) {
      const counter = byteCounter()
      const upload = new Upload({
        client,
        params: { ...object(key), Body: counter, ContentType: contentType },
        partSize: PART_SIZE,
        queueSize: PARTS_IN_FLIGHT,
        leavePartsOnError: false,
      })
      const abort = () => void upload.abort()
      signal?.addEventListener('abort', abort, { once: true })
      try {
        // the body fails the counter, and so the upload, when it errors or the signal aborts it
        await Promise.all([pipeline(body, counter, { signal }), upload.done()])
      } catch (error) {
        // a failed upload stops reading: let the body go rather than hold it half read
        counter.destroy()
        // a body smaller than one part went up as a single PutObject that may have completed: remove it too
        await remove(key).catch(() => {})
        throw error
      } finally {
        signal?.removeEventListener('abort', abort)
      }
      return { sizeBytes: counter.bytes }
    },
    async get(key, range) {
      const { Body } = await client.send(new GetObjectCommand({ ...object(key), Range: range && `bytes=${range.start}-${range.end}` }))
      return Body as Readable
    },
    async size(key) {
      try {
        return (await client.send(new HeadObjectCommand(object(key)))).ContentLength ?? 0
      } catch (error) {
        if (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404) return null
        throw error
      }
    },
    remove,
    async withLocalFile(key, use) {
      const dir = await mkdtemp(join(tmpdir(), 'gridcue-object-'))
      try {
        const path = join(dir, key.split('/').pop() ?? 'object')
        const { Body } = await client.send(new GetObjectCommand(object(key)))
        await pipeline(Body as Readable, createWriteStream(path))
        return await use(path)
      } finally {
        await rm(dir, { recursive: true, force: true })
      }
    },
  }
}
