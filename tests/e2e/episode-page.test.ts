import { beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { episodePageSchema, episodeSchema, type EpisodePage } from '../../shared/schemas/episode'
import { outlineRecordSchema } from '../../shared/schemas/studio'
import { scriptOf } from '../../shared/schemas/outline'
import { useBrowserSuite } from '../helpers/browser'
import { ffmpegFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

const suite = useBrowserSuite()

// every line aligned this far apart, so the first steps fall inside the short recording
const LINE_GAP_MS = 1600
const RECORDING_SECONDS = 14

/** The demo owner, through the API: makes a take, uploads its recording, aligns it and publishes it. */
async function publishEpisode(base: string): Promise<{ pageUrl: string; data: EpisodePage }> {
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'owner@gridcue.example', password: DEMO_PASSWORD }),
  })
  const { token } = (await signIn.json()) as { token: string }
  const call = async (method: string, path: string, body?: object | FormData): Promise<unknown> => {
    const json = body !== undefined && !(body instanceof FormData)
    const res = await fetch(`${base}/api${path}`, {
      method,
      headers: { Authorization: `Bearer ${token}`, ...(json ? { 'Content-Type': 'application/json' } : {}) },
      body: json ? JSON.stringify(body) : body,
    })
    if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${await res.text()}`)
    return res.status === 204 ? undefined : res.json()
  }
  const channelId = ((await call('GET', '/channels')) as { id: number }[])[0]!.id
  // GT07 (our generated thermometer puzzle) opens with a placement: the only place for a 3 in box 2
  const puzzle = (await call('POST', `/channels/${channelId}/puzzles`, draftOf('GT07', { author: 'Wren Alder', link: 'https://puzzles.example/gt07' }))) as { id: number }
  const created = (await call('POST', `/channels/${channelId}/puzzles/${puzzle.id}/outlines`, {})) as { id: number }
  const takePath = `/channels/${channelId}/outlines/${created.id}`

  // a small VP8 + Opus video made by ffmpeg from its test sources
  const form = new FormData()
  const video = ffmpegFile('webm', ['-c:v', 'libvpx', '-b:v', '80k', '-c:a', 'libopus', '-b:a', '24k'], { seconds: RECORDING_SECONDS, video: true })
  form.append('file', new Blob([new Uint8Array(video)], { type: 'video/webm' }), 'take.webm')
  const recording = (await call('POST', `${takePath}/recordings`, form)) as { id: number }

  const record = outlineRecordSchema.parse(await call('GET', takePath))
  const script = scriptOf(record.outline)
  let visible = 0
  script.lines = script.lines.map((line) => (line.hidden ? line : { ...line, alignedStartMs: visible++ * LINE_GAP_MS }))
  await call('PATCH', takePath, { version: record.version, script })

  const episode = episodeSchema.parse(
    await call('PUT', `${takePath}/episode`, {
      slug: 'gt07-along',
      title: 'Thermometers, gently',
      visibility: 'public',
      description: 'A calm thermometer solve, one digit at a time.',
      video: { kind: 'recording', recordingId: recording.id },
    }),
  )
  const data = episodePageSchema.parse(await (await fetch(`${base}/api${episode.pageUrl}`)).json())
  return { pageUrl: `${base}${episode.pageUrl}`, data }
}

/** Digits on the grid by cell, read from the cells' accessible names ("row 3, column 4, 7, given", "row 1, column 6, 3, placed now"). */
async function gridDigits(page: Page): Promise<Map<number, number>> {
  const names = await page.getByRole('gridcell').evaluateAll((cells) => cells.map((c) => c.getAttribute('aria-label') ?? ''))
  const digits = new Map<number, number>()
  names.forEach((name) => {
    const m = /^row (\d), column (\d), (\d)/.exec(name)
    if (m) digits.set((Number(m[1]) - 1) * 9 + Number(m[2]) - 1, Number(m[3]))
  })
  return digits
}

/** Cells holding a digit that is neither a given nor placed by the first `k` steps: a digit from later in the solve. */
function laterDigits(data: EpisodePage, shown: Map<number, number>, k: number): number[] {
  const allowed = new Set<number>()
  for (let c = 0; c < 81; c++) if (data.puzzle.givens[c] !== '.') allowed.add(c)
  for (const step of data.steps.slice(0, k)) for (const p of step.placements) allowed.add(p.cell)
  return [...shown.keys()].filter((c) => !allowed.has(c))
}

/** How the grid names a cell for screen readers. */
const cellSpokenName = (c: number) => `row ${Math.floor(c / 9) + 1}, column ${(c % 9) + 1}`
const currentTime = (page: Page) => page.evaluate(() => document.querySelector('video')!.currentTime)

/** The whole visit of an anonymous viewer at one window size; returns the page for layout checks. */
async function visit(browser: Browser, pageUrl: string, data: EpisodePage, viewport: { width: number; height: number }): Promise<Page> {
  const context = await browser.newContext({ viewport })
  const page = await context.newPage()
  await page.goto(pageUrl)
  await page.getByRole('button', { name: 'Solve along (no spoilers)' }).waitFor()

  const lineIndex = data.lines.findIndex((l) => l.steps.some((s) => data.steps[s]!.placements.length > 0))
  const line = data.lines[lineIndex]!
  const placed = data.steps[line.steps[0]!]!.placements[0]!
  const target = page.getByRole('gridcell', { name: new RegExp(`^${cellSpokenName(placed.cell)},`) })
  expect(await target.getAttribute('aria-label')).toMatch(new RegExp(`^${cellSpokenName(placed.cell)}, empty`))

  // play (after a click on the page: a browser lets media play with sound only after the viewer has acted)
  await page.getByRole('heading', { level: 1 }).click()
  await page.evaluate(() => document.querySelector('video')!.play())
  await page.getByRole('gridcell', { name: new RegExp(`^${cellSpokenName(placed.cell)}, ${placed.digit}`) }).waitFor({ timeout: 15_000 })
  // the grid changed at the step's time, not before it (timeupdate comes every quarter second or so)
  expect(await currentTime(page)).toBeGreaterThanOrEqual(line.startMs / 1000)
  await page.evaluate(() => document.querySelector('video')!.pause())
  const steps = page.getByRole('region', { name: 'Steps' }).getByRole('listitem')
  expect(await steps.nth(lineIndex).getAttribute('aria-current')).toBe('step')

  // a step picked in the list: the video seeks to its start and the list follows
  const picked = 6
  await steps.nth(picked).getByRole('button').click()
  await page.waitForFunction((s) => Math.abs(document.querySelector('video')!.currentTime - s) < 0.05, data.lines[picked]!.startMs / 1000)
  expect(await steps.nth(picked).getAttribute('aria-current')).toBe('step')

  // solve-along: nothing past the viewer's position, and three nudges that never show a later digit
  await page.getByRole('button', { name: 'Solve along (no spoilers)' }).click()
  expect(await steps.count()).toBe(lineIndex)
  expect(laterDigits(data, await gridDigits(page), 0)).toEqual([])
  const nudge = page.getByRole('button', { name: /^Nudge/ })
  await nudge.click()
  await page.getByText('Where to look').waitFor()
  expect(laterDigits(data, await gridDigits(page), 0)).toEqual([])
  await nudge.click()
  await page.getByText('What kind of step').waitFor()
  expect(laterDigits(data, await gridDigits(page), 0)).toEqual([])
  await nudge.click()
  await page.getByText('The step', { exact: true }).waitFor()
  const shown = await gridDigits(page)
  expect(shown.get(placed.cell)).toBe(placed.digit)
  expect(laterDigits(data, shown, line.steps.at(-1)! + 1)).toEqual([])
  await page.getByRole('button', { name: 'Next step' }).click()
  expect(await steps.count()).toBe(lineIndex + 1)
  return page
}

describe('viewer: a published episode, watched and solved along (Chromium)', () => {
  let published: Awaited<ReturnType<typeof publishEpisode>>
  beforeAll(async () => {
    published = await publishEpisode(suite.url)
  })

  it('should show the step list before any JavaScript runs', async () => {
    const context = await suite.browser.newContext({ javaScriptEnabled: false })
    const page = await context.newPage()
    await page.goto(published.pageUrl)
    await page.locator('#step-1').waitFor()
    expect(await page.locator('li[id^="step-"]').count()).toBe(published.data.lines.length)
    expect(await page.title()).toBe('Thermometers, gently · Marigold Logic')
    await context.close()
  })

  it('should follow playback, seek on a step and nudge through three levels on a wide screen', async () => {
    const page = await visit(suite.browser, published.pageUrl, published.data, { width: 1440, height: 900 })
    // the layout: player and grid side by side with the list
    const grid = (await page.getByRole('grid').boundingBox())!
    const list = (await page.getByRole('region', { name: 'Steps' }).boundingBox())!
    expect(grid.x + grid.width).toBeLessThanOrEqual(list.x)
    await page.screenshot({ path: '/tmp/episode-wide.png' })
    await page.context().close()
  })

  it('should do the same on a 390-px phone: grid above the list, the player in view when scrolled', async () => {
    const page = await visit(suite.browser, published.pageUrl, published.data, { width: 390, height: 844 })
    // solve-along off again: the whole list, long enough to scroll
    await page.getByRole('button', { name: 'Solve along (no spoilers)' }).click()
    await page.evaluate(() => window.scrollTo(0, 0))
    const grid = (await page.getByRole('grid').boundingBox())!
    const list = (await page.getByRole('region', { name: 'Steps' }).boundingBox())!
    expect(grid.width).toBeLessThanOrEqual(390)
    expect(grid.y + grid.height).toBeLessThanOrEqual(list.y)
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await page.screenshot({ path: '/tmp/episode-phone.png' })

    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight / 2))
    const player = (await page.locator('video').boundingBox())!
    expect(await page.evaluate(() => window.scrollY)).toBeGreaterThan(500)
    expect(player.y).toBeGreaterThanOrEqual(0)
    expect(player.y).toBeLessThan(20)
    await page.context().close()
  })
})
