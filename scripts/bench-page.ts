/**
 * Episode page benchmark (not a test): what a viewer's first visit costs.
 *   - The page's own JavaScript: the files the built `episode.html` loads (its entry and the chunks it
 *     preloads), raw and gzipped, against the budget of 120 KB gzipped.
 *   - First paint and first contentful paint in headless Chromium (Paint Timing API), with JavaScript on and
 *     off, and when the app has taken over (JavaScript on); with JavaScript off the page must still carry the
 *     whole step list, since the server writes it into the HTML.
 * The page is the demo channel's published episode (seeds/03_demo_episode.ts), served by the app in this
 * process from real PostgreSQL; on a database without it, a fixture take is published in its place.
 * Run with `npm run bench:page` (a throw-away cluster on 127.0.0.1:5449, or DATABASE_URL).
 * Options: --dist <dir> reuses a build (default: a fresh build in a temporary folder); --runs <n> page loads
 * per mode (7); CHROMIUM_PATH overrides /usr/bin/chromium.
 */
import { spawn } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { cpus, tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import type { Browser } from 'playwright-core'
import { build } from 'vite'
import { createApp } from '../server/app'
import { loadConfig } from '../server/config'
import { DEMO_EPISODE_ADDRESS } from '../server/demo-episode'
import { createDb } from '../server/db/knex'
import { createJobQueue } from '../server/jobs/queue'
import { createLogger } from '../server/logger'
import { createEnginePool } from '../server/workers/engine-pool'
import { draftOf } from '../tests/helpers/studio'
import { api, signIn } from './lib/bench-client'
import { launchChromium } from './lib/chromium'

const ROOT = new URL('..', import.meta.url)
const BUDGET_GZIP_BYTES = 120 * 1024
const RUNS = Number(option('--runs') ?? 7)

interface Load {
  firstPaint: number
  firstContentfulPaint: number
  /** JavaScript on: the app has replaced the server's HTML */
  appReady?: number
  stepItems: number
  jsBytes: number
}

function option(name: string): string | undefined {
  const at = process.argv.indexOf(name)
  return at > 0 ? process.argv[at + 1] : undefined
}

async function buildClient(): Promise<{ dir: string; cleanup: () => void }> {
  const given = option('--dist')
  if (given) return { dir: given, cleanup: () => {} }
  // a private output folder, so a build already in dist/ (or one being made) is left alone
  const dir = mkdtempSync(join(tmpdir(), 'gridcue-bench-page-'))
  await build({ logLevel: 'error', build: { outDir: dir, emptyOutDir: true } })
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) }
}

/** The scripts the built page loads: its module entry and every chunk it preloads, in page order. */
function pageScripts(dir: string): { file: string; raw: number; gzip: number }[] {
  const html = readFileSync(join(dir, 'episode.html'), 'utf8')
  const paths = [...html.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"|<link[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)].map((m) => (m[1] ?? m[2])!)
  return paths.map((path) => {
    const body = readFileSync(join(dir, path))
    return { file: path, raw: body.length, gzip: gzipSync(body, { level: 9 }).length }
  })
}

function migrate(): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts', '--seed'], { cwd: ROOT, stdio: 'inherit' })
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`migrate.ts exited with ${code}`))))
  })
}

/** The demo episode's address when the seed published it; otherwise a fixture take, published now without a video. */
async function episodePath(base: string): Promise<string> {
  const demo = `/episodes/${DEMO_EPISODE_ADDRESS.channelSlug}/${DEMO_EPISODE_ADDRESS.episodeSlug}`
  if ((await fetch(base + demo)).ok) return demo
  const token = await signIn(base, 'owner@gridcue.example', 'gridcue-demo')
  const channelId = ((await api(base, 'GET', '/api/channels', token)) as { id: number }[])[0]!.id
  const puzzle = (await api(base, 'POST', `/api/channels/${channelId}/puzzles`, token, draftOf('GT07', { title: 'Bench thermometers' }))) as { id: number }
  const take = (await api(base, 'POST', `/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`, token, { name: 'Bench take' })) as { id: number }
  const body = { slug: `bench-${Date.now()}`, title: 'Bench episode', visibility: 'public', description: 'A take published for the page benchmark.', video: { kind: 'none' } }
  const episode = (await api(base, 'PUT', `/api/channels/${channelId}/outlines/${take.id}/episode`, token, body)) as { pageUrl: string }
  return episode.pageUrl
}

async function loadOnce(browser: Browser, url: string, javaScript: boolean): Promise<Load> {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 }, javaScriptEnabled: javaScript })
  const page = await context.newPage()
  let jsBytes = 0
  page.on('response', (response) => {
    if (response.request().resourceType() === 'script') void response.body().then((b) => (jsBytes += b.length), () => {})
  })
  await page.goto(url, { waitUntil: 'load' })
  let appReady: number | undefined
  if (javaScript) {
    await page.locator('.episode').waitFor()
    appReady = await page.evaluate(() => performance.now())
  }
  // Paint Timing entries are read from a separate CDP session: with JavaScript off, page.evaluate can't run
  const cdp = await context.newCDPSession(page)
  await cdp.send('Runtime.enable')
  const { result } = (await cdp.send('Runtime.evaluate', {
    expression: 'JSON.stringify(performance.getEntriesByType("paint").map((e) => [e.name, e.startTime]))',
    returnByValue: true,
  })) as { result: { value: string } }
  const paints = new Map(JSON.parse(result.value) as [string, number][])
  const stepItems = await page.locator('li[id^="step-"]').count()
  await context.close()
  return { firstPaint: paints.get('first-paint') ?? Number.NaN, firstContentfulPaint: paints.get('first-contentful-paint') ?? Number.NaN, appReady, stepItems, jsBytes }
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} KB`
const ms = (value: number | undefined) => (value === undefined || Number.isNaN(value) ? '—' : `${value.toFixed(0)} ms`)

const client = await buildClient()
const config = loadConfig({ ...process.env, LOG_LEVEL: 'silent' })
const logger = createLogger('silent')
const db = createDb(config.db.url)
const engine = createEnginePool({ threads: 1, timeoutMs: 60_000, logger })
const jobs = createJobQueue({ url: config.db.url, logger })
let server: Server | undefined
let browser: Browser | undefined
try {
  await migrate()
  const app = createApp({ db, config, engine, jobs, logger, clientDir: client.dir })
  server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  const url = base + (await episodePath(base))

  console.log(`Gridcue episode page benchmark — ${new Date().toISOString().slice(0, 10)}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}`)
  console.log(`page: ${url}\n`)

  const scripts = pageScripts(client.dir)
  const raw = scripts.reduce((sum, s) => sum + s.raw, 0)
  const gzip = scripts.reduce((sum, s) => sum + s.gzip, 0)
  console.log('The page\'s JavaScript (files episode.html loads):')
  for (const s of scripts) console.log(`  ${s.file.padEnd(44)} ${kb(s.raw).padStart(9)} raw ${kb(s.gzip).padStart(9)} gzipped`)
  console.log(`  ${'total'.padEnd(44)} ${kb(raw).padStart(9)} raw ${kb(gzip).padStart(9)} gzipped — budget ${kb(BUDGET_GZIP_BYTES)} gzipped: ${gzip <= BUDGET_GZIP_BYTES ? 'within' : 'OVER'}\n`)

  browser = await launchChromium()
  await loadOnce(browser, url, true) // warm-up: the server's first page and the database's caches
  const results: Record<'on' | 'off', Load[]> = { on: [], off: [] }
  for (let i = 0; i < RUNS; i++) {
    results.on.push(await loadOnce(browser, url, true))
    results.off.push(await loadOnce(browser, url, false))
  }
  console.log(`Chromium, 390×844, loopback, median of ${RUNS} fresh loads:`)
  console.log('| JavaScript | first paint | first contentful paint | app ready | step items in the page | script bytes fetched |')
  console.log('| --- | ---: | ---: | ---: | ---: | ---: |')
  for (const mode of ['on', 'off'] as const) {
    const loads = results[mode]
    const ready = loads.every((l) => l.appReady !== undefined) ? median(loads.map((l) => l.appReady!)) : undefined
    console.log(
      `| ${mode} | ${ms(median(loads.map((l) => l.firstPaint)))} | ${ms(median(loads.map((l) => l.firstContentfulPaint)))} | ${ms(ready)} | ${median(loads.map((l) => l.stepItems))} | ${kb(median(loads.map((l) => l.jsBytes)))} |`,
    )
  }
  if (results.off.some((l) => l.stepItems === 0)) {
    console.log('\nWith JavaScript off the page had no step list: the server did not write it into the HTML.')
    process.exitCode = 1
  }
  if (gzip > BUDGET_GZIP_BYTES) process.exitCode = 1
} finally {
  await browser?.close()
  server?.closeAllConnections()
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()))
  await engine.destroy()
  await jobs.close()
  await db.destroy()
  client.cleanup()
}
