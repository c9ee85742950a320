import { PNG } from 'pngjs'
import { describe, expect, it } from 'vitest'
import { gridPlacement } from '../../shared/picture/grid-svg'
import type { OutlineRecord, PuzzleRecord } from '../../shared/schemas/studio'
import { useApiSuite } from '../helpers/api'
import { draftOf } from '../helpers/studio'

let puzzle: PuzzleRecord
let outline: OutlineRecord
const suite = useApiSuite({
  prepare: async (s) => {
    puzzle = await s.createPuzzle(draftOf('PE01'))
    const res = await s.as('owner').post(`/api/channels/${s.channelId}/puzzles/${puzzle.id}/outlines`, {})
    if (res.status !== 201) throw new Error(`making an outline failed: ${res.status} ${JSON.stringify(res.body)}`)
    outline = res.body
  },
})
const as = suite.as

const picturePath = (query: string) => `/api/channels/${suite.channelId}/outlines/${outline.id}/picture.png${query}`

type Rgb = readonly [number, number, number]
const INK: Rgb = [0x1f, 0x24, 0x30]
const TEAL: Rgb = [0x0f, 0x76, 0x6e]
const AMBER: Rgb = [0xfd, 0xe6, 0x8a]

/** The picture as pngjs (npm) decodes it: a third-party PNG reader, not our renderer, says what was drawn. */
async function picture(query: string): Promise<PNG> {
  const res = await as('editor').get(picturePath(query)).buffer(true)
  expect(res.status, String(res.body)).toBe(200)
  expect(res.headers['content-type']).toBe('image/png')
  return PNG.sync.read(Buffer.from(res.body as Buffer))
}

/** How many pixels within the middle 60 % of a cell are close to a colour. */
function pixelsNear(png: PNG, cell: number, colour: Rgb): number {
  const grid = gridPlacement(png.width, png.height, true)
  const side = grid.size / 9
  const cx = grid.x + (cell % 9 + 0.5) * side
  const cy = grid.y + (Math.floor(cell / 9) + 0.5) * side
  let n = 0
  for (let y = Math.round(cy - 0.3 * side); y <= cy + 0.3 * side; y++) {
    for (let x = Math.round(cx - 0.3 * side); x <= cx + 0.3 * side; x++) {
      const i = (y * png.width + x) * 4
      const distance = Math.hypot(png.data[i]! - colour[0], png.data[i + 1]! - colour[1], png.data[i + 2]! - colour[2])
      if (distance < 40) n++
    }
  }
  return n
}

// Project Euler 96, grid 01: row 1 reads "..3.2.6..", so r1c3 holds a given 3 and r1c1 is empty.
const GIVEN_R1C3 = 2
const EMPTY_R1C1 = 0

describe('GET /api/channels/:channelId/outlines/:outlineId/picture.png', () => {
  it('should draw a wide picture of 1280×720 with the given digits in ink where their cells are, and nothing in an empty cell', async () => {
    const png = await picture('')
    expect([png.width, png.height]).toEqual([1280, 720])
    expect(pixelsNear(png, GIVEN_R1C3, INK)).toBeGreaterThan(40)
    expect(pixelsNear(png, EMPTY_R1C1, INK)).toBe(0)
    expect(pixelsNear(png, EMPTY_R1C1, TEAL)).toBe(0)
  })

  it('should draw a square picture of 1080×1080 with the same grid', async () => {
    const png = await picture('?shape=square&highlights=off')
    expect([png.width, png.height]).toEqual([1080, 1080])
    expect(pixelsNear(png, GIVEN_R1C3, INK)).toBeGreaterThan(40)
    expect(pixelsNear(png, EMPTY_R1C1, INK)).toBe(0)
  })

  it('should draw the digit a step places in teal after that step, and not before it', async () => {
    const k = outline.outline.steps.findIndex((s) => s.placements.length > 0) + 1
    const cell = outline.outline.steps[k - 1]!.placements[0]!.cell
    const before = await picture(`?step=${k - 1}&highlights=off`)
    const after = await picture(`?step=${k}&highlights=off`)
    expect(pixelsNear(before, cell, TEAL)).toBe(0)
    expect(pixelsNear(after, cell, TEAL)).toBeGreaterThan(40)
    expect(pixelsNear(after, cell, INK)).toBe(0)
  })

  it("should tint the step's focus cells amber with highlights on, and leave them plain with highlights off", async () => {
    const k = outline.outline.steps.findIndex((s) => s.focus.some((c) => outline.outline.puzzle.givens[c] === '.')) + 1
    const focus = outline.outline.steps[k - 1]!.focus.find((c) => outline.outline.puzzle.givens[c] === '.')!
    expect(pixelsNear(await picture(`?step=${k}`), focus, AMBER)).toBeGreaterThan(100)
    expect(pixelsNear(await picture(`?step=${k}&highlights=off`), focus, AMBER)).toBe(0)
  })

  it('should send the picture as a file named after the puzzle, take, step and shape', async () => {
    const res = await as('presenter').get(picturePath('?step=3&shape=square&highlights=off')).buffer(true)
    expect(res.status).toBe(200)
    expect(res.headers['content-disposition']).toBe('attachment; filename=project-euler-96-grid-01-take-1-grid-step-3-square-plain.png')
  })

  it('should refuse a step past the last one with a sentence that names the range', async () => {
    const count = outline.outline.steps.length
    const res = await as('editor').get(picturePath(`?step=${count + 1}`))
    expect(res.status).toBe(400)
    expect(res.body).toEqual({ code: 'step-out-of-range', message: `This take has ${count} steps; pick a step from 0 to ${count}` })
  })

  it('should refuse a shape it does not make', async () => {
    const res = await as('editor').get(picturePath('?shape=round'))
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^query\.shape: /)
  })

  it("should answer a viewer 404 (no hint the take exists) and another channel's owner 404", async () => {
    expect((await as('viewer').get(picturePath(''))).status).toBe(404)
    const other = await suite.ownersOtherChannel()
    expect((await as('owner').get(`/api/channels/${other}/outlines/${outline.id}/picture.png`)).status).toBe(404)
  })
})
