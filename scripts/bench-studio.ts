/**
 * Studio benchmark (not a test): builds a ~150-step outline from one of our generated thermometer
 * puzzles, builds the client, serves it with a stand-in API on loopback, opens the Studio in
 * headless Chromium and measures
 *   - the time to show any step (random jumps: a step number typed, then Enter),
 *   - the time of a single step forward (→),
 *   - frames per second while → is held (key repeat at 30/s, and a key every frame).
 * Run with `npx tsx scripts/bench-studio.ts` (to be wired as `npm run bench:studio`).
 * Options: --dist <dir> reuses an existing build; --profile builds unminified and prints the functions
 * with the most self time while stepping; --screenshot <file.png> saves the Studio at step 40;
 * CHROMIUM_PATH overrides /usr/bin/chromium; BENCH_NO_FOLLOW=1 turns off "Follow the step" (to compare).
 */
import { createServer } from 'node:http'
import type { IncomingMessage, ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { extname, join, normalize } from 'node:path'
import { chromium } from 'playwright-core'
import { build } from 'vite'
import { parsePuzzle, solvePath } from '../shared/engine/index'
import { buildOutline, timeline } from '../shared/script/index'
import type { OutlineRecord } from '../shared/schemas/studio'
import { generateThermo } from '../tests/helpers/generate-thermo'

const SEED = 106
const GENERATOR_OPTIONS = { thermometers: 6, minLength: 4, maxLength: 8 }
const JUMPS = 120
const STEPS_FORWARD = 100
const HOLD_MS = 3000
const PROFILE = process.argv.includes('--profile')

const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]

function makeRecord(): OutlineRecord {
  const generated = generateThermo(SEED, GENERATOR_OPTIONS)
  const input = { title: generated.title, givens: generated.givens, thermometers: generated.thermometers }
  const { puzzle } = parsePuzzle(input)
  if (!puzzle) throw new Error(`seed ${SEED} did not give a puzzle`)
  const outline = buildOutline(puzzle, solvePath(input), { names: 'words', link: 'https://example.test/puzzle' })
  return {
    id: 1,
    puzzleId: 1,
    name: 'Benchmark take',
    status: outline.status,
    stepCount: outline.steps.length,
    totalMs: timeline(outline).totalMs,
    version: 1,
    updatedAt: new Date().toISOString(),
    outline,
  }
}

async function buildClient(): Promise<{ dir: string; cleanup: () => void }> {
  const at = process.argv.indexOf('--dist')
  if (at > 0 && process.argv[at + 1]) return { dir: process.argv[at + 1], cleanup: () => {} }
  // A private output folder, so a build already in dist/ (or one being made) is left alone.
  const dir = mkdtempSync(join(tmpdir(), 'gridcue-bench-'))
  await build({ logLevel: 'error', build: { outDir: dir, emptyOutDir: true, minify: !PROFILE } })
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) }
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript',
  '.css': 'text/css',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.svg': 'image/svg+xml',
  '.ico': 'image/x-icon',
}

function serve(dir: string, record: OutlineRecord) {
  let current = record
  const user = { id: 1, email: 'bench@example.test', name: 'Bench Presenter' }
  const json = (res: ServerResponse, status: number, body: unknown) => {
    res.writeHead(status, { 'Content-Type': 'application/json' })
    res.end(JSON.stringify(body))
  }
  const handler = async (req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? '/', 'http://localhost')
    if (url.pathname === '/api/auth/me') {
      return json(res, 200, { user, memberships: [{ channelId: 1, channelName: 'Bench', channelSlug: 'bench', role: 'presenter' }] })
    }
    if (url.pathname === '/api/channels/1/outlines/1') {
      if (req.method === 'GET') return json(res, 200, current)
      if (req.method === 'PATCH') {
        let body = ''
        for await (const chunk of req) body += chunk
        const sent = JSON.parse(body) as { version: number; outline: OutlineRecord['outline'] }
        current = { ...current, version: sent.version + 1, outline: sent.outline, updatedAt: new Date().toISOString() }
        return json(res, 200, current)
      }
    }
    if (url.pathname.startsWith('/api/')) return json(res, 404, { code: 'not-found', message: 'Not in the bench API.' })
    const file = normalize(join(dir, decodeURIComponent(url.pathname)))
    const inside = file.startsWith(dir) && existsFile(file)
    const path = inside ? file : join(dir, 'index.html')
    res.writeHead(200, { 'Content-Type': TYPES[extname(path)] ?? 'application/octet-stream' })
    res.end(readFileSync(path))
  }
  const server = createServer((req, res) => void handler(req, res))
  return new Promise<{ url: string; close: () => Promise<void> }>((resolve) => {
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo
      resolve({ url: `http://127.0.0.1:${port}`, close: () => new Promise((done) => server.close(() => done())) })
    })
  })
}

function existsFile(path: string): boolean {
  try {
    return statSync(path).isFile()
  } catch {
    return false
  }
}

interface CpuProfile {
  nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number } }[]
  samples: number[]
  timeDeltas: number[]
}

function printProfile(profile: CpuProfile): void {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]))
  const self = new Map<string, number>()
  profile.samples.forEach((id, i) => {
    const f = byId.get(id)?.callFrame
    if (!f) return
    const name = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber + 1}`
    self.set(name, (self.get(name) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000)
  })
  const total = [...self.values()].reduce((a, b) => a + b, 0)
  console.log(`Profile while stepping forward (self time, ${total.toFixed(0)} ms sampled):`)
  for (const [name, t] of [...self].sort((a, b) => b[1] - a[1]).slice(0, 20)) console.log(`  ${t.toFixed(1).padStart(8)} ms  ${name}`)
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2
}
const percentile = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]
}
const ms = (n: number) => `${n.toFixed(1)} ms`

async function main(): Promise<void> {
  const record = makeRecord()
  const steps = record.outline.steps.length
  console.log(`Outline: generated thermometer puzzle (seed ${SEED}), ${steps} steps, ${record.outline.lines.length} lines, ${record.outline.chapters.length} chapters`)

  const t0 = performance.now()
  const client = await buildClient()
  console.log(`Client build: ${((performance.now() - t0) / 1000).toFixed(1)} s`)
  const app = await serve(client.dir, record)
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: CHROMIUM_ARGS })
  try {
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } })
    const session = {
      token: 'bench-token',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 1, email: 'bench@example.test', name: 'Bench Presenter' },
    }
    // tsx compiles the page functions below with esbuild's name helper; give the page a no-op one.
    await context.addInitScript({ content: 'window.__name = (fn) => fn' })
    await context.addInitScript((value) => localStorage.setItem('gridcue.session', value), JSON.stringify(session))
    if (process.env.BENCH_NO_FOLLOW) await context.addInitScript({ content: `localStorage.setItem('gridcue.studio.prefs', '{"pane":"script","followStep":false,"showTradeTerms":true}')` })
    const page = await context.newPage()

    const loadStart = Date.now()
    await page.goto(`${app.url}/channels/1/outlines/1?step=0`)
    await page.waitForSelector('.step-head')
    await page.waitForSelector('article.line')
    const loadMs = Date.now() - loadStart
    const shotAt = process.argv.indexOf('--screenshot')
    if (shotAt > 0 && process.argv[shotAt + 1]) {
      await page.goto(`${app.url}/channels/1/outlines/1?step=40`)
      await page.waitForSelector('article.line')
      await page.waitForTimeout(800)
      await page.screenshot({ path: process.argv[shotAt + 1] })
    }
    // Let fonts and the first layout settle before timing anything.
    await page.evaluate(() => document.fonts.ready)
    await page.waitForTimeout(500)

    // Jumps to any step: digits then Enter (the Studio's own keyboard path), in a fixed pseudo-random order.
    const jump = await page.evaluate(
      async ({ count, n }) => {
        const key = (k: string) => window.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true }))
        const frame = () => new Promise<void>((r) => requestAnimationFrame(() => r()))
        const task = () => new Promise<void>((r) => setTimeout(r, 0))
        let seed = 12345
        const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31)
        const toFrame: number[] = []
        const work: number[] = []
        for (let i = 0; i < n; i++) {
          const target = 1 + Math.floor(rnd() * count)
          for (const d of String(target)) key(d)
          await frame()
          const t0 = performance.now()
          key('Enter')
          // DOM patched (Vue flushes in a microtask) and laid out: the main-thread cost of the step.
          await task()
          void document.body.offsetHeight
          work.push(performance.now() - t0)
          // …and until the next frame is due: what a person waits for.
          await frame()
          toFrame.push(performance.now() - t0)
          const shown = document.querySelector('.step-head__number')?.textContent ?? ''
          if (!shown.includes(`Step ${target} `)) throw new Error(`expected step ${target}, the header says "${shown}"`)
        }
        return { toFrame, work }
      },
      { count: steps, n: JUMPS },
    )

    const cdp = PROFILE ? await context.newCDPSession(page) : null
    if (cdp) {
      await cdp.send('Profiler.enable')
      await cdp.send('Profiler.setSamplingInterval', { interval: 100 })
      await cdp.send('Profiler.start')
    }
    const forward = await page.evaluate(async (n) => {
      const key = (k: string) => window.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true }))
      const frame = () => new Promise<void>((r) => requestAnimationFrame(() => r()))
      const task = () => new Promise<void>((r) => setTimeout(r, 0))
      key('Home')
      await frame()
      const work: number[] = []
      for (let i = 0; i < n; i++) {
        const t0 = performance.now()
        key('ArrowRight')
        await task()
        void document.body.offsetHeight
        work.push(performance.now() - t0)
        await frame()
      }
      return work
    }, STEPS_FORWARD)

    if (cdp) printProfile(((await cdp.send('Profiler.stop')) as { profile: CpuProfile }).profile)

    // Holding →: key repeat as an OS sends it (about 30 a second), then one key per frame as a worst case.
    const hold = async (mode: 'repeat' | 'every-frame') =>
      page.evaluate(
        async ({ mode, holdMs }) => {
          const key = (k: string, repeat = false) => window.dispatchEvent(new KeyboardEvent('keydown', { key: k, repeat, bubbles: true, cancelable: true }))
          key('Home')
          await new Promise<void>((r) => requestAnimationFrame(() => r()))
          const frames: number[] = []
          let stepsTaken = 0
          const start = performance.now()
          let last = start
          let lastKey = start
          await new Promise<void>((done) => {
            const tick = (now: number) => {
              frames.push(now - last)
              last = now
              if (mode === 'every-frame' || now - lastKey >= 33) {
                key('ArrowRight', true)
                lastKey = now
                stepsTaken++
              }
              if (now - start < holdMs) requestAnimationFrame(tick)
              else done()
            }
            requestAnimationFrame(tick)
          })
          const seconds = (performance.now() - start) / 1000
          return { fps: frames.length / seconds, frames: frames.slice(1), stepsTaken }
        },
        { mode, holdMs: HOLD_MS },
      )
    const repeat = await hold('repeat')
    const everyFrame = await hold('every-frame')

    console.log(`Studio load (navigation to script shown): ${loadMs} ms`)
    console.log(`Any step (${JUMPS} random jumps, typed number + Enter):`)
    console.log(`  main-thread work (patch + layout): median ${ms(median(jump.work))}, p95 ${ms(percentile(jump.work, 95))}`)
    console.log(`  until the next frame:              median ${ms(median(jump.toFrame))}, p95 ${ms(percentile(jump.toFrame, 95))}`)
    console.log(`One step forward (${STEPS_FORWARD} × →): median ${ms(median(forward))}, p95 ${ms(percentile(forward, 95))}`)
    for (const [name, r] of [['key repeat 30/s', repeat], ['a key every frame', everyFrame]] as const) {
      console.log(
        `Holding → (${name}, ${HOLD_MS / 1000} s, ${r.stepsTaken} steps): ${r.fps.toFixed(1)} fps, ` +
          `frame median ${ms(median(r.frames))}, p95 ${ms(percentile(r.frames, 95))}, longest ${ms(Math.max(...r.frames))}`,
      )
    }
  } finally {
    await browser.close()
    await app.close()
    client.cleanup()
  }
}

main().catch((error: unknown) => {
  console.error(error)
  process.exit(1)
})
