/**
 * Takes remember the puzzle version they were solved on; a changed grid makes them stale, says what changed,
 * and "find the path again" keeps the lines people wrote where the steps still happen.
 * Puzzle: Project Euler problem 96, grid 01 (tests/fixtures/classic-puzzles.json; its solution was computed with
 * a SAT solver, so a digit given from it keeps the puzzle unique).
 */
import { describe, expect, it } from 'vitest'
import { scriptOf } from '../../shared/schemas/outline'
import type { OutlineRecord, PuzzleRecord } from '../../shared/schemas/studio'
import { editLineText } from '../../shared/script/index'
import { stepKey } from '../../shared/takes/carry-edits'
import { useApiSuite } from '../helpers/api'
import { draftOf, fixture } from '../helpers/studio'

let grid: PuzzleRecord
let take: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    grid = await suite.createPuzzle(draftOf('PE01', { title: 'Tuesday grid' }))
    take = (await suite.as('presenter').post(`/api/channels/${suite.channelId}/puzzles/${grid.id}/outlines`, {})).body
  },
})
const as = api.as
const puzzlePath = () => `/api/channels/${api.channelId}/puzzles/${grid.id}`
const outlinePath = () => `/api/channels/${api.channelId}/outlines/${take.id}`

const savePuzzle = (changes: Record<string, unknown>, version = grid.version) =>
  as('owner').put(puzzlePath(), { ...draftOf('PE01', { title: 'Tuesday grid' }), ...changes, version })

/** The grid with one more given: the solution's digit in the cell the take's first step line fills. */
function oneMoreGiven(): { givens: string; cell: number } {
  const line = take.outline.lines.find((l) => l.kind === 'step')!
  const cell = take.outline.steps[line.steps[0]].placements[0].cell
  const { givens, solution } = fixture('PE01')
  return { givens: givens.slice(0, cell) + solution[cell] + givens.slice(cell + 1), cell }
}

describe('stale takes', () => {
  it('should record the puzzle version a take was made from, and call it current', async () => {
    expect(take.puzzleVersion).toBe(grid.version)
    expect(take.puzzleChanges).toBeNull()
    const list = (await as('editor').get(`${puzzlePath()}/outlines`)).body
    expect(list[0]).toMatchObject({ id: take.id, puzzleVersion: grid.version, puzzleChanges: null })
  })

  it('should say who saved a take last: its maker, then each person who saves it', async () => {
    const presenter = (await as('presenter').get('/api/auth/me')).body.user
    expect(take.savedBy).toEqual({ id: presenter.id, name: presenter.name })
    const saved = await as('editor').patch(outlinePath(), { version: take.version, script: scriptOf(editLineText(take.outline, take.outline.lines[1].id, 'New words.')) })
    const editor = (await as('editor').get('/api/auth/me')).body.user
    expect(saved.body.savedBy).toEqual({ id: editor.id, name: editor.name })
    expect((await as('owner').get(outlinePath())).body.savedBy).toEqual({ id: editor.id, name: editor.name })
    // the one a refused save gets back names them too
    const refused = await as('owner').patch(outlinePath(), { version: take.version, script: scriptOf(take.outline) })
    expect(refused.status).toBe(409)
    expect(refused.body.details.current.savedBy).toEqual({ id: editor.id, name: editor.name })
  })

  it('should keep takes current through a save that leaves the grid alone, and not bump the version of an unchanged save', async () => {
    const same = await savePuzzle({})
    expect(same.status).toBe(200)
    expect(same.body.version).toBe(grid.version)
    const renamed = await savePuzzle({ title: 'Tuesday grid, renamed' })
    expect(renamed.body).toMatchObject({ version: grid.version + 1, staleOutlineCount: 0 })
    expect((await as('editor').get(outlinePath())).body).toMatchObject({ puzzleVersion: grid.version + 1, puzzleChanges: null })
  })

  it('should flag a take stale after its givens change, say what changed, and count it in the Library', async () => {
    const before = (await as('editor').get(outlinePath())).headers.etag
    const saved = await savePuzzle({ givens: oneMoreGiven().givens })
    expect(saved.body.staleOutlineCount).toBe(1)
    const read = await as('editor').get(outlinePath())
    // the take reads differently now, so its ETag must change too
    expect(read.headers.etag).not.toBe(before)
    expect(read.body).toMatchObject({ puzzleVersion: grid.version, puzzleChanges: { givens: { added: 1, removed: 0, changed: 0 }, thermometers: { added: 0, removed: 0 } } })
    const library = (await as('editor').get(`/api/channels/${api.channelId}/puzzles`)).body
    expect(library.find((p: PuzzleRecord) => p.id === grid.id)).toMatchObject({ outlineCount: 1, staleOutlineCount: 1 })
  })

  it('should find the path again, keeping edited lines whose steps still happen and handing back the words of those that don’t', async () => {
    const stepLines = take.outline.lines.filter((l) => l.kind === 'step')
    const [gone, staying] = [stepLines[0], stepLines[stepLines.length - 1]]
    let edited = editLineText(take.outline, gone.id, 'This one is now a given.')
    edited = editLineText(edited, staying.id, 'And that finishes the Tuesday grid.')
    const saved = await as('editor').patch(outlinePath(), { version: take.version, script: scriptOf(edited) })
    expect(saved.status).toBe(200)
    await savePuzzle({ givens: oneMoreGiven().givens })

    const refreshed = await as('presenter').post(`${outlinePath()}/refresh`, { version: saved.body.version })
    expect(refreshed.status).toBe(200)
    const { take: fresh, kept, lost } = refreshed.body
    expect(lost).toEqual(['This one is now a given.'])
    expect(kept).toBe(1)
    expect(fresh).toMatchObject({ id: take.id, name: take.name, version: saved.body.version + 1, puzzleVersion: grid.version + 1, puzzleChanges: null })
    expect(fresh.outline.puzzle.givens).toBe(oneMoreGiven().givens)
    const carried = fresh.outline.lines.find((l: { text: string }) => l.text === 'And that finishes the Tuesday grid.')
    expect(carried.steps.map((i: number) => stepKey(fresh.outline.steps[i]))).toEqual(staying.steps.map((i) => stepKey(take.outline.steps[i])))
    // no fresh step places the new given again
    expect(fresh.outline.steps.some((s: OutlineRecord['outline']['steps'][number]) => s.placements.some((p) => p.cell === oneMoreGiven().cell))).toBe(false)
  })

  it('should refuse to find the path again over a save it did not see (409), and say so for a non-unique puzzle (422)', async () => {
    expect((await as('presenter').post(`${outlinePath()}/refresh`, { version: take.version + 5 })).status).toBe(409)
    await savePuzzle({ givens: '.'.repeat(81) })
    const res = await as('presenter').post(`${outlinePath()}/refresh`, { version: take.version })
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/more than one solution/)
  })
})
