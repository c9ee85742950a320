// The grid at a replay position, checked against the puzzles' own facts: after the whole path the grid is the
// solution the SAT solver logic-solver (npm, tests/helpers/sat-oracle.ts) finds; before any step it is the givens.
import { describe, expect, test } from 'vitest'
import { boardAt } from '../../../shared/picture/board-at'
import thermoTiers from '../../fixtures/thermo-tiers.json'
import { oracleSolve } from '../../helpers/sat-oracle'
import { outlineFor } from '../../helpers/studio-outline'

const digitsText = (digits: ArrayLike<number>) => Array.from(digits, (d) => (d ? String(d) : '.')).join('')

describe('boardAt', () => {
  test('boardAt(outline, 0) => the givens, flagged as givens, with nothing highlighted', () => {
    const outline = outlineFor('PE01')
    const board = boardAt(outline, 0)
    expect(digitsText(board.digits)).toBe(outline.puzzle.givens)
    expect(Array.from(board.givens, (g) => g === 1)).toEqual(Array.from(outline.puzzle.givens, (ch) => ch !== '.'))
    expect([board.focus, board.reasonCells, board.reasonHouses, board.eliminated, board.placed, board.chain, board.marks]).toEqual([[], [], [], [], [], [], []])
  })

  test('boardAt(outline, last) => the solution the SAT solver finds, thermometers included', () => {
    for (const id of ['PE01', 'GT13']) {
      const outline = outlineFor(id)
      const oracle = oracleSolve(outline.puzzle.givens, outline.puzzle.thermometers)
      expect(digitsText(boardAt(outline, outline.steps.length).digits)).toBe(oracle.solution)
    }
  })

  test("boardAt(outline, k) => the digits placed by steps 1…k and step k's own focus, reasons, removals and placements", () => {
    const outline = outlineFor('GT13')
    const k = outline.steps.findIndex((s) => s.eliminations.length > 0 && s.reason.thermometers.length > 0) + 1
    expect(k).toBeGreaterThan(0)
    const step = outline.steps[k - 1]!
    const board = boardAt(outline, k)
    for (const s of outline.steps.slice(0, k)) for (const p of s.placements) expect(board.digits[p.cell]).toBe(p.digit)
    for (const s of outline.steps.slice(k)) for (const p of s.placements) expect(board.digits[p.cell]).toBe(0)
    expect(board).toMatchObject({
      focus: step.focus,
      reasonCells: step.reason.cells,
      reasonHouses: step.reason.houses,
      reasonThermometers: step.reason.thermometers,
      eliminated: step.eliminations,
      placed: step.placements.map((p) => p.cell),
      marks: step.marks,
      thermometers: outline.puzzle.thermometers,
    })
    // a removed candidate is gone from the cell's mask after its step
    for (const e of step.eliminations) for (const d of e.digits) expect(board.candidates[e.cell]! & (1 << (d - 1))).toBe(0)
  })

  test('boardAt(outline, k) on a contradiction step => the chain from the assumed cell, in order', () => {
    // the first hard puzzle of the tier set whose path still needs a what-if (the engine learns
    // techniques that make them rarer: our other fixtures need none any more)
    const outline = thermoTiers.tiers.hard
      .map((p) => outlineFor(p.id))
      .find((o) => o.steps.some((s) => s.facts.kind === 'contradiction'))
    if (!outline) throw new Error('no fixture path has a contradiction step any more')
    const k = outline.steps.findIndex((s) => s.facts.kind === 'contradiction') + 1
    const { facts } = outline.steps[k - 1]!
    if (facts.kind !== 'contradiction') throw new Error('unreachable: the step was found by its kind')
    expect(boardAt(outline, k).chain).toEqual([facts.cell, ...facts.chain.map((link) => link.cell)])
  })

  test('boardAt(stuck outline, last) => every empty cell shows its candidates: where a person takes over', () => {
    const outline = outlineFor('PE01', { stopAfter: 6 })
    const board = boardAt(outline, 6)
    const empty = Array.from(board.digits.keys()).filter((c) => !board.digits[c])
    expect(board.marks).toEqual(empty)
    expect(boardAt(outline, 5).marks).toEqual(outline.steps[4]!.marks)
  })

  test('boardAt(outline, k) outside the path => clamped to the givens or the last step', () => {
    const outline = outlineFor('PE01')
    expect(boardAt(outline, -3)).toEqual(boardAt(outline, 0))
    expect(boardAt(outline, outline.steps.length + 5)).toEqual(boardAt(outline, outline.steps.length))
  })
})
