/**
 * Upload benchmark (not a test): one 1 GB recording streamed to the server in its own process, against
 * real PostgreSQL, once per storage driver (local disk; S3 through the fake S3 server in a process of its
 * own, and a ceiling row: the S3 driver alone putting the same bytes into that server). The body is generated as it is sent (a WAV header, then silence) with http.request + pipeline, so
 * the client holds none of it. Prints MB/s from the first byte sent to the 201, and how much the server's
 * resident memory grew meanwhile (sampled every 50 ms from /proc, after a 20 MiB warm-up upload). Targets: ≥ 100 MB/s, ≤ 100 MB growth.
 * Needs DATABASE_URL (an empty database is migrated and seeded); `npm run bench:upload` provides one.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtemp, readFile, rm } from 'node:fs/promises'
import { createWriteStream } from 'node:fs'
import { createServer, request } from 'node:http'
import type { AddressInfo } from 'node:net'
import { cpus, tmpdir } from 'node:os'
import { join } from 'node:path'
import { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import type { OutlineRecord, PuzzleRecord } from '../shared/schemas/studio'
import { draftOf } from '../tests/helpers/studio'
import { s3Storage } from '../server/storage/s3'
import { api, signIn } from './lib/bench-client'

const ROOT = new URL('..', import.meta.url)
const BODY_BYTES = Number(process.env.BENCH_UPLOAD_BYTES ?? 1024 ** 3)
const CHUNK = 1024 * 1024
// two and a half of the S3 driver's 8 MiB parts
const WARM_UP_BYTES = 20 * 1024 * 1024
const FAKE_S3_PORT = 5451
const MB = 1024 * 1024

interface Figures {
  driver: string
  seconds: number
  mbPerSecond: number
  rssBeforeMb: number
  rssGrowthMb: number
}

const scratch = await mkdtemp(join(tmpdir(), 'gridcue-bench-upload-'))
const results: Figures[] = []
try {
  await migrate()
  console.log(`Gridcue upload benchmark — ${new Date().toISOString().slice(0, 10)}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}`)
  console.log(`body: ${(BODY_BYTES / MB).toFixed(0)} MiB (a WAV file), one upload per driver\n`)
  // what this machine does at best right now: the same body piped to a file by a bare HTTP server, no app at all
  results.push(await baseline())
  results.push(await benchDriver('disk', { STORAGE: 'disk', STORAGE_DIR: join(scratch, 'disk') }))
  const fake = await startProcess(['scripts/fake-s3.ts', join(scratch, 's3rver'), String(FAKE_S3_PORT), 'bench-recordings'], {}, /fake S3 \(s3rver\) at/)
  try {
    // what the fake S3 server takes at best, with no app in front: the S3 driver's own put from this process
    results.push(await fakeS3Ceiling())
    results.push(
      await benchDriver('s3 (fake S3 server, own process)', {
        STORAGE: 's3',
        S3_ENDPOINT: `http://127.0.0.1:${FAKE_S3_PORT}`,
        S3_BUCKET: 'bench-recordings',
        S3_ACCESS_KEY_ID: 'S3RVER',
        S3_SECRET_ACCESS_KEY: 'S3RVER',
      }),
    )
  } finally {
    fake.process.kill('SIGTERM')
  }
  console.log('| driver | seconds | MB/s | server RSS before, MB | server RSS growth, MB |')
  console.log('| --- | ---: | ---: | ---: | ---: |')
  for (const r of results) console.log(`| ${r.driver} | ${r.seconds.toFixed(1)} | ${r.mbPerSecond.toFixed(0)} | ${r.rssBeforeMb.toFixed(0)} | ${r.rssGrowthMb.toFixed(0)} |`)
} finally {
  await rm(scratch, { recursive: true, force: true })
}

async function benchDriver(driver: string, env: Record<string, string>): Promise<Figures> {
  const server = await startProcess(['server/index.ts'], { ...env, NODE_ENV: 'production', PORT: '0', LOG_LEVEL: 'silent', SIGN_IN_ATTEMPTS_PER_15_MIN: '1000' }, /running at (http:\/\/[^/\s]+)/)
  try {
    const base = server.match[1]!
    const token = await signIn(base, 'owner@gridcue.example', 'gridcue-demo')
    const channelId = ((await api(base, 'GET', '/api/channels', token)) as { id: number }[])[0]!.id
    const puzzle = (await api(base, 'POST', `/api/channels/${channelId}/puzzles`, token, draftOf('GT13', { title: `Bench upload (${driver})` }))) as PuzzleRecord
    const outline = (await api(base, 'POST', `/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`, token, { name: 'Bench take' })) as OutlineRecord
    const path = `/api/channels/${channelId}/outlines/${outline.id}/recordings`
    // a first, small upload loads the code the path uses on first call (multipart parsing, sniffing, the
    // S3 client's handlers): that is start-up, not growth with the size of a file
    const warmUp = await upload(base + path, token, WARM_UP_BYTES)
    if (warmUp.status !== 201) throw new Error(`the warm-up upload answered ${warmUp.status}: ${warmUp.body.slice(0, 300)}`)
    await api(base, 'DELETE', `${path}/${(JSON.parse(warmUp.body) as { id: number }).id}`, token)

    const rssBefore = await rssOf(server.process)
    let rssPeak = rssBefore
    const sampler = setInterval(() => void rssOf(server.process).then((rss) => (rssPeak = Math.max(rssPeak, rss)), () => {}), 50)
    const started = performance.now()
    const answer = await upload(base + path, token, BODY_BYTES)
    const seconds = (performance.now() - started) / 1000
    clearInterval(sampler)
    if (answer.status !== 201) throw new Error(`the upload answered ${answer.status}: ${answer.body.slice(0, 300)}`)
    // the file goes again, so the disk holds one benchmark body at a time
    await api(base, 'DELETE', `${path}/${(JSON.parse(answer.body) as { id: number }).id}`, token)
    return { driver, seconds, mbPerSecond: BODY_BYTES / MB / seconds, rssBeforeMb: rssBefore / MB, rssGrowthMb: (rssPeak - rssBefore) / MB }
  } finally {
    server.process.kill('SIGTERM')
  }
}

/** The body piped straight into a file by a bare HTTP server in this process: the loopback and disk ceiling. */
async function baseline(): Promise<Figures> {
  const server = createServer((req, res) => void pipeline(req, createWriteStream(join(scratch, 'baseline'))).then(() => res.end('{}')))
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  try {
    const rssBefore = process.memoryUsage.rss()
    const started = performance.now()
    await upload(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`, '', BODY_BYTES)
    const seconds = (performance.now() - started) / 1000
    return { driver: 'baseline: bare server, body to a file', seconds, mbPerSecond: BODY_BYTES / MB / seconds, rssBeforeMb: rssBefore / MB, rssGrowthMb: (process.memoryUsage.rss() - rssBefore) / MB }
  } finally {
    server.close()
    await rm(join(scratch, 'baseline'), { force: true })
  }
}

/** The same number of bytes put straight into the fake S3 server by the S3 driver, in this process: the ceiling the app's S3 uploads meet. */
async function fakeS3Ceiling(): Promise<Figures> {
  const storage = s3Storage({ endpoint: `http://127.0.0.1:${FAKE_S3_PORT}`, bucket: 'bench-recordings', region: 'us-east-1', credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } })
  const chunk = Buffer.alloc(CHUNK)
  const body = Readable.from(
    (function* () {
      for (let sent = 0; sent < BODY_BYTES; sent += CHUNK) yield sent + CHUNK <= BODY_BYTES ? chunk : chunk.subarray(0, BODY_BYTES - sent)
    })(),
  )
  const rssBefore = process.memoryUsage.rss()
  const started = performance.now()
  await storage.put('ceiling/body.bin', body)
  const seconds = (performance.now() - started) / 1000
  const rssGrowth = process.memoryUsage.rss() - rssBefore
  await storage.remove('ceiling/body.bin')
  return { driver: 'ceiling: the S3 driver alone into the fake S3 server, no app', seconds, mbPerSecond: BODY_BYTES / MB / seconds, rssBeforeMb: rssBefore / MB, rssGrowthMb: rssGrowth / MB }
}

/** Streams a multipart body: the form head, a WAV header claiming the whole body, silence, the closing boundary. */
function upload(url: string, token: string, bodyBytes: number): Promise<{ status: number; body: string }> {
  const boundary = '----gridcue-bench'
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="long-take.wav"\r\nContent-Type: audio/wav\r\n\r\n`)
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`)
  const pcmBytes = bodyBytes - 44
  const body = Readable.from(
    (function* () {
      yield head
      yield wavHeader(pcmBytes)
      const silence = Buffer.alloc(CHUNK)
      for (let sent = 0; sent < pcmBytes; sent += CHUNK) yield sent + CHUNK <= pcmBytes ? silence : silence.subarray(0, pcmBytes - sent)
      yield tail
    })(),
  )
  return new Promise((resolve, reject) => {
    const req = request(url, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${token}`,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(head.length + bodyBytes + tail.length),
      },
    })
    req.on('response', (res) => {
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (chunk: string) => (text += chunk))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text }))
    })
    req.on('error', reject)
    pipeline(body, req).catch(reject)
  })
}

/** 48 kHz stereo 16-bit PCM, as a camera records it. */
function wavHeader(pcmBytes: number): Buffer {
  const header = Buffer.alloc(44)
  header.write('RIFF', 0, 'ascii')
  header.writeUInt32LE(36 + pcmBytes, 4)
  header.write('WAVEfmt ', 8, 'ascii')
  header.writeUInt32LE(16, 16)
  header.writeUInt16LE(1, 20)
  header.writeUInt16LE(2, 22)
  header.writeUInt32LE(48000, 24)
  header.writeUInt32LE(48000 * 4, 28)
  header.writeUInt16LE(4, 32)
  header.writeUInt16LE(16, 34)
  header.write('data', 36, 'ascii')
  header.writeUInt32LE(pcmBytes, 40)
  return header
}

async function rssOf(child: ChildProcess): Promise<number> {
  const status = await readFile(`/proc/${child.pid}/status`, 'utf8')
  return Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? 0) * 1024
}

function migrate(): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts', '--seed'], { cwd: ROOT, stdio: 'inherit' })
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`migrations failed (${code})`))))
  })
}

/** A TypeScript script in a process of its own, resolved once its output matches `ready`. */
async function startProcess(args: string[], env: Record<string, string>, ready: RegExp): Promise<{ process: ChildProcess; match: RegExpExecArray }> {
  const child = spawn(process.execPath, ['--import', 'tsx', ...args], { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'inherit'] })
  const match = await new Promise<RegExpExecArray>((resolve, reject) => {
    let out = ''
    child.stdout?.on('data', (chunk: Buffer) => {
      out += chunk.toString()
      const found = ready.exec(out)
      if (found) resolve(found)
    })
    child.on('exit', (code) => reject(new Error(`${args[0]} ended before it was ready (${code}): ${out}`)))
  })
  return { process: child, match }
}
