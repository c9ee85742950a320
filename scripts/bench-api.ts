/**
 * API load benchmark (not a test): autocannon against the built server in its own process and a
 * real PostgreSQL on loopback. Reads a 150-step outline (in full, and revalidating the copy a browser
 * holds with If-None-Match), the puzzle list, saves a script line with fresh versions, and reads again
 * while cue-sheet PDFs are being made. Needs DATABASE_URL (an empty database is migrated and seeded);
 * `npm run bench:api` provides one.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { cpus } from 'node:os'
import autocannon from 'autocannon'
import { scriptOf } from '../shared/schemas/outline'
import type { OutlineRecord, OutlineSummary, PuzzleRecord } from '../shared/schemas/studio'
import { generateThermo } from '../tests/helpers/generate-thermo'
import { api, signIn } from './lib/bench-client'

const ROOT = new URL('..', import.meta.url)
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const CONNECTIONS = 20
const SAVE_CONNECTIONS = 10
// generateThermo(5007): a fresh thermometer puzzle whose path has about 150 steps
const LONG_PUZZLE_SEED = 5007

// markers in the save body where each request's version and take number go
const VERSION = 987654321
const TAKE = 'TAKE-MARKER'

interface Figures {
  name: string
  requestsPerSecond: number
  p50: number
  p99: number
  /** answers with another status than the run expects (200, or 304 when revalidating) */
  unexpected: number
  errors: number
}

const server = await startServer()
try {
  const base = server.url
  const token = await signIn(base, 'presenter@gridcue.example', 'gridcue-demo')
  const auth = { authorization: `Bearer ${token}`, 'content-type': 'application/json' }
  const channelId = ((await api(base, 'GET', '/api/channels', token)) as { id: number }[])[0].id
  const puzzle = (await api(base, 'POST', `/api/channels/${channelId}/puzzles`, token, longPuzzle())) as PuzzleRecord
  const outlines: OutlineRecord[] = []
  for (let i = 0; i < SAVE_CONNECTIONS + 1; i++) {
    outlines.push((await api(base, 'POST', `/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`, token, { name: `Bench take ${i + 1}` })) as OutlineRecord)
  }
  const readPath = `/api/channels/${channelId}/outlines/${outlines[0].id}`
  console.log(`Gridcue API benchmark — ${new Date().toISOString().slice(0, 10)}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}`)
  console.log(`outline under test: ${outlines[0].stepCount} steps, ${Math.round(JSON.stringify(outlines[0]).length / 1024)} KB of JSON; ${SECONDS} s per run\n`)

  // what a browser holds after its first read, and sends back when it asks again
  const etag = (await fetch(base + readPath, { headers: auth })).headers.get('etag')
  if (!etag) throw new Error(`GET ${readPath} sent no ETag`)

  const results: Figures[] = []
  results.push(await run('outline read, revalidated (If-None-Match → 304)', { url: base + readPath, headers: { ...auth, 'if-none-match': etag }, connections: CONNECTIONS }, 304))
  results.push(await run('outline read, in full', { url: base + readPath, headers: auth, connections: CONNECTIONS }))
  results.push(await run('puzzle list', { url: `${base}/api/channels/${channelId}/puzzles`, headers: auth, connections: CONNECTIONS }))
  results.push(await saves(base, channelId, outlines.slice(1), auth))
  const pdfs = pdfLoop(base, `/api/channels/${channelId}/outlines/${outlines[0].id}/cue-sheet.pdf?thumbnails=1`, token)
  results.push(await run('outline read, revalidated, while PDFs are made', { url: base + readPath, headers: { ...auth, 'if-none-match': etag }, connections: CONNECTIONS }, 304))
  results.push(await run('outline read in full while PDFs are made', { url: base + readPath, headers: auth, connections: CONNECTIONS }))
  const pdfStats = await pdfs.stop()

  console.log('| load | requests/s | p50 ms | p99 ms | unexpected status | errors |')
  console.log('| --- | ---: | ---: | ---: | ---: | ---: |')
  for (const r of results) console.log(`| ${r.name} | ${r.requestsPerSecond.toFixed(0)} | ${r.p50} | ${r.p99} | ${r.unexpected} | ${r.errors} |`)
  console.log(`\ncue-sheet PDFs made during the last two runs: ${pdfStats.count}, median ${pdfStats.median.toFixed(0)} ms each, ${pdfStats.failures} failed`)
} finally {
  server.process.kill('SIGTERM')
}

async function run(name: string, options: autocannon.Options, expectedStatus = 200): Promise<Figures> {
  const result = await autocannon({ duration: SECONDS, ...options })
  return {
    name,
    requestsPerSecond: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    unexpected: unexpectedAnswers(result, expectedStatus),
    errors: result.errors,
  }
}

function unexpectedAnswers(result: autocannon.Result, expectedStatus: number): number {
  const counts = Object.entries(result.statusCodeStats ?? {}) as [string, { count: number }][]
  return counts.reduce((sum, [status, { count }]) => (Number(status) === expectedStatus ? sum : sum + count), 0)
}

/**
 * Saves a line over and over, each connection on its own outline with the version the last answer carried, so
 * no save is stale. autocannon resets per-connection context after each request, so every connection is its
 * own run with its state in a closure; the runs go side by side and their figures are combined.
 */
async function saves(base: string, channelId: number, outlines: OutlineRecord[], headers: Record<string, string>): Promise<Figures> {
  const runs = await Promise.all(
    outlines.map((first) => {
      let version = first.version
      let count = 0
      // the body is made once with markers, so the benchmark's own process (on the same two cores) spends
      // its time sending requests, not serialising a 40 KB script for each of them
      const lines = first.outline.lines.map((line, i) => (i === 1 ? { ...line, text: `${line.text} (take ${TAKE})`, edited: true } : line))
      const [head, middle, tail] = JSON.stringify({ version: VERSION, script: scriptOf({ ...first.outline, lines }) }).split(new RegExp(`${VERSION}|${TAKE}`))
      return autocannon({
        url: base,
        duration: SECONDS,
        connections: 1,
        headers,
        requests: [
          {
            method: 'PATCH',
            setupRequest: (request) => {
              count++
              return { ...request, path: `/api/channels/${channelId}/outlines/${first.id}`, body: `${head}${version}${middle}${count}${tail}` }
            },
            onResponse: (status, body) => {
              if (status === 200) version = (JSON.parse(body) as OutlineSummary).version
            },
          },
        ],
      })
    }),
  )
  const p50s = runs.map((r) => r.latency.p50).sort((a, b) => a - b)
  return {
    name: `line save (fresh versions; ${runs.length} connections, p99 the worst of them)`,
    requestsPerSecond: runs.reduce((sum, r) => sum + r.requests.average, 0),
    p50: p50s[p50s.length >> 1],
    p99: Math.max(...runs.map((r) => r.latency.p99)),
    unexpected: runs.reduce((sum, r) => sum + unexpectedAnswers(r, 200), 0),
    errors: runs.reduce((sum, r) => sum + r.errors, 0),
  }
}

/** Requests cue sheets one after another until stopped. */
function pdfLoop(base: string, path: string, token: string) {
  let running = true
  const times: number[] = []
  let failures = 0
  const loop = (async () => {
    while (running) {
      const t0 = performance.now()
      const response = await fetch(base + path, { headers: { authorization: `Bearer ${token}` } })
      await response.arrayBuffer()
      if (response.ok) times.push(performance.now() - t0)
      else failures++
    }
  })()
  return {
    async stop() {
      running = false
      await loop
      const sorted = [...times].sort((a, b) => a - b)
      return { count: times.length, median: sorted[sorted.length >> 1] ?? 0, failures }
    },
  }
}

function longPuzzle() {
  const g = generateThermo(LONG_PUZZLE_SEED)
  return { title: 'Bench: long path', author: 'Gridcue benchmark', givens: g.givens, thermometers: g.thermometers }
}

/** Migrates and seeds, then starts the server as `npm start` does (production mode, own process). */
async function startServer(): Promise<{ url: string; process: ChildProcess }> {
  await new Promise<void>((resolve, reject) => {
    const migrate = spawn(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts', '--seed'], { cwd: ROOT, stdio: 'inherit' })
    migrate.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`migrations failed (${code})`))))
  })
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production', PORT: '0', LOG_LEVEL: 'silent', SIGN_IN_ATTEMPTS_PER_15_MIN: '1000' },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  const url = await new Promise<string>((resolve, reject) => {
    let out = ''
    child.stdout?.on('data', (chunk: Buffer) => {
      out += chunk.toString()
      const match = /running at (http:\/\/[^/\s]+)/.exec(out)
      if (match) resolve(match[1])
    })
    child.on('exit', (code) => reject(new Error(`the server ended before listening (${code}): ${out}`)))
  })
  return { url, process: child }
}
