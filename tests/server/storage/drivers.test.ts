/**
 * One suite, both storage drivers: local disk in a temporary folder, and S3 through @aws-sdk against
 * s3rver (the local fake S3 server) on an ephemeral loopback port with its folder in a temporary folder.
 * Byte ranges are inclusive at both ends, as HTTP counts them (RFC 9110 §14.1.2).
 */
import { randomBytes } from 'node:crypto'
import { existsSync } from 'node:fs'
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Readable } from 'node:stream'
import { text } from 'node:stream/consumers'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startFakeS3, type FakeS3 } from '../../../scripts/fake-s3'
import { diskStorage } from '../../../server/storage/disk'
import { s3Storage } from '../../../server/storage/s3'
import type { Storage } from '../../../server/storage'

// 20 MiB: more than two of the S3 driver's 8 MiB parts, so a put is a real multipart upload
const BIG = randomBytes(20 * 1024 * 1024)

const chunksOf = (bytes: Buffer, size = 1024 * 1024) => Readable.from((function* () {
  for (let at = 0; at < bytes.length; at += size) yield bytes.subarray(at, at + size)
})())

/** A body that sends `bytes` and then fails, as a request cut off mid-upload does. */
const failingAfter = (bytes: Buffer) =>
  Readable.from((async function* () {
    yield bytes
    await new Promise((resolve) => setTimeout(resolve, 20))
    throw new Error('the sender went away')
  })())

/** A body that sends `bytes` and then waits for ever, so only an abort can end the put. */
const stallingAfter = (bytes: Buffer) =>
  Readable.from((async function* () {
    yield bytes
    await new Promise(() => {})
  })())

async function bytesOf(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = []
  for await (const chunk of stream) chunks.push(chunk as Buffer)
  return Buffer.concat(chunks)
}

async function filesUnder(dir: string): Promise<string[]> {
  if (!existsSync(dir)) return []
  return (await readdir(dir, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name))
}

let root: string
let fake: FakeS3
const drivers: Record<'disk' | 's3', () => Storage> = {
  disk: () => diskStorage(join(root, 'disk')),
  s3: () => {
    const { S3_ENDPOINT, S3_BUCKET, S3_REGION, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY } = fake.env
    return s3Storage({ endpoint: S3_ENDPOINT, bucket: S3_BUCKET, region: S3_REGION, credentials: { accessKeyId: S3_ACCESS_KEY_ID, secretAccessKey: S3_SECRET_ACCESS_KEY } })
  },
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'gridcue-storage-test-'))
  fake = await startFakeS3({ dir: join(root, 's3rver') })
})
afterAll(async () => {
  await fake?.stop()
  await rm(root, { recursive: true, force: true })
})

describe.each(['disk', 's3'] as const)('the %s driver', (name) => {
  let storage: Storage
  beforeAll(() => {
    storage = drivers[name]()
  })

  it('should store a streamed body and give the same bytes back, whole and in ranges', async () => {
    const key = `recordings/1/${name}-whole.bin`
    expect(await storage.put(key, chunksOf(BIG), { contentType: 'application/octet-stream' })).toEqual({ sizeBytes: BIG.length })
    expect(storage.driver).toBe(name)
    expect(await storage.size(key)).toBe(BIG.length)
    expect((await bytesOf(await storage.get(key))).equals(BIG)).toBe(true)
    // the first bytes, a stretch across the first part boundary, and the last byte alone
    expect(await bytesOf(await storage.get(key, { start: 0, end: 499 }))).toEqual(BIG.subarray(0, 500))
    const boundary = 8 * 1024 * 1024
    expect(await bytesOf(await storage.get(key, { start: boundary - 10, end: boundary + 9 }))).toEqual(BIG.subarray(boundary - 10, boundary + 10))
    expect(await bytesOf(await storage.get(key, { start: BIG.length - 1, end: BIG.length - 1 }))).toEqual(BIG.subarray(BIG.length - 1))
  })

  it('should say an absent object has no size, and remove objects (absent ones too)', async () => {
    const key = `recordings/1/${name}-gone.txt`
    await storage.put(key, Readable.from([Buffer.from('a short one')]))
    expect(await storage.size(key)).toBe(11)
    await storage.remove(key)
    expect(await storage.size(key)).toBeNull()
    await expect(storage.remove(key)).resolves.toBeUndefined()
    expect(await storage.size(`recordings/1/${name}-never.txt`)).toBeNull()
  })

  it('should lend a local file with the bytes to a tool, and tidy up a temporary copy afterwards', async () => {
    const key = `recordings/2/${name}-local.txt`
    await storage.put(key, Readable.from([Buffer.from('bytes for a tool')]))
    let lent = ''
    const result = await storage.withLocalFile(key, async (path) => {
      lent = path
      return readFile(path, 'utf8')
    })
    expect(result).toBe('bytes for a tool')
    // the disk driver lends the stored file itself; the S3 driver a copy that is gone afterwards
    expect(existsSync(lent)).toBe(name === 'disk')
  })

  it('should leave nothing behind when the body fails mid-upload', async () => {
    const key = `recordings/3/${name}-failed.bin`
    await expect(storage.put(key, failingAfter(BIG.subarray(0, 9 * 1024 * 1024)))).rejects.toThrow('the sender went away')
    expect(await storage.size(key)).toBeNull()
    if (name === 'disk') expect((await filesUnder(join(root, 'disk', 'recordings', '3'))).length).toBe(0)
  })

  it('should leave nothing behind when the put is aborted', async () => {
    const key = `recordings/4/${name}-aborted.bin`
    const controller = new AbortController()
    const put = storage.put(key, stallingAfter(BIG.subarray(0, 3 * 1024 * 1024)), { signal: controller.signal })
    setTimeout(() => controller.abort(), 100)
    await expect(put).rejects.toThrow()
    expect(await storage.size(key)).toBeNull()
    if (name === 'disk') expect((await filesUnder(join(root, 'disk', 'recordings', '4'))).length).toBe(0)
  })

  it('should refuse a key that could leave its place in the store', async () => {
    await expect(storage.put('../outside.txt', Readable.from(['x']))).rejects.toThrow('not a storage key')
    await expect(storage.get('recordings/../../etc/passwd')).rejects.toThrow('not a storage key')
  })

  it('should stream a get without reading the object whole first', async () => {
    const key = `recordings/5/${name}-text.txt`
    await storage.put(key, Readable.from([Buffer.from('line one\nline two\n')]))
    expect(await text(await storage.get(key, { start: 9, end: 16 }))).toBe('line two')
  })
})
