/**
 * Rehearsal runs through the API against the real PostgreSQL: save, list, discard, breaks, refusals, the
 * presenter's calibration, and the read-aloud preview made by espeak-ng (its length measured with sox).
 */
import { execFileSync } from 'node:child_process'
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { rehearsalListSchema, rehearsalRunSchema } from '../../shared/schemas/rehearsal'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { wordCount } from '../../shared/script/words'
import { useApiSuite } from '../helpers/api'
import { draftOf } from '../helpers/studio'

let take: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    const res = await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})
    if (res.status !== 201) throw new Error(`making an outline failed: ${res.status} ${JSON.stringify(res.body)}`)
    take = res.body
  },
})

const base = () => `/api/channels/${api.channelId}/outlines/${take.id}`
const lineIds = () => take.outline.lines.map((l) => l.id)

describe('rehearsal runs', () => {
  it('saves a named run with each line timed, marks a line over a minute as a break, and lists it', async () => {
    const [a, b, c] = lineIds()
    const saved = await api.as('presenter').post(`${base()}/rehearsals`, { name: '  First go  ', lines: [{ lineId: a, ms: 9000 }, { lineId: b, ms: 95_000 }, { lineId: c, ms: 7000 }] })
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    const run = rehearsalRunSchema.parse(saved.body)
    expect(run.name).toBe('First go')
    expect(run.lines.map((l) => l.isBreak)).toEqual([false, true, false])
    // the break is not speech: 9 s + 7 s
    expect(run.speechMs).toBe(16_000)
    // the first line's words, counted as the timing model counts them (shared/script/words.ts)
    expect(run.lines[0].work.words).toBe(wordCount(take.outline.lines[0].text))

    const list = await api.as('editor').get(`${base()}/rehearsals`)
    expect(list.status).toBe(200)
    expect(rehearsalListSchema.parse(list.body).runs.map((r) => r.id)).toEqual([run.id])
  })

  it('keeps several runs per take, newest first, and discards one', async () => {
    const [a] = lineIds()
    const first = await api.as('presenter').post(`${base()}/rehearsals`, { name: 'One', lines: [{ lineId: a, ms: 5000 }] })
    const second = await api.as('owner').post(`${base()}/rehearsals`, { name: 'Two', lines: [{ lineId: a, ms: 6000 }] })
    const listed = rehearsalListSchema.parse((await api.as('presenter').get(`${base()}/rehearsals`)).body)
    expect(listed.runs.map((r) => r.name)).toEqual(['Two', 'One'])

    expect((await api.as('presenter').delete(`${base()}/rehearsals/${second.body.id}`)).status).toBe(204)
    const after = rehearsalListSchema.parse((await api.as('presenter').get(`${base()}/rehearsals`)).body)
    expect(after.runs.map((r) => r.id)).toEqual([first.body.id])
    const again = await api.as('presenter').delete(`${base()}/rehearsals/${second.body.id}`)
    expect(again.status).toBe(404)
  })

  it('refuses a line that is not in the take, a line timed twice and an empty name, with sentences, keeping nothing', async () => {
    const [a] = lineIds()
    const unknown = await api.as('presenter').post(`${base()}/rehearsals`, { name: 'x', lines: [{ lineId: 99_999, ms: 1000 }] })
    expect(unknown.status).toBe(400)
    expect(unknown.body.message).toMatch(/Line 99999 is not in this take/)
    const twice = await api.as('presenter').post(`${base()}/rehearsals`, { name: 'x', lines: [{ lineId: a, ms: 1000 }, { lineId: a, ms: 1000 }] })
    expect(twice.status).toBe(400)
    expect(twice.body.code).toBe('repeated-line')
    const unnamed = await api.as('presenter').post(`${base()}/rehearsals`, { name: '   ', lines: [{ lineId: a, ms: 1000 }] })
    expect(unnamed.status).toBe(400)
    expect(unnamed.body.message).toMatch(/Give the run a name/)
    expect(rehearsalListSchema.parse((await api.as('presenter').get(`${base()}/rehearsals`)).body).runs).toEqual([])
  })

  it("calibrates the take's presenter from their saved runs: a presenter timed at 200 wpm reads as 200", async () => {
    const list0 = rehearsalListSchema.parse((await api.as('presenter').get(`${base()}/rehearsals`)).body)
    expect(list0.calibration).toBeNull()
    // each line timed exactly as the model says at 200 wpm (300 ms a word) with the script's action and pause times
    const lines = take.outline.lines.slice(0, 12).map((line) => {
      const words = wordCount(line.text)
      return { lineId: line.id, ms: words * 300 + 800, words }
    })
    // lines with digits or marks would carry their own times; the fit must still find the pace from the words
    const res = await api.as('presenter').post(`${base()}/rehearsals`, { name: 'Paced', lines: lines.map(({ lineId, ms }) => ({ lineId, ms })) })
    expect(res.status).toBe(201)
    const { calibration } = rehearsalListSchema.parse((await api.as('editor').get(`${base()}/rehearsals`)).body)
    expect(calibration?.presenterId).toBe(api.user('presenter').id)
    expect(calibration!.pace).toBeGreaterThan(190)
    expect(calibration!.pace).toBeLessThan(210)
  })
})

describe('read-aloud preview', () => {
  it('reads a stretch at 160 wpm: its length, measured with sox, is within 25% of words ÷ pace', async () => {
    const stretch = take.outline.lines.slice(0, 6)
    const res = await api
      .as('presenter')
      .post(`${base()}/read-aloud`, { fromLineId: stretch[0].id, toLineId: stretch.at(-1)!.id, pace: 160 })
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = []
        response.on('data', (c: Buffer) => chunks.push(c))
        response.on('end', () => done(null, Buffer.concat(chunks)))
      })
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/audio\/wav/)
    const dir = await mkdtemp(join(tmpdir(), 'gridcue-preview-test-'))
    try {
      const file = join(dir, 'preview.wav')
      await writeFile(file, res.body as Buffer)
      // sox --i -D prints the duration in seconds (sox's manual page)
      const seconds = Number(execFileSync('sox', ['--i', '-D', file], { encoding: 'utf8' }).trim())
      const words = stretch.reduce((sum, l) => sum + wordCount(l.text), 0)
      const expected = (words / 160) * 60
      expect(Math.abs(seconds - expected) / expected).toBeLessThan(0.25)
    } finally {
      await rm(dir, { recursive: true, force: true })
    }
  })

  it('refuses a stretch that runs backwards or is too long, with a sentence', async () => {
    const ids = lineIds()
    const backwards = await api.as('owner').post(`${base()}/read-aloud`, { fromLineId: ids[2], toLineId: ids[0] })
    expect(backwards.status).toBe(400)
    expect(backwards.body.message).toMatch(/start at or before/)
    if (ids.length > 12) {
      const long = await api.as('owner').post(`${base()}/read-aloud`, { fromLineId: ids[0], toLineId: ids[12] })
      expect(long.status).toBe(400)
      expect(long.body.code).toBe('range-too-long')
    }
  })
})
