// A classic sudoku has no thermometer, so its narration must never name one. Digits a cell lost to
// earlier steps used to be said as "…its row, column, box and thermometer"; they are now said as
// ruled out earlier. Puzzles: Project Euler problem 96, grids 07 and 43 (tests/fixtures/classic-puzzles.json,
// sources noted in the file); both reach a last-candidate step whose cell lost digits to earlier steps.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../../shared/engine/index'
import { CELL_HOUSES, HOUSES } from '../../../shared/grid'
import { buildOutline, refreshNarration } from '../../../shared/script/index'

const data = JSON.parse(readFileSync(new URL('../../fixtures/classic-puzzles.json', import.meta.url), 'utf8')) as {
  puzzles: { id: string; title: string; givens: string }[]
}

const ruledOutOf = (s: Step) => (s.facts.kind === 'single-cell' ? s.facts.seen.ruledOut : [])

describe.each(['PE07', 'PE43'])('Project Euler 96 grid %s', (id) => {
  const fixture = data.puzzles.find((p) => p.id === id)!
  const puzzle = parsePuzzle({ title: fixture.title, givens: fixture.givens, thermometers: [] }).puzzle as Puzzle
  const result = solvePath(puzzle)
  const withRuledOut = result.steps.flatMap((s, k) => (ruledOutOf(s).length > 0 ? [k] : []))

  test('some last-candidate steps lean on digits ruled out by earlier steps, not on the grid', () => {
    expect(withRuledOut.length).toBeGreaterThan(0)
    for (const k of withRuledOut) {
      const f = result.steps[k].facts
      if (f.kind !== 'single-cell') throw new Error('not a single-cell step')
      const before = stateAt(puzzle, result.steps, k)
      const start = stateAt(puzzle, result.steps, 0)
      for (const d of f.seen.ruledOut) {
        const bit = 1 << (d - 1)
        expect(start.candidates[f.cell] & bit, `${d} was a candidate of cell ${f.cell} at the start`).toBe(bit)
        expect(before.candidates[f.cell] & bit, `${d} was gone from cell ${f.cell} before step ${k + 1}`).toBe(0)
        const placed = Array.from(CELL_HOUSES[f.cell]).flatMap((h) => Array.from(HOUSES[h], (c) => before.digits[c]))
        expect(placed).not.toContain(d)
      }
    }
  })

  test.each(['words', 'coords'] as const)('the %s narration never mentions a thermometer, and says what earlier steps ruled out', (names) => {
    const outline = buildOutline(puzzle, result, { names })
    const texts = outline.lines.map((l) => l.text)
    expect(texts.filter((t) => /thermometer/i.test(t))).toEqual([])
    const told = outline.lines.filter((l) => l.steps.length === 1 && withRuledOut.includes(l.steps[0]))
    expect(told.length).toBeGreaterThan(0)
    for (const line of told) expect(line.text).toMatch(/ruled out earlier/)
  })

  test('a take written with the old wording is said in the new one when it opens; an edited line is kept', () => {
    const current = buildOutline(puzzle, result, { names: 'words' })
    const told = current.lines.filter((l) => l.steps.length === 1 && withRuledOut.includes(l.steps[0]))
    const [oldLine, editedLine] = told
    const stored = {
      ...current,
      lines: current.lines.map((l) =>
        l.id === oldLine.id
          ? { ...l, text: l.text.replace(/ruled out earlier/, 'ruled out by the thermometer') }
          : l.id === editedLine?.id
            ? { ...l, text: 'Said my own way, with a thermometer.', edited: true }
            : l,
      ),
    }
    const opened = refreshNarration(stored)
    expect(opened.lines.find((l) => l.id === oldLine.id)!.text).toBe(oldLine.text)
    if (editedLine) expect(opened.lines.find((l) => l.id === editedLine.id)!.text).toBe('Said my own way, with a thermometer.')
    // a take already in the current wording comes back as it was: opening it saves nothing
    expect(refreshNarration(current)).toBe(current)
  })
})
