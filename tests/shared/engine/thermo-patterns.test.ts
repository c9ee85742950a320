// Deductions that join a house to a thermometer: thermometer pointing, either place of a digit, and
// two tips / two bulbs. Worked examples are constructed here (positions built with the Board API:
// candidates set by hand, thermometers given as paths, bulb first); each states the reasoning that
// makes its expected eliminations true. Paths over tests/fixtures/thermo-puzzles.json and over fresh
// puzzles from our generator (tests/helpers/generate-thermo.ts) are replayed against the SAT solver
// logic-solver (npm) as an independent oracle: no wrong placement, no solution digit removed.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { parseCellName, parsePuzzle, solvePath, type Puzzle, type Step } from '../../../shared/engine/index'
import { Board } from '../../../shared/engine/board'
import type { Deduction, Technique } from '../../../shared/engine/techniques/deduction'
import { thermoEither } from '../../../shared/engine/techniques/thermo-either'
import { thermoEnds } from '../../../shared/engine/techniques/thermo-ends'
import { thermoPointing } from '../../../shared/engine/techniques/thermo-pointing'
import { soundnessProblems } from '../../helpers/check-path'
import { generateThermo } from '../../helpers/generate-thermo'
import { oracleSolve } from '../../helpers/sat-oracle'

const ALL = 0x1ff
const cell = (name: string) => parseCellName(name) as number
const mask = (digits: number[]) => digits.reduce((m, d) => m | (1 << (d - 1)), 0)
const row = (r: number) => Array.from({ length: 9 }, (_, i) => `r${r}c${i + 1}`)
const column = (c: number) => Array.from({ length: 9 }, (_, i) => `r${i + 1}c${c}`)
const box = (b: number) => Array.from({ length: 9 }, (_, i) => `r${3 * Math.floor((b - 1) / 3) + Math.floor(i / 3) + 1}c${3 * ((b - 1) % 3) + (i % 3) + 1}`)

/** An empty grid, every candidate open, the given thermometers (cell names, bulb first). */
function position(thermometers: string[][]): Board {
  return new Board(new Uint8Array(81), new Uint16Array(81).fill(ALL), thermometers.map((t) => Int8Array.from(t.map(cell))))
}
/** Leaves a digit only in `homes` among the house's cells. */
function onlyIn(board: Board, house: string[], digit: number, homes: string[]): void {
  for (const name of house) if (!homes.includes(name)) board.cand[cell(name)] &= ~mask([digit])
}
/** Every deduction a technique finds on a position, each applied before looking again. */
function exhaust(technique: Technique, board: Board): Deduction[] {
  const found: Deduction[] = []
  for (let guard = 0; guard < 50; guard++) {
    const d = technique.find(board, [])
    if (!d) return found
    found.push(d)
    for (const e of d.eliminations) board.eliminate(e.cell, mask(e.digits))
  }
  throw new Error('technique did not settle')
}
/** Eliminations as { r3c4: [digits] }, merged over deductions. */
function removed(found: Deduction[]): Record<string, number[]> {
  const out: Record<string, number[]> = {}
  for (const d of found) for (const e of d.eliminations) out[`r${Math.floor(e.cell / 9) + 1}c${(e.cell % 9) + 1}`] = [...(out[`r${Math.floor(e.cell / 9) + 1}c${(e.cell % 9) + 1}`] ?? []), ...e.digits].sort()
  return out
}

describe('thermometer pointing (constructed positions)', () => {
  test('every 4 of box 1 lies before r4c4 on its thermometer, the nearest two places before: r4c4 is at least 6', () => {
    // thermometer r1c1 → r2c2 → r3c3 → r4c4; box 1 keeps its 4 only in r1c1 and r2c2; r3c3 already 5-9.
    // Whichever holds the 4, r4c4 is at least two places further up: 4 + 2 = 6 or more.
    const board = position([['r1c1', 'r2c2', 'r3c3', 'r4c4']])
    onlyIn(board, box(1), 4, ['r1c1', 'r2c2'])
    board.cand[cell('r3c3')] = mask([5, 6, 7, 8, 9])
    const found = exhaust(thermoPointing, board)
    expect(removed(found)).toEqual({ r4c4: [1, 2, 3, 4, 5] })
    expect(found[0].facts).toEqual({
      kind: 'thermo-pointing',
      digit: 4,
      house: { kind: 'box', index: 0 },
      side: 'before',
      homes: [
        { cell: cell('r1c1'), thermometer: 0, steps: 3 },
        { cell: cell('r2c2'), thermometer: 0, steps: 2 },
      ],
      cell: cell('r4c4'),
      bound: 6,
    })
    expect(found[0].technique).toBe('thermo-pointing')
    expect(found[0].focus).toEqual([cell('r1c1'), cell('r2c2'), cell('r4c4')])
  })

  test('mirror: every 6 of box 9 lies after r6c6, the nearest two places after: r6c6 is at most 4', () => {
    // thermometer r6c6 → r7c7 → r8c8 → r9c9; box 9 keeps its 6 only in r8c8 and r9c9; r7c7 already 1-5.
    const board = position([['r6c6', 'r7c7', 'r8c8', 'r9c9']])
    onlyIn(board, box(9), 6, ['r8c8', 'r9c9'])
    board.cand[cell('r7c7')] = mask([1, 2, 3, 4, 5])
    const found = exhaust(thermoPointing, board)
    expect(removed(found)).toEqual({ r6c6: [5, 6, 7, 8, 9] })
    expect(found[0].facts).toMatchObject({ side: 'after', bound: 4, cell: cell('r6c6') })
  })

  test('places on two different thermometers through the cell: row 1 keeps its 3 in r1c7 and r1c9, both just before r2c8', () => {
    // thermometers r1c7 → r2c8 and r1c9 → r2c8 (they meet at r2c8): either way r2c8 exceeds 3.
    const board = position([['r1c7', 'r2c8'], ['r1c9', 'r2c8']])
    onlyIn(board, row(1), 3, ['r1c7', 'r1c9'])
    const found = exhaust(thermoPointing, board)
    expect(removed(found)).toEqual({ r2c8: [1, 2, 3] })
    expect(found[0].facts).toMatchObject({ homes: [{ cell: cell('r1c7'), thermometer: 0, steps: 1 }, { cell: cell('r1c9'), thermometer: 1, steps: 1 }] })
    expect(found[0].reason.thermometers).toEqual([0, 1])
  })

  test('must not fire when one place is off the thermometer, or the places lie on both sides', () => {
    // box 1's 4 also fits r1c3, which is on no thermometer: nothing is known about r4c4
    const off = position([['r1c1', 'r2c2', 'r3c3', 'r4c4']])
    onlyIn(off, box(1), 4, ['r1c1', 'r2c2', 'r1c3'])
    off.cand[cell('r3c3')] = mask([5, 6, 7, 8, 9])
    expect(thermoPointing.find(off, [])).toBeNull()
    // row 5's 5 in r5c1 (before r5c2) or r5c3 (after it): r5c2 could be above or below a 5
    const sides = position([['r5c1', 'r5c2', 'r5c3']])
    onlyIn(sides, row(5), 5, ['r5c1', 'r5c3'])
    onlyIn(sides, box(4), 5, ['r5c1', 'r5c3'])
    sides.cand[cell('r5c2')] = mask([2, 3, 4, 6, 7, 8])
    expect(thermoPointing.find(sides, [])).toBeNull()
    // no thermometers at all
    expect(thermoPointing.find(position([]), [])).toBeNull()
  })
})

describe('either place of a digit (constructed positions)', () => {
  test('box 1 keeps its 5 in r2c1 or r3c3: r2c4 sees the first and sits right after the second, so it is no 5', () => {
    // If r2c1 is 5, r2c4 shares row 2 with it; if r3c3 is 5, r2c4 (next on the thermometer) is above 5.
    const board = position([['r3c3', 'r2c4']])
    onlyIn(board, box(1), 5, ['r2c1', 'r3c3'])
    board.cand[cell('r3c3')] = mask([1, 2, 3, 4, 5, 6, 7, 8]) // not 9: it has a cell after it
    board.cand[cell('r2c4')] = mask([2, 3, 4, 5, 6, 7, 8, 9])
    const found = exhaust(thermoEither, board)
    expect(removed(found)).toEqual({ r2c4: [5] })
    expect(found[0].facts).toEqual({
      kind: 'thermo-either',
      digit: 5,
      house: { kind: 'box', index: 0 },
      cell: cell('r2c4'),
      homes: [
        { via: 'house', cell: cell('r2c1'), house: { kind: 'row', index: 1 } },
        { via: 'thermometer', cell: cell('r3c3'), thermometer: 0, side: 'before', steps: 1 },
      ],
    })
  })

  test('places two before and two after the cell: r3c5 is at least 7 or at most 3, so it loses 4, 5 and 6', () => {
    // thermometer r4c4 → r3c4 → r3c5 → r3c6 → r4c6; row 4 keeps its 5 in r4c4 and r4c6.
    // If r4c4 is 5, r3c5 is 7 or more; if r4c6 is 5, r3c5 is 3 or less. Its neighbours on the
    // thermometer are limited the same way: r3c4 (one after r4c4, three before r4c6) loses 3, 4 and
    // 5; r3c6 (three after, one before) loses 5, 6 and 7. The places themselves too: r4c4 is the 5,
    // or r4c6 is and r4c4, four places before it, is 1; r4c6 is the 5, or 9 four places after r4c4.
    const board = position([['r4c4', 'r3c4', 'r3c5', 'r3c6', 'r4c6']])
    onlyIn(board, row(4), 5, ['r4c4', 'r4c6'])
    const found = exhaust(thermoEither, board)
    expect(removed(found)).toEqual({ r3c4: [3, 4, 5], r3c5: [4, 5, 6], r3c6: [5, 6, 7], r4c4: [2, 3, 4, 6, 7, 8, 9], r4c6: [1, 2, 3, 4, 6, 7, 8] })
  })

  test('the cell is one of the two places: row 1 keeps its 7 in r1c5 → r1c6, so r1c6 is 7 or more and r1c5 is 7 or less', () => {
    // r1c6 is the 7 itself, or r1c5 is and r1c6 (right after it) is above 7; mirrored for r1c5.
    const board = position([['r1c5', 'r1c6']])
    onlyIn(board, row(1), 7, ['r1c5', 'r1c6'])
    const found = exhaust(thermoEither, board)
    expect(removed(found)).toEqual({ r1c5: [8, 9], r1c6: [1, 2, 3, 4, 5, 6] })
    const facts = found.map((d) => d.facts).find((f) => f.kind === 'thermo-either' && f.cell === cell('r1c6'))
    expect(facts).toMatchObject({ homes: [{ via: 'thermometer', cell: cell('r1c5'), side: 'before', steps: 1 }, { via: 'itself', cell: cell('r1c6') }] })
  })

  test('must not fire with three places, with no thermometer between place and cell, or with both places on one side (pointing)', () => {
    const three = position([['r3c3', 'r2c4']])
    onlyIn(three, box(1), 5, ['r2c1', 'r3c3', 'r1c2'])
    three.cand[cell('r3c3')] = mask([1, 2, 3, 4, 5, 6, 7, 8])
    three.cand[cell('r2c4')] = mask([2, 3, 4, 5, 6, 7, 8, 9])
    expect(thermoEither.find(three, [])).toBeNull()
    // r8c8 shares nothing with r2c1: if r2c1 is the 5, r8c8 could still be 5
    const unseen = position([['r3c3', 'r8c8']])
    onlyIn(unseen, box(1), 5, ['r2c1', 'r3c3'])
    unseen.cand[cell('r3c3')] = mask([1, 2, 3, 4, 5, 6, 7, 8])
    unseen.cand[cell('r8c8')] = mask([2, 3, 4, 5, 6, 7, 8, 9])
    expect(thermoEither.find(unseen, [])).toBeNull()
    const oneSide = position([['r1c1', 'r2c2', 'r3c3', 'r4c4']])
    onlyIn(oneSide, box(1), 4, ['r1c1', 'r2c2'])
    oneSide.cand[cell('r3c3')] = mask([5, 6, 7, 8, 9])
    // (the places keep only what the other place allows them, so they give nothing either)
    oneSide.cand[cell('r1c1')] = mask([1, 2, 3, 4])
    oneSide.cand[cell('r2c2')] = mask([4, 5, 6, 7])
    expect(thermoEither.find(oneSide, [])).toBeNull()
    expect(thermoPointing.find(oneSide, [])).not.toBeNull()
  })
})

describe('two tips / two bulbs (constructed positions)', () => {
  test('row 5 keeps its 8 in r5c2 and r5c8, each just before a tip: one of r4c2 and r6c8 is 9, so cells seeing both are not', () => {
    // Whichever of r5c2, r5c8 is the 8, its tip must be 9 (above 8, at most 9). The cells that see
    // both r4c2 and r6c8: r4c7-r4c9 (row 4 and box 6) and r6c1-r6c3 (box 4 and row 6).
    const board = position([['r5c2', 'r4c2'], ['r5c8', 'r6c8']])
    onlyIn(board, row(5), 8, ['r5c2', 'r5c8'])
    const found = exhaust(thermoEnds, board)
    expect(removed(found)).toEqual({ r4c7: [9], r4c8: [9], r4c9: [9], r6c1: [9], r6c2: [9], r6c3: [9] })
    expect(found).toHaveLength(1)
    expect(found[0].facts).toEqual({
      kind: 'thermo-ends',
      digit: 8,
      house: { kind: 'row', index: 4 },
      end: 'tip',
      homes: [
        { cell: cell('r5c2'), thermometer: 0, end: cell('r4c2') },
        { cell: cell('r5c8'), thermometer: 1, end: cell('r6c8') },
      ],
      eliminated: ['r4c7', 'r4c8', 'r4c9', 'r6c1', 'r6c2', 'r6c3'].map(cell),
    })
  })

  test('bulbs: column 5 keeps its 2 in r2c5 and r8c5, each right after a bulb: one of r2c4 and r8c6 is 1', () => {
    // Whichever of them is the 2, the bulb before it must be 1. Cells seeing both bulbs: r1c6-r3c6
    // (box 2 and column 6) and r7c4-r9c4 (column 4 and box 8).
    const board = position([['r2c4', 'r2c5'], ['r8c6', 'r8c5']])
    onlyIn(board, column(5), 2, ['r2c5', 'r8c5'])
    const found = exhaust(thermoEnds, board)
    expect(removed(found)).toEqual({ r1c6: [1], r2c6: [1], r3c6: [1], r7c4: [1], r8c4: [1], r9c4: [1] })
    expect(found[0].facts).toMatchObject({ end: 'bulb', digit: 2 })
  })

  test('a longer run: 6 with three cells to climb on each side still forces both tips', () => {
    // r5c1 → r4c1 → r3c1 → r2c1 and r5c9 → r6c9 → r7c9 → r8c9: a 6 in r5c1 makes r4c1-r2c1 7, 8, 9.
    const board = position([['r5c1', 'r4c1', 'r3c1', 'r2c1'], ['r5c9', 'r6c9', 'r7c9', 'r8c9']])
    onlyIn(board, row(5), 6, ['r5c1', 'r5c9'])
    expect(removed(exhaust(thermoEnds, board))).toEqual({ r2c9: [9], r8c1: [9] })
  })

  test('must not fire when a place has the wrong room to the tip, has three places, or the digit is 9', () => {
    // two cells after r5c2: an 8 there would break its thermometer, nothing is forced
    const room = position([['r5c2', 'r4c2', 'r3c2'], ['r5c8', 'r6c8']])
    onlyIn(room, row(5), 8, ['r5c2', 'r5c8'])
    expect(thermoEnds.find(room, [])).toBeNull()
    const three = position([['r5c2', 'r4c2'], ['r5c8', 'r6c8']])
    onlyIn(three, row(5), 8, ['r5c2', 'r5c5', 'r5c8'])
    expect(thermoEnds.find(three, [])).toBeNull()
    // 9 only on two tips is locked-candidates ground: left to that technique
    const nines = position([['r4c2', 'r5c2'], ['r6c8', 'r5c8']])
    onlyIn(nines, row(5), 9, ['r5c2', 'r5c8'])
    expect(thermoEnds.find(nines, [])).toBeNull()
  })
})

interface Fixture {
  id: string
  title: string
  givens: string
  thermometers: string[][]
}
const fixtures = (JSON.parse(readFileSync(new URL('../../fixtures/thermo-puzzles.json', import.meta.url), 'utf8')) as { puzzles: Fixture[] }).puzzles
// Fresh puzzles the engine was not tuned on: the benchmark's seeds (scripts/bench-engine.ts).
const generated: Fixture[] = Array.from({ length: 30 }, (_, i) => generateThermo(5000 + i)).map((g) => ({ id: `seed ${g.seed}`, ...g }))
const NEW = new Set(['thermo-pointing', 'thermo-either', 'thermo-ends'])

describe('solve paths with the new techniques (oracle: logic-solver)', () => {
  const runs = [...fixtures, ...generated].map((f) => ({ f, puzzle: parsePuzzle(f).puzzle as Puzzle, result: solvePath(f) }))

  test.each(runs.map((r) => [r.f.id, r] as const))('%s: every step sound against the oracle', (_, { f, puzzle, result }) => {
    const o = oracleSolve(f.givens, f.thermometers.map((t) => t.map(cell)))
    expect(o.count).toBe(1)
    expect(soundnessProblems(puzzle, result.steps, o.solution!)).toEqual([])
    expect(result.status).toBe('solved')
  })

  test('each new technique fires on these puzzles, always before any contradiction would be needed', () => {
    const steps: Step[] = runs.flatMap((r) => r.result.steps)
    for (const t of NEW) expect(steps.some((s) => s.technique === t), t).toBe(true)
    // they only remove candidates, and their one-line text names the house and the digit
    for (const s of steps.filter((x) => NEW.has(x.technique))) {
      expect(s.placements).toEqual([])
      expect(s.eliminations.length).toBeGreaterThan(0)
      expect(s.text).toMatch(/(row|column|box) \d/)
    }
  })
})
