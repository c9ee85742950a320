/**
 * "Find the path again" keeps a person's lines where the steps still happen.
 * Puzzle: Project Euler problem 96, grid 01 (tests/fixtures/classic-puzzles.json), solved by our engine; its
 * solution in the fixture was computed with a SAT solver, so a digit given from it is a true digit of the grid.
 */
import { describe, expect, test } from 'vitest'
import classic from '../../fixtures/classic-puzzles.json'
import { parsePuzzle, solvePath } from '../../../shared/engine/index'
import { buildOutline, editLineText, hideLine, type Outline } from '../../../shared/script/index'
import { outlineSchema, scriptProblems } from '../../../shared/schemas/outline'
import { carryEdits, stepKey } from '../../../shared/takes/carry-edits'

const grid01 = (classic as { puzzles: { givens: string; solution: string }[] }).puzzles[0]

function outlineOf(givens: string): Outline {
  const file = { title: 'Grid one', givens, thermometers: [] as string[][] }
  const { puzzle } = parsePuzzle(file)
  return buildOutline(puzzle!, solvePath(file))
}

const old = outlineOf(grid01.givens)
const stepLines = old.lines.filter((l) => l.kind === 'step')

/** The old take with a person's words on some lines and one line hidden. */
function worked(): Outline {
  let o = editLineText(old, old.lines[0].id, 'Welcome back to the Tuesday grid.')
  for (const line of [stepLines[0], stepLines[3], stepLines[stepLines.length - 1]]) o = editLineText(o, line.id, `My words for line ${line.id}.`)
  return hideLine(o, stepLines[5].id)
}

const keysOf = (o: Outline, lineId: number) => o.lines.find((l) => l.id === lineId)!.steps.map((i) => stepKey(o.steps[i]))

describe('carryEdits', () => {
  test('the same path keeps every edited and hidden line', () => {
    const before = worked()
    const { outline, kept, lost } = carryEdits(before, outlineOf(grid01.givens))
    expect(lost).toEqual([])
    expect(kept).toBe(5)
    expect(outline.lines.map((l) => [l.text, l.hidden, l.edited])).toEqual(before.lines.map((l) => [l.text, l.hidden, l.edited]))
  })

  test('a new given removes the step that placed it; that line is reported lost and the others keep their words', () => {
    // give the digit the first edited step line placed (the SAT solution's digit there)
    const placed = old.steps[stepLines[0].steps[0]].placements[0]
    expect(placed).toBeDefined()
    const changed = grid01.givens.slice(0, placed.cell) + grid01.solution[placed.cell] + grid01.givens.slice(placed.cell + 1)
    const fresh = outlineOf(changed)
    const before = worked()
    const { outline, kept, lost } = carryEdits(before, fresh)
    // the intro and the later lines still happen in the fresh path
    expect(kept).toBeGreaterThanOrEqual(2)

    expect(lost.map((l) => l.id)).toContain(stepLines[0].id)
    expect(outlineSchema.safeParse(outline).success).toBe(true)
    expect(scriptProblems(outline, outline.steps.length)).toEqual([])
    expect(outline.steps).toEqual(fresh.steps)
    // every kept step line sits on the same technique, cells and digits it was written for
    for (const line of before.lines.filter((l) => l.kind === 'step' && l.edited && !lost.includes(l))) {
      const carried = outline.lines.find((l) => l.text === line.text)
      expect(carried, line.text).toBeDefined()
      expect(keysOf(outline, carried!.id)).toEqual(keysOf(before, line.id))
    }
    expect(outline.lines[0].text).toBe('Welcome back to the Tuesday grid.')
  })

  test('unedited lines take the fresh narration', () => {
    const { outline } = carryEdits(old, outlineOf(grid01.givens))
    expect(outline.lines.every((l) => !l.edited)).toBe(true)
  })
})
