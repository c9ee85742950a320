/**
 * Recordings through the API, once per storage driver (local disk; S3 through s3rver, the local fake S3
 * server): uploads of real small media made here (a WAV written byte by byte, WebM and MP4 from ffmpeg),
 * refusals that keep nothing, range requests as RFC 9110 §14 defines them, the current mark, and access.
 */
import { existsSync } from 'node:fs'
import { mkdtemp, readdir, rm } from 'node:fs/promises'
import { request as httpRequest } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { startFakeS3, type FakeS3 } from '../../scripts/fake-s3'
import { MEDIA_LINK_TTL_SECONDS } from '../../server/auth/media-tokens'
import { issueToken } from '../../server/auth/tokens'
import { loadConfig } from '../../server/config'
import { createLogger } from '../../server/logger'
import { resumePlaybackPreparation } from '../../server/services/recordings'
import { createStorage } from '../../server/storage'
import { mediaLinkSchema, peaksSchema, recordingSchema, type Recording } from '../../shared/schemas/recording'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { useApiSuite, type ApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { ffmpegFile, wavFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

// small enough to send quickly, large enough that a cut-off upload has sent a whole 8 MiB part to S3 first
const LIMIT_BYTES = 12 * 1024 * 1024
const WAV = wavFile({ seconds: 1 })

let webm: Buffer
let recorderWebm: Buffer
let mp4Video: Buffer
let silentVideo: Buffer
let ac3Matroska: Buffer
beforeAll(() => {
  // AC-3 in Matroska: no browser engine plays either, so only a transcode makes it playable
  ac3Matroska = ffmpegFile('mkv', ['-c:a', 'ac3'])
  silentVideo = ffmpegFile('mp4', ['-map', '1:v', '-c:v', 'libx264', '-pix_fmt', 'yuv420p'], { video: true })
  webm = ffmpegFile('webm', ['-c:a', 'libopus'])
  recorderWebm = ffmpegFile('webm', ['-c:a', 'libopus'], { streamed: true })
  mp4Video = ffmpegFile('mp4', ['-c:v', 'libx264', '-pix_fmt', 'yuv420p', '-c:a', 'aac', '-shortest'], { video: true })
})

/** Where a driver keeps its objects, to check that a refused or broken upload left nothing. */
interface Store {
  env: Record<string, string>
  objects: () => Promise<string[]>
  stop: () => Promise<void>
}

async function diskStore(): Promise<Store> {
  const dir = await mkdtemp(join(tmpdir(), 'gridcue-recordings-test-'))
  return {
    env: { STORAGE: 'disk', STORAGE_DIR: dir },
    // every file, the temporary ones of unfinished uploads included
    objects: async () => (existsSync(dir) ? (await readdir(dir, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => e.name) : []),
    stop: () => rm(dir, { recursive: true, force: true }),
  }
}

async function s3Store(): Promise<Store> {
  const dir = await mkdtemp(join(tmpdir(), 'gridcue-recordings-s3-'))
  const fake: FakeS3 = await startFakeS3({ dir })
  const { S3_ENDPOINT, S3_BUCKET, S3_REGION, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY } = fake.env
  const client = new S3Client({ endpoint: S3_ENDPOINT, region: S3_REGION, forcePathStyle: true, credentials: { accessKeyId: S3_ACCESS_KEY_ID, secretAccessKey: S3_SECRET_ACCESS_KEY } })
  return {
    env: { STORAGE: 's3', ...fake.env },
    // objects only: s3rver keeps the parts of an abandoned multipart upload in its folder (it has no AbortMultipartUpload)
    objects: async () => ((await client.send(new ListObjectsV2Command({ Bucket: S3_BUCKET }))).Contents ?? []).map((o) => o.Key ?? ''),
    stop: async () => {
      client.destroy()
      await fake.stop()
      await rm(dir, { recursive: true, force: true })
    },
  }
}

describe.each([
  ['disk', diskStore],
  ['s3', s3Store],
] as const)('recordings stored on %s', (_driver, makeStore) => {
  let store: Store
  const saved: Record<string, string | undefined> = {}
  // the app reads its configuration when each test builds it: point it at this driver first
  beforeAll(async () => {
    store = await makeStore()
    for (const [name, value] of Object.entries({ ...store.env, UPLOAD_MAX_BYTES: String(LIMIT_BYTES) })) {
      saved[name] = process.env[name]
      process.env[name] = value
    }
  })
  afterAll(async () => {
    for (const [name, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[name]
      else process.env[name] = value
    }
    await store.stop()
  })

  let take: OutlineRecord
  const api = useApiSuite({
    prepare: async (suite) => {
      const puzzle = await suite.createPuzzle(draftOf('GT13'))
      take = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
    },
  })
  const base = (channelId = api.channelId) => `/api/channels/${channelId}/outlines/${take.id}/recordings`
  const upload = (content: Buffer, name: string, as: Parameters<ApiSuite['as']>[0] = 'editor') => api.as(as).post(base()).attach('file', content, name)

  async function uploaded(content: Buffer, name: string): Promise<Recording> {
    const res = await upload(content, name)
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    return res.body
  }

  // objects the earlier tests left (the data goes back before each test; the store does not)
  let objectsBefore: string[] = []
  beforeEach(async () => {
    objectsBefore = await store.objects()
  })

  async function rowCount(): Promise<number> {
    return Number((await api.db('recordings').count({ n: '*' }))[0]?.n)
  }

  /** Waits for the server to settle after a refusal or a cut connection: no new object and no row left. */
  async function expectNothingKept(): Promise<void> {
    await expect.poll(async () => ({ objects: await store.objects(), rows: await rowCount() }), { timeout: 5000 }).toEqual({ objects: objectsBefore, rows: 0 })
  }

  describe('POST …/recordings', () => {
    it('should store a WAV file, read its duration, make it the current recording and work out its waveform', async () => {
      const recording = await uploaded(WAV, 'first-take.wav')
      expect(recordingSchema.parse(recording)).toMatchObject({
        outlineId: take.id,
        name: 'first-take.wav',
        mime: 'audio/wav',
        kind: 'audio',
        sizeBytes: WAV.length,
        durationMs: 1000,
        current: true,
        uploadedBy: 'Priya Castellanos',
      })
      expect(await store.objects()).toHaveLength(objectsBefore.length + 1)
      // our own stored name: the channel and a UUID, never the uploaded name
      expect((await api.db('recordings').first('storage_key'))?.storage_key).toMatch(new RegExp(`^recordings/${api.channelId}/[0-9a-f-]{36}\\.wav$`))

      await expect.poll(async () => (await api.as('viewer').get(base())).status).toBe(404)
      await expect.poll(async () => (await api.as('presenter').get(`${base()}/${recording.id}/peaks`)).status, { timeout: 10_000 }).toBe(200)
      const peaks = peaksSchema.parse((await api.as('presenter').get(`${base()}/${recording.id}/peaks`)).body)
      expect(peaks.durationMs).toBe(1000)
      expect(peaks.peaks.length).toBe(peaks.perSecond)
      // a sine at half of full scale: every slice's loudest sample is close to 0.5
      expect(Math.max(...peaks.peaks)).toBeCloseTo(0.5, 1)
      expect((await api.as('presenter').get(base())).body[0]).toMatchObject({ id: recording.id, hasPeaks: true })
    })

    it('should take WebM audio and MP4 video made by ffmpeg, each with its duration and kind', async () => {
      const audio = await uploaded(webm, 'voice.webm')
      expect(audio).toMatchObject({ kind: 'audio', current: true })
      expect(audio.durationMs).toBeGreaterThanOrEqual(1950)
      expect(audio.durationMs).toBeLessThanOrEqual(2100)
      const video = await uploaded(mp4Video, 'camera.mp4')
      expect(video).toMatchObject({ kind: 'video', mime: 'video/mp4', current: false })
      expect(video.durationMs).toBeGreaterThanOrEqual(1950)
      expect(video.durationMs).toBeLessThanOrEqual(2100)
    })

    it("should store a browser-playable copy of a WebM written without its duration (as a browser's recorder writes it), and only that copy", async () => {
      const recording = await uploaded(recorderWebm, 'from-the-browser.webm')
      expect(recording.durationMs).toBeGreaterThanOrEqual(1950)
      expect(recording.durationMs).toBeLessThanOrEqual(2100)
      expect(recording.mime).toMatch(/^(audio|video)\/webm$/)
      const { storage_key } = (await api.db('recordings').where({ id: recording.id }).first('storage_key'))!
      expect(storage_key).toMatch(/-web\.webm$/)
      expect(await store.objects()).toHaveLength(objectsBefore.length + 1)
      const played = await api.as('editor').get(`${base()}/${recording.id}/media`).buffer(true)
      expect(played.status).toBe(200)
      expect(Number(played.headers['content-length'])).toBe(recording.sizeBytes)
    })

    it('should answer at once for a file only a transcode makes playable, as "preparing", then swap in the converted copy', async () => {
      const recording = await uploaded(ac3Matroska, 'desk-recorder.mkv')
      expect(recording.playback).toBe('preparing')
      await expect.poll(async () => ((await api.as('editor').get(base())).body as Recording[])[0]?.playback, { timeout: 20_000 }).toBe('ready')
      const [ready] = (await api.as('editor').get(base())).body as Recording[]
      expect(ready).toMatchObject({ id: recording.id, kind: 'audio', mime: 'audio/mp4' })
      expect(ready!.durationMs).toBeGreaterThanOrEqual(1950)
      expect(ready!.durationMs).toBeLessThanOrEqual(2100)
      const { storage_key } = (await api.db('recordings').where({ id: recording.id }).first('storage_key'))!
      expect(storage_key).toMatch(/-web\.m4a$/)
      // the uploaded file went once its copy was in place
      expect(await store.objects()).toHaveLength(objectsBefore.length + 1)
      const played = await api.as('editor').get(`${base()}/${recording.id}/media`).buffer(true)
      expect(played.status).toBe(200)
      expect(Number(played.headers['content-length'])).toBe(ready!.sizeBytes)
      await expect.poll(async () => ((await api.as('editor').get(base())).body as Recording[])[0]?.hasPeaks, { timeout: 10_000 }).toBe(true)
    })

    it('should say why a conversion failed, and answer the player 409 with that, when a stopped server left one to resume', async () => {
      const recording = await uploaded(WAV, 'lost.wav')
      // as a server stopped mid-conversion leaves it, with the uploaded file lost meanwhile
      await api.db('recordings').where({ id: recording.id }).update({ playback: 'preparing', storage_key: `recordings/${api.channelId}/gone.mkv` })
      await resumePlaybackPreparation({ db: api.db, storage: createStorage(loadConfig().storage), logger: createLogger('silent') })
      const [failed] = (await api.as('editor').get(base())).body as Recording[]
      expect(failed).toMatchObject({ id: recording.id, playback: 'failed' })
      expect(failed!.playbackNote).toMatch(/^Browsers can't play this file as it was uploaded, and converting it failed: /)
      const played = await api.as('editor').get(`${base()}/${recording.id}/media`)
      expect({ status: played.status, body: played.body }).toEqual({ status: 409, body: { code: 'playback-failed', message: failed!.playbackNote } })
    })

    it('should refuse a text file renamed to .wav with 415, by its content, keeping nothing', async () => {
      const res = await upload(Buffer.from('Line 1: the nine in box five can only go here.\n'.repeat(200)), 'notes.wav')
      expect(res.status).toBe(415)
      expect(res.body).toEqual({ code: 'unsupported-type', message: '"notes.wav" is not an audio or video file.' })
      await expectNothingKept()
    })

    it('should refuse a file over the size limit with 413 naming the limit, keeping nothing', async () => {
      const tooBig = Buffer.concat([WAV, Buffer.alloc(LIMIT_BYTES)])
      const res = await upload(tooBig, 'long-take.wav')
      expect(res.status).toBe(413)
      expect(res.body).toEqual({ code: 'too-large', message: 'The file is larger than the 12 MB limit for uploads. Nothing was kept.' })
      await expectNothingKept()
    })

    it('should keep nothing when the connection is cut in the middle of the file', async () => {
      const server = api.app.listen(0, '127.0.0.1')
      try {
        await new Promise((resolve) => server.once('listening', resolve))
        await cutOffUpload((server.address() as AddressInfo).port, `${base()}`, api.user('editor').id)
        await expectNothingKept()
      } finally {
        server.closeAllConnections()
        await new Promise((resolve) => server.close(resolve))
      }
    })

    it('should answer 400 when the form carries no file', async () => {
      const res = await api.as('editor').post(base()).field('note', 'nothing attached')
      expect(res.status).toBe(400)
      expect(res.body.message).toBe('Attach the recording as the form field "file".')
    })

    it('should not let a presenter upload (403) nor another channel see the take (404), keeping nothing', async () => {
      expect((await upload(WAV, 'x.wav', 'presenter')).status).toBe(403)
      const other = await api.ownersOtherChannel()
      const res = await api.as('owner').post(base(other)).attach('file', WAV, 'x.wav')
      expect(res.status).toBe(404)
      await expectNothingKept()
    })
  })

  describe('GET …/recordings/:recordingId/media', () => {
    it('should answer ranges as RFC 9110 §14 defines them: first bytes, a suffix, an open range, and 416 outside the file', async () => {
      const { id } = await uploaded(WAV, 'ranges.wav')
      const media = `${base()}/${id}/media`
      const size = WAV.length
      const get = (range?: string) => {
        const req = api.as('presenter').get(media).buffer(true)
        return range ? req.set('Range', range) : req
      }

      const whole = await get()
      expect(whole.status).toBe(200)
      expect(whole.headers).toMatchObject({ 'accept-ranges': 'bytes', 'content-type': 'audio/wav', 'content-length': String(size) })
      expect(whole.headers['cache-control']).toMatch(/^private/)
      expect(Buffer.compare(whole.body as Buffer, WAV)).toBe(0)

      const first = await get('bytes=0-99')
      expect(first.status).toBe(206)
      expect(first.headers['content-range']).toBe(`bytes 0-99/${size}`)
      expect(Buffer.compare(first.body as Buffer, WAV.subarray(0, 100))).toBe(0)

      // RFC 9110 §14.1.2: "bytes=-500" is the last 500 bytes
      const suffix = await get('bytes=-500')
      expect(suffix.status).toBe(206)
      expect(suffix.headers['content-range']).toBe(`bytes ${size - 500}-${size - 1}/${size}`)
      expect(Buffer.compare(suffix.body as Buffer, WAV.subarray(size - 500))).toBe(0)

      // RFC 9110 §14.1.2: "bytes=1000-" runs to the end
      const open = await get('bytes=1000-')
      expect(open.status).toBe(206)
      expect(open.headers['content-range']).toBe(`bytes 1000-${size - 1}/${size}`)
      expect(Buffer.compare(open.body as Buffer, WAV.subarray(1000))).toBe(0)

      // RFC 9110 §15.5.17: 416 with "Content-Range: bytes */<size>"
      const outside = await get(`bytes=${size}-`)
      expect(outside.status).toBe(416)
      expect(outside.headers['content-range']).toBe(`bytes */${size}`)

      // RFC 9110 §9.3.2: HEAD answers the headers GET would, without the content
      const head = await request(api.app).head(media).set('Authorization', `Bearer ${issueToken(api.user('presenter').id, testConfig().auth).token}`).set('Range', 'bytes=0-99')
      expect(head.status).toBe(206)
      expect(head.headers['content-range']).toBe(`bytes 0-99/${size}`)
      expect(head.headers['content-length']).toBe('100')
    })

    it('should serve a recording only to the studio team of its channel: a viewer and another channel get 404', async () => {
      const { id } = await uploaded(WAV, 'private.wav')
      expect((await api.as('viewer').get(`${base()}/${id}/media`)).status).toBe(404)
      expect((await api.as('non-member').get(`${base()}/${id}/media`)).status).toBe(404)
      const other = await api.ownersOtherChannel()
      expect((await api.as('owner').get(`${base(other)}/${id}/media`)).status).toBe(404)
      expect((await api.as('editor').get(`${base()}/${id}/media`)).status).toBe(200)
    })
  })

  describe('GET …/recordings/:recordingId/media-link and GET /api/media/:token', () => {
    const linkOf = async (id: number, as: Parameters<ApiSuite['as']>[0] = 'editor') => {
      const res = await api.as(as).get(`${base()}/${id}/media-link`)
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      return mediaLinkSchema.parse(res.body)
    }
    afterEach(() => vi.useRealTimers())

    it('should play the recording through the link without the session token, in ranges (RFC 9110 §14), for six hours', async () => {
      const { id } = await uploaded(WAV, 'linked.wav')
      const before = Date.now()
      const link = await linkOf(id)
      expect(link.url).toMatch(/^\/api\/media\/[\w-]+\.[\w-]+\.[\w-]+$/)
      expect(Date.parse(link.expiresAt) - before).toBeGreaterThanOrEqual(MEDIA_LINK_TTL_SECONDS * 1000 - 1000)
      expect(Date.parse(link.expiresAt) - before).toBeLessThanOrEqual(MEDIA_LINK_TTL_SECONDS * 1000 + 1000)

      const whole = await request(api.app).get(link.url).buffer(true)
      expect(whole.status).toBe(200)
      expect(Buffer.compare(whole.body as Buffer, WAV)).toBe(0)
      const part = await request(api.app).get(link.url).set('Range', 'bytes=44-143').buffer(true)
      expect(part.status).toBe(206)
      expect(part.headers['content-range']).toBe(`bytes 44-143/${WAV.length}`)
      expect(Buffer.compare(part.body as Buffer, WAV.subarray(44, 144))).toBe(0)
    })

    it('should never take a link token as a sign-in token, nor a sign-in token as a link', async () => {
      const { id } = await uploaded(WAV, 'two-keys.wav')
      const token = (await linkOf(id)).url.split('/').pop()!
      const asSession = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
      expect(asSession.status).toBe(401)
      expect(asSession.body.code).toBe('unauthenticated')

      const session = issueToken(api.user('editor').id, testConfig().auth).token
      const asLink = await request(api.app).get(`/api/media/${session}`)
      expect(asLink.status).toBe(404)
      expect(asLink.body).toEqual({ code: 'not-found', message: 'This playback link is not valid. Open the recording in Gridcue again for a new one.' })
      for (const made of ['made-up', 'not%20a%20token', `${session.slice(0, -2)}xx`]) expect((await request(api.app).get(`/api/media/${made}`)).status).toBe(404)
    })

    it('should refuse a link once it has expired, once its user signed out, and once they left the channel', async () => {
      const { id } = await uploaded(WAV, 'ending.wav')
      const { url } = await linkOf(id)
      // only the clock moves: the database and the network keep their real timers
      vi.useFakeTimers({ toFake: ['Date'], now: Date.now() + (MEDIA_LINK_TTL_SECONDS + 60) * 1000 })
      const expired = await request(api.app).get(url)
      expect(expired.status).toBe(401)
      expect(expired.body).toEqual({ code: 'media-link-expired', message: 'This playback link has expired. Open the recording in Gridcue again for a new one.' })
      vi.useRealTimers()
      expect((await request(api.app).get(url)).status).toBe(200)

      expect((await api.as('editor').post('/api/auth/sign-out')).status).toBe(204)
      const ended = await request(api.app).get(url)
      expect(ended.status).toBe(401)
      expect(ended.body.code).toBe('media-link-ended')

      const presenterUrl = (await linkOf(id, 'presenter')).url
      await api.db('memberships').where({ user_id: api.user('presenter').id, channel_id: api.channelId }).del()
      expect((await request(api.app).get(presenterUrl)).status).toBe(404)
    })

    it('should not hand a link to a viewer nor to another channel (404)', async () => {
      const { id } = await uploaded(WAV, 'private-link.wav')
      expect((await api.as('viewer').get(`${base()}/${id}/media-link`)).status).toBe(404)
      const other = await api.ownersOtherChannel()
      expect((await api.as('owner').get(`${base(other)}/${id}/media-link`)).status).toBe(404)
    })

    it("should answer 404 with a sentence, not 500, when the row's stored file is gone", async () => {
      const { id } = await uploaded(WAV, 'lost.wav')
      const { url } = await linkOf(id)
      await expect.poll(async () => (await api.as('editor').get(`${base()}/${id}/peaks`)).status, { timeout: 10_000 }).toBe(200)
      const { storage_key } = (await api.db('recordings').where({ id }).first('storage_key'))!
      await removeStored(storage_key)
      const missing = { code: 'file-missing', message: "The recording's file is missing from storage. Upload the recording again, or delete this entry." }
      for (const res of [await api.as('editor').get(`${base()}/${id}/media`), await api.as('editor').get(`${base()}/${id}/media`).set('Range', 'bytes=0-9'), await request(api.app).get(url)]) {
        expect({ status: res.status, body: res.body }).toEqual({ status: 404, body: missing })
      }
    })
  })

  /** Deletes a stored object behind the app's back, through the same driver the app uses. */
  const removeStored = (key: string): Promise<void> => createStorage(loadConfig().storage).remove(key)

  describe('a video without a sound track', () => {
    it('should get a flat waveform as long as the video, so the screen stops waiting for one', async () => {
      const recording = await uploaded(silentVideo, 'no-sound.mp4')
      expect(recording.kind).toBe('video')
      await expect.poll(async () => ((await api.as('editor').get(base())).body as Recording[])[0]?.hasPeaks, { timeout: 10_000 }).toBe(true)
      const peaks = peaksSchema.parse((await api.as('editor').get(`${base()}/${recording.id}/peaks`)).body)
      expect(peaks.durationMs).toBe(recording.durationMs)
      // ffmpeg's test source ran 2 s: 25 slices a second of silence
      expect(peaks.peaks).toHaveLength(Math.ceil((recording.durationMs! * peaks.perSecond) / 1000))
      expect(peaks.peaks.every((p) => p === 0)).toBe(true)
    })
  })

  describe('the current mark, renaming and deleting', () => {
    it('should keep one current recording per take, move it on request, and pass it to the newest left when the current one goes', async () => {
      const older = await uploaded(WAV, 'older.wav')
      const newer = await uploaded(wavFile({ seconds: 0.5 }), 'newer.wav')
      expect([older.current, newer.current]).toEqual([true, false])

      const moved = await api.as('editor').patch(`${base()}/${newer.id}`).send({ current: true })
      expect(moved.status).toBe(200)
      expect(moved.body).toMatchObject({ id: newer.id, current: true })
      const listed = (await api.as('presenter').get(base())).body as Recording[]
      expect(listed.map((r) => [r.name, r.current])).toEqual([
        ['newer.wav', true],
        ['older.wav', false],
      ])

      const renamed = await api.as('owner').patch(`${base()}/${older.id}`).send({ name: '  Studio take, Tuesday  ' })
      expect(renamed.body).toMatchObject({ name: 'Studio take, Tuesday', current: false })

      expect((await api.as('editor').delete(`${base()}/${newer.id}`)).status).toBe(204)
      const left = (await api.as('presenter').get(base())).body as Recording[]
      expect(left.map((r) => [r.id, r.current])).toEqual([[older.id, true]])
      // the file went with the row
      expect(await store.objects()).toHaveLength(objectsBefore.length + 1)
      expect((await api.as('editor').get(`${base()}/${newer.id}/media`)).status).toBe(404)
    })

    it('should refuse a second current recording in the database itself', async () => {
      const { id } = await uploaded(WAV, 'a.wav')
      await uploaded(WAV, 'b.wav')
      await expect(api.db('recordings').whereNot({ id }).update({ is_current: true })).rejects.toThrow(/recordings_one_current_per_outline/)
    })

    it("should answer 404 for the waveform while it isn't worked out yet", async () => {
      const { id } = await uploaded(WAV, 'pending.wav')
      await expect.poll(async () => (await api.as('editor').get(`${base()}/${id}/peaks`)).status, { timeout: 10_000 }).toBe(200)
      await api.db('recordings').where({ id }).update({ peaks: null })
      const res = await api.as('editor').get(`${base()}/${id}/peaks`)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe("This recording's waveform is still being worked out. Try again in a moment.")
    })
  })
})

/**
 * Sends the head of a multipart upload and about 10 MB of a WAV file, then destroys the socket, as a
 * browser tab closed mid-upload does. Resolves once the connection is gone.
 */
function cutOffUpload(port: number, path: string, userId: number): Promise<void> {
  const boundary = '----gridcue-test-boundary'
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut.wav"\r\nContent-Type: audio/wav\r\n\r\n`)
  const token = issueToken(userId, testConfig().auth).token
  return new Promise((resolve) => {
    const req = httpRequest({
      host: '127.0.0.1',
      port,
      path,
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(head.length + LIMIT_BYTES) },
    })
    req.on('error', () => resolve())
    req.on('close', () => resolve())
    req.write(Buffer.concat([head, wavFile({ seconds: 1 })]))
    // 10 MB in 1 MB pieces, then the cut: more than one 8 MiB part has reached the S3 driver
    let sent = 0
    const more = () => {
      if (sent >= 10) return setTimeout(() => req.destroy(), 300)
      sent++
      req.write(Buffer.alloc(1024 * 1024), () => more())
    }
    more()
  })
}
