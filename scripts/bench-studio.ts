/**
 * Studio benchmark (not a test): builds a ~150-step outline from one of our generated thermometer
 * puzzles, builds the client, serves it with a stand-in API on loopback, opens the Studio in
 * headless Chromium and measures what the Studio promises a presenter:
 *   - the JavaScript a first visit to a Studio address downloads (every .js file fetched, gzipped),
 *   - the time from a step change to the frame that shows it, for jumps to random steps (a typed step
 *     number, then Enter) and for single steps (→). The key is sent at the start of a frame, where
 *     Chromium delivers input; a task queued then runs once that frame's style, layout and paint are
 *     done, so "to the frame" = the change's script + the frame's rendering, without the idle wait for
 *     the next vsync. The frame after it is timed too (work deferred to it, like scrolling the script),
 *   - frames per second while → is held (key repeat at 30/s, and a key every frame), with the slowest
 *     half-second window, since holding → should never fall below 50 fps.
 * Run with `npx tsx scripts/bench-studio.ts` (`npm run bench:studio`).
 * Options: --dist <dir> reuses an existing build; --profile builds unminified and prints the functions
 * with the most self time while stepping; --trace prints the main thread's time per step by kind of
 * work (script, style, layout, paint…) from a Chromium trace; --screenshot <file.png> saves the Studio
 * at step 40; --shots <dir> saves it at 1440×900, 1280×720, 1024×768 and 390×844; --serve only serves the
 * build and the stand-in API (printing the address) until Ctrl+C;
 * CHROMIUM_PATH overrides /usr/bin/chromium; BENCH_NO_FOLLOW=1 turns off "Follow the step" (to compare);
 * BENCH_JUMPS / BENCH_STEPS change how many jumps and single steps are timed (120 / 100); with --trace,
 * BENCH_TRACE_FILE=<file.json> also records what the browser invalidated (style, layout) and saves the events.
 * On a busy machine the wall times wander; the trace's thread CPU times are the steadier figure.
 */
import { createServer } from 'node:http'
import type { IncomingMessage, ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import { mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { extname, join, normalize } from 'node:path'
import { gzipSync } from 'node:zlib'
import { launchChromium } from './lib/chromium'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { build } from 'vite'
import { parsePuzzle, solvePath } from '../shared/engine/index'
import { buildOutline, timeline } from '../shared/script/index'
import type { OutlineRecord } from '../shared/schemas/studio'
import { generateThermo } from '../tests/helpers/generate-thermo'

const SEED = 106
const GENERATOR_OPTIONS = { thermometers: 6, minLength: 4, maxLength: 8 }
const JUMPS = Number(process.env.BENCH_JUMPS ?? 120)
const STEPS_FORWARD = Number(process.env.BENCH_STEPS ?? 100)
const HOLD_MS = 3000
const PROFILE = process.argv.includes('--profile')
const TRACE = process.argv.includes('--trace')


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
    puzzleVersion: 1,
    savedBy: null,
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
  nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }[]
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
  // Who calls the busiest script functions (their callers, two levels up, by the callee's self time).
  const parent = new Map<number, number>()
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id)
  const label = (id: number | undefined) => {
    const f = id === undefined ? undefined : byId.get(id)?.callFrame
    return f ? `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber + 1}` : '(root)'
  }
  const scripts = [...self].filter(([name]) => /\.js:/.test(name)).sort((a, b) => b[1] - a[1]).slice(0, 3)
  for (const [name] of scripts) {
    const callers = new Map<string, number>()
    profile.samples.forEach((id, i) => {
      if (label(id) !== name) return
      const up = parent.get(id)
      const key = `${label(up)} ← ${label(up === undefined ? undefined : parent.get(up))}`
      callers.set(key, (callers.get(key) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000)
    })
    console.log(`  callers of ${name}:`)
    for (const [key, t] of [...callers].sort((a, b) => b[1] - a[1]).slice(0, 5)) console.log(`    ${t.toFixed(1).padStart(8)} ms  ${key}`)
  }
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

const SESSION = {
  token: 'bench-token',
  expiresAt: new Date(Date.now() + 3600_000).toISOString(),
  user: { id: 1, email: 'bench@example.test', name: 'Bench Presenter' },
}

async function newContext(browser: Browser, viewport = { width: 1440, height: 900 }): Promise<BrowserContext> {
  const context = await browser.newContext({ viewport })
  // tsx compiles the page functions below with esbuild's name helper; give the page a no-op one.
  await context.addInitScript({ content: 'window.__name = (fn) => fn' })
  await context.addInitScript((value) => localStorage.setItem('gridcue.session', value), JSON.stringify(SESSION))
  if (process.env.BENCH_NO_FOLLOW) await context.addInitScript({ content: `localStorage.setItem('gridcue.studio.prefs', '{"pane":"script","followStep":false,"showTradeTerms":true}')` })
  return context
}

/** Every .js file a first visit to a Studio address fetches (fresh context: nothing cached), gzipped. */
async function firstLoadJs(browser: Browser, url: string) {
  const context = await newContext(browser)
  const page = await context.newPage()
  const files: { name: string; raw: number; gzip: number }[] = []
  const pending: Promise<void>[] = []
  page.on('response', (response) => {
    const name = new URL(response.url()).pathname
    if (!name.endsWith('.js')) return
    pending.push(
      response.body().then((body) => {
        files.push({ name: name.split('/').pop() ?? name, raw: body.length, gzip: gzipSync(body, { level: 9 }).length })
      }),
    )
  })
  const start = Date.now()
  await page.goto(url)
  await page.waitForSelector('article.line')
  const shownMs = Date.now() - start
  await page.waitForLoadState('networkidle')
  await Promise.all(pending)
  await context.close()
  files.sort((a, b) => b.gzip - a.gzip)
  return { files, shownMs, raw: files.reduce((n, f) => n + f.raw, 0), gzip: files.reduce((n, f) => n + f.gzip, 0) }
}

interface Timed {
  /** key handler and Vue's patch (microtasks included) */
  script: number
  /** … and the rendering of that frame (style, layout, paint): the change is on screen at the next vsync */
  frame: number
  /** main-thread time of the frame after (work deferred to it: scrolling the script, a retry) */
  next: number
}

/** Step changes, each sent at the start of a frame and timed until that frame is rendered. */
async function timeChanges(page: Page, plan: { kind: 'jump' | 'forward'; count: number; n: number }): Promise<Timed[]> {
  return page.evaluate(async ({ kind, count, n }) => {
    const key = (k: string) => window.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true }))
    const frame = () => new Promise<void>((r) => requestAnimationFrame(() => r()))
    const settle = () => new Promise<void>((r) => setTimeout(r, 30))
    const measure = (act: () => void) =>
      new Promise<Timed>((resolve) => {
        requestAnimationFrame(() => {
          // Registered first, so it opens the next frame's callbacks (before any work deferred to that frame).
          let t2 = 0
          let done: Omit<Timed, 'next'> | null = null
          requestAnimationFrame(() => {
            const t3 = performance.now()
            setTimeout(() => resolve({ ...done!, next: performance.now() - t3 }))
          })
          const t0 = performance.now()
          let t1 = 0
          act()
          // Queued after Vue's flush (which the key handler scheduled), so it runs once the DOM is patched.
          void Promise.resolve().then(() => (t1 = performance.now()))
          setTimeout(() => {
            t2 = performance.now()
            done = { script: t1 - t0, frame: t2 - t0 }
          })
        })
      })
    let seed = 12345
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31
    const out: Timed[] = []
    if (kind === 'forward') {
      key('Home')
      await frame()
      await settle()
    }
    for (let i = 0; i < n; i++) {
      let target: number
      if (kind === 'jump') {
        target = 1 + Math.floor(rnd() * count)
        for (const d of String(target)) key(d)
        await frame()
        await settle()
        out.push(await measure(() => key('Enter')))
      } else {
        target = i + 1
        out.push(await measure(() => key('ArrowRight')))
      }
      const shown = document.querySelector('.step-head__number')?.textContent ?? ''
      if (!shown.includes(`Step ${target} `)) throw new Error(`expected step ${target}, the header says "${shown}"`)
      // Let a smooth scroll finish and the page go idle, so each change is timed on its own.
      await settle()
    }
    return out
  }, plan)
}

/** Holding →: key repeat as an OS sends it (about 30 a second), or one key per frame as a worst case. */
async function hold(page: Page, mode: 'repeat' | 'every-frame') {
  return page.evaluate(
    async ({ mode, holdMs }) => {
      const key = (k: string, repeat = false) => window.dispatchEvent(new KeyboardEvent('keydown', { key: k, repeat, bubbles: true, cancelable: true }))
      key('Home')
      await new Promise<void>((r) => requestAnimationFrame(() => r()))
      await new Promise<void>((r) => setTimeout(r, 300))
      const stamps: number[] = []
      let stepsTaken = 0
      const start = performance.now()
      let lastKey = -Infinity
      await new Promise<void>((done) => {
        const tick = (now: number) => {
          stamps.push(now)
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
      const frames = stamps.slice(1).map((t, i) => t - stamps[i])
      const seconds = (stamps[stamps.length - 1] - stamps[0]) / 1000
      // The slowest half second: frames that begin in each 500 ms window, sliding by one frame.
      let worst = Infinity
      for (let i = 0, j = 0; i < stamps.length; i++) {
        while (j < stamps.length && stamps[j] - stamps[i] < 500) j++
        if (stamps[i] + 500 > stamps[stamps.length - 1]) break
        worst = Math.min(worst, (j - i - 1) / 0.5)
      }
      return { fps: frames.length / seconds, worstHalfSecondFps: worst, frames, stepsTaken, over20: frames.filter((f) => f > 20).length }
    },
    { mode, holdMs: HOLD_MS },
  )
}

interface TraceEvent {
  name: string
  ph: string
  ts: number
  dur?: number
  /** thread (CPU) time: what the work costs when nothing else competes for the cores */
  tdur?: number
  pid: number
  tid: number
  args?: { name?: string }
}

/** Main-thread time by kind of work from a trace of `run`, per unit of `units`. */
async function traceBreakdown(context: BrowserContext, page: Page, units: number, run: () => Promise<unknown>): Promise<void> {
  const cdp = await context.newCDPSession(page)
  const events: TraceEvent[] = []
  cdp.on('Tracing.dataCollected', (e) => {
    events.push(...(e.value as unknown as TraceEvent[]))
  })
  const finished = new Promise<void>((r) => cdp.once('Tracing.tracingComplete', () => r()))
  await cdp.send('Tracing.start', { categories: process.env.BENCH_TRACE_FILE ? 'devtools.timeline,disabled-by-default-devtools.timeline,disabled-by-default-devtools.timeline.invalidationTracking' : 'devtools.timeline,disabled-by-default-devtools.timeline', transferMode: 'ReportEvents' })
  await run()
  await cdp.send('Tracing.end')
  await finished
  if (process.env.BENCH_TRACE_FILE) writeFileSync(process.env.BENCH_TRACE_FILE, JSON.stringify(events))
  const main = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain')
  if (!main) return console.log('Trace: no renderer main thread found')
  const kinds: Record<string, string> = {
    FunctionCall: 'script',
    EvaluateScript: 'script',
    TimerFire: 'script',
    FireAnimationFrame: 'script',
    EventDispatch: 'script',
    RunMicrotasks: 'script',
    UpdateLayoutTree: 'style',
    Layout: 'layout',
    PrePaint: 'paint',
    Paint: 'paint',
    PaintImage: 'paint',
    Layerize: 'paint',
    UpdateLayer: 'paint',
    Commit: 'commit',
    HitTest: 'other',
    ScrollLayer: 'other',
    ParseHTML: 'other',
  }
  // Only the outermost slice of each kind counts (script inside script isn't counted twice).
  const mine = events.filter((e) => e.pid === main.pid && e.tid === main.tid && e.ph === 'X' && e.dur !== undefined && kinds[e.name])
  mine.sort((a, b) => a.ts - b.ts || (b.dur ?? 0) - (a.dur ?? 0))
  const totals = new Map<string, { wall: number; cpu: number }>()
  const openUntil = new Map<string, number>()
  for (const e of mine) {
    const kind = kinds[e.name]
    if ((openUntil.get(kind) ?? -1) > e.ts) continue
    openUntil.set(kind, e.ts + (e.dur ?? 0))
    const t = totals.get(kind) ?? { wall: 0, cpu: 0 }
    t.wall += (e.dur ?? 0) / 1000
    t.cpu += (e.tdur ?? e.dur ?? 0) / 1000
    totals.set(kind, t)
  }
  const sorted = [...totals].sort((a, b) => b[1].cpu - a[1].cpu)
  const sum = (k: 'wall' | 'cpu') => sorted.reduce((n, [, t]) => n + t[k], 0) / units
  console.log(`  main thread per → step and the frames after it (ms, from a trace; thread CPU time, wall time in brackets):`)
  console.log(`    ${sorted.map(([k, t]) => `${k} ${(t.cpu / units).toFixed(2)} (${(t.wall / units).toFixed(2)})`).join(' · ')}; all ${sum('cpu').toFixed(2)} (${sum('wall').toFixed(2)})`)
}

async function main(): Promise<void> {
  const record = makeRecord()
  const steps = record.outline.steps.length
  console.log(`Outline: generated thermometer puzzle (seed ${SEED}), ${steps} steps, ${record.outline.lines.length} lines, ${record.outline.chapters.length} chapters`)

  const t0 = performance.now()
  const client = await buildClient()
  console.log(`Client build: ${((performance.now() - t0) / 1000).toFixed(1)} s`)
  const app = await serve(client.dir, record)
  if (process.argv.includes('--serve')) {
    // For screenshots and poking around: the built client and the stand-in API, until Ctrl+C.
    console.log(`Serving the Studio at ${app.url}/channels/1/outlines/1 (session: localStorage 'gridcue.session' = ${JSON.stringify(JSON.stringify(SESSION))})`)
    await new Promise<void>((resolve) => process.once('SIGINT', () => resolve()))
    await app.close()
    client.cleanup()
    return
  }
  const browser = await launchChromium()
  try {
    const studioUrl = `${app.url}/channels/1/outlines/1`
    const js = await firstLoadJs(browser, `${studioUrl}?step=0`)

    const shotsAt = process.argv.indexOf('--shots')
    if (shotsAt > 0 && process.argv[shotsAt + 1]) {
      const dir = process.argv[shotsAt + 1]
      mkdirSync(dir, { recursive: true })
      for (const [width, height] of [[1440, 900], [1280, 720], [1024, 768], [390, 844]]) {
        const context = await newContext(browser, { width, height })
        const shot = await context.newPage()
        await shot.goto(`${studioUrl}?step=40`)
        await shot.waitForSelector('article.line')
        await shot.evaluate(() => document.fonts.ready)
        await shot.waitForTimeout(800)
        await shot.screenshot({ path: join(dir, `studio-${width}x${height}.png`) })
        await context.close()
      }
      console.log(`Screenshots in ${dir}`)
    }

    const context = await newContext(browser)
    const page = await context.newPage()
    const shotAt = process.argv.indexOf('--screenshot')
    if (shotAt > 0 && process.argv[shotAt + 1]) {
      await page.goto(`${studioUrl}?step=40`)
      await page.waitForSelector('article.line')
      await page.waitForTimeout(800)
      await page.screenshot({ path: process.argv[shotAt + 1] })
    }
    await page.goto(`${studioUrl}?step=0`)
    await page.waitForSelector('.step-head')
    await page.waitForSelector('article.line')
    // Let fonts and the first layout settle before timing anything.
    await page.evaluate(() => document.fonts.ready)
    await page.waitForTimeout(500)

    const cdp = await context.newCDPSession(page)
    await cdp.send('Performance.enable')
    const metrics = async () => {
      const { metrics: list } = (await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] }
      return Object.fromEntries(list.map((m) => [m.name, m.value]))
    }

    const jumps = await timeChanges(page, { kind: 'jump', count: steps, n: JUMPS })

    if (PROFILE) {
      await cdp.send('Profiler.enable')
      await cdp.send('Profiler.setSamplingInterval', { interval: 100 })
      await cdp.send('Profiler.start')
    }
    const before = await metrics()
    const forward = await timeChanges(page, { kind: 'forward', count: steps, n: STEPS_FORWARD })
    const after = await metrics()
    if (PROFILE) printProfile(((await cdp.send('Profiler.stop')) as { profile: CpuProfile }).profile)

    const repeat = await hold(page, 'repeat')
    const everyFrame = await hold(page, 'every-frame')

    const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`
    console.log(`First load of a Studio address: ${js.files.length} JS files, ${kb(js.raw)} raw, ${kb(js.gzip)} gzipped (script shown after ${js.shownMs} ms)`)
    for (const f of js.files) console.log(`  ${kb(f.gzip).padStart(9)}  ${f.name}`)
    const report = (name: string, xs: Timed[]) => {
      const pick = (k: keyof Timed) => xs.map((x) => x[k])
      console.log(name)
      console.log(`  change → frame rendered:  median ${ms(median(pick('frame')))}, p95 ${ms(percentile(pick('frame'), 95))}`)
      console.log(`    of which script + patch: median ${ms(median(pick('script')))}, p95 ${ms(percentile(pick('script'), 95))}`)
      console.log(`  the frame after (deferred work): median ${ms(median(pick('next')))}, p95 ${ms(percentile(pick('next'), 95))}`)
    }
    report(`Any step (${JUMPS} random jumps, typed number + Enter):`, jumps)
    report(`One step forward (${STEPS_FORWARD} × →):`, forward)
    const per = (name: string) => ((after[name] - before[name]) * 1000) / STEPS_FORWARD
    console.log(
      `  main thread per → (Chromium metrics, ms): task ${per('TaskDuration').toFixed(2)}, script ${per('ScriptDuration').toFixed(2)}, ` +
        `style ${per('RecalcStyleDuration').toFixed(2)}, layout ${per('LayoutDuration').toFixed(2)}`,
    )
    if (TRACE) await traceBreakdown(context, page, STEPS_FORWARD, () => timeChanges(page, { kind: 'forward', count: steps, n: STEPS_FORWARD }))
    for (const [name, r] of [['key repeat 30/s', repeat], ['a key every frame', everyFrame]] as const) {
      console.log(
        `Holding → (${name}, ${HOLD_MS / 1000} s, ${r.stepsTaken} steps): ${r.fps.toFixed(1)} fps, slowest half second ${r.worstHalfSecondFps.toFixed(0)} fps, ` +
          `frame median ${ms(median(r.frames))}, p95 ${ms(percentile(r.frames, 95))}, longest ${ms(Math.max(...r.frames))}, ${r.over20} frames over 20 ms`,
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
