import { readFile } from 'node:fs/promises'
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { outlineRecordSchema } from '../../shared/schemas/studio'
import { toWebVttChapters, type Outline } from '../../shared/script'
import { vttTimestamp } from '../../shared/script/timecode'
import { useBrowserSuite } from '../helpers/browser'
import { wavFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

const suite = useBrowserSuite({ jobs: true })

// a tone long enough to stamp three lines while it plays; the caption cues below lie after the stamps
const RECORDING_SECONDS = 12
const CAPTION_STARTS_MS = [6000, 8000, 10000]

/**
 * A WebVTT file (W3C WebVTT §4: "WEBVTT" header, cues of "start --> end" and text) whose cues say the given
 * lines word for word, as a video platform's automatic captions of this take would.
 */
function captionFile(lines: readonly { text: string }[]): string {
  const cues = lines.map((line, i) => `${vttTimestamp(CAPTION_STARTS_MS[i]!)} --> ${vttTimestamp(CAPTION_STARTS_MS[i]! + 1900)}\n${line.text}`)
  return `WEBVTT\n\n${cues.join('\n\n')}\n`
}

/** The channel's owner, signed in through the API: they make the take and read it back. */
async function ownerApi() {
  const signIn = await fetch(`${suite.url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'owner@gridcue.example', password: DEMO_PASSWORD }),
  })
  const { token } = (await signIn.json()) as { token: string }
  const call = async (method: 'GET' | 'POST', path: string, body?: object): Promise<unknown> => {
    const res = await fetch(`${suite.url}/api${path}`, {
      method,
      headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
      body: body && JSON.stringify(body),
    })
    if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${await res.text()}`)
    return res.json()
  }
  return {
    /** a puzzle of the channel and a take of it, as the presenter would have made them in the Studio */
    async newTake(): Promise<{ channelId: number; outlineId: number }> {
      const channelId = ((await call('GET', '/channels')) as { id: number }[])[0]!.id
      const puzzle = (await call('POST', `/channels/${channelId}/puzzles`, draftOf('GT13'))) as { id: number }
      const take = (await call('POST', `/channels/${channelId}/puzzles/${puzzle.id}/outlines`, {})) as { id: number }
      return { channelId, outlineId: take.id }
    },
    /** the saved take, read back through the API */
    async outline(channelId: number, outlineId: number): Promise<Outline> {
      return outlineRecordSchema.parse(await call('GET', `/channels/${channelId}/outlines/${outlineId}`)).outline
    },
  }
}

/** Waits until the recording has played past `seconds`, then presses the stamp key. */
async function stampAfter(page: Page, seconds: number): Promise<void> {
  await page.waitForFunction((s) => (document.querySelector('audio')?.currentTime ?? 0) > s, seconds)
  await page.keyboard.press('s')
}

describe('editor: a recording uploaded, stamped by key and aligned from captions, then exported (Chromium)', () => {
  it('should carry the stamped and accepted times into the exported WebVTT chapters', async () => {
    const owner = await ownerApi()
    const { channelId, outlineId } = await owner.newTake()
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } })
    await page.goto(suite.url)
    await page.getByLabel('E-mail').fill('editor@gridcue.example')
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText('Marigold Logic').first().waitFor()

    await page.goto(`${suite.url}/channels/${channelId}/outlines/${outlineId}`)
    await page.getByRole('link', { name: 'Align to the recording' }).click()
    await page.getByRole('heading', { name: /^Align · / }).waitFor()

    // upload: a WAV written in the test, played through the signed link the screen asks for
    await page.getByLabel('Recording file').setInputFiles({ name: 'studio-take.wav', mimeType: 'audio/wav', buffer: wavFile({ seconds: RECORDING_SECONDS }) })
    const player = page.getByLabel('Recording: studio-take.wav')
    await player.waitFor()
    expect(await player.getAttribute('src')).toMatch(/^\/api\/media\/[\w-]+\.[\w-]+\.[\w-]+$/)
    await page.getByRole('img', { name: /^Waveform of the recording/ }).waitFor()

    // three stamps with the key while it plays; each stamp moves on to the next line
    await page.getByRole('button', { name: 'Play', exact: true }).click()
    await stampAfter(page, 1)
    await stampAfter(page, 2.5)
    await stampAfter(page, 4)
    await page.getByRole('button', { name: 'Pause', exact: true }).click()
    for (const n of [1, 2, 3]) await page.getByRole('button', { name: new RegExp(`^Line ${n}, starts at \\d+:\\d{2}\\.\\d$`) }).waitFor()

    // captions for the lines that open chapters 3 to 5, uploaded for suggestions, accepted in one go
    const before = await owner.outline(channelId, outlineId)
    const captioned = before.chapters.slice(2, 5).map((c) => before.lines.find((l) => l.id === c.lineId)!)
    expect(captioned).toHaveLength(3)
    await page.getByLabel('Caption file (WebVTT or SRT)').setInputFiles({ name: 'auto-captions.vtt', mimeType: 'text/vtt', buffer: Buffer.from(captionFile(captioned)) })
    await page.getByRole('button', { name: /^Accept all at \d+% or more$/ }).click()
    await page.getByRole('status').getByText('Saved', { exact: true }).waitFor({ timeout: 20_000 })

    // the saved take holds the three stamps (in playing order) and the caption cues' starts
    const saved = await owner.outline(channelId, outlineId)
    const stamped = saved.lines.slice(0, 3).map((l) => l.alignedStartMs)
    expect(stamped.every((ms) => ms !== undefined)).toBe(true)
    expect(stamped[0]!).toBeGreaterThanOrEqual(1000)
    expect(stamped[0]!).toBeLessThan(stamped[1]!)
    expect(stamped[1]!).toBeLessThan(stamped[2]!)
    const accepted = captioned.map((c) => saved.lines.find((l) => l.id === c.id)!.alignedStartMs)
    accepted.forEach((ms, i) => expect(Math.abs(ms! - CAPTION_STARTS_MS[i]!)).toBeLessThanOrEqual(100))

    // the Studio's export menu: the chapters file is the saved take's, and every chapter starts at its line's aligned time
    await page.getByRole('link', { name: 'Studio' }).click()
    await page.getByRole('group', { name: 'Replay' }).waitFor()
    await page.getByRole('button', { name: 'Export' }).click()
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('menuitem', { name: 'Chapters (WebVTT)' }).click()])
    const chapters = await readFile((await download.path())!, 'utf8')
    expect(chapters).toBe(toWebVttChapters(saved))
    const cueStarts = [...chapters.matchAll(/^(\S+) --> /gm)].map(([, start]) => start)
    // the first chapter opens the video at 0:00 (common practice for chapter lists); the others start where their lines were aligned
    // (chapters 1–5 open on the stamped and captioned lines; any later chapter keeps its estimate, counted on from them)
    const alignedStarts = saved.chapters.slice(0, 5).map((c, i) => vttTimestamp(i === 0 ? 0 : saved.lines.find((l) => l.id === c.lineId)!.alignedStartMs!))
    expect(cueStarts.slice(0, 5)).toEqual(alignedStarts)
    expect([...cueStarts].sort()).toEqual(cueStarts)
    await page.close()
  })
})
