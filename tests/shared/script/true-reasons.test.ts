// Issue #13 "Defects seen": one small position per defect, each built by hand on the GT03 solution
// (tests/shared/script/steps.ts) so digits never clash. What counts as a true reason is sudoku and
// thermometer practice: a digit in a house blocks the house's other cells; a thermometer rises
// strictly from bulb to tip (common practice).
import { describe, expect, test } from 'vitest'
import type { Step } from '../../../shared/engine/types'
import { buildOutline } from '../../../shared/script/index'
import { renderLine } from '../../../shared/script/narrate'
import { estimateMs, lineActions, TIMING } from '../../../shared/script/timing'
import { thermoWords, wordCount } from '../../../shared/script/words'
import { THERMO_A, THERMO_B, contradiction, hiddenSingle, nakedPair, nakedSingle, puzzle, rc, result, sol, thermoBounds, thermoLength } from './steps'

const phrasings = (steps: Step[], k: number, names: 'words' | 'coords' = 'coords', over = {}) => {
  const o = buildOutline(puzzle(over), result(steps, 'stuck'), { names })
  return [0, 1, 2, 3].map((p) => renderLine(o, { kind: 'step', steps: [k] }, p))
}

describe('false reasons', () => {
  test('a last candidate that sees only an 8 never says it "sees" the digits pencil marks took out', () => {
    // r4c5 sees only one placed digit; the others went with a pair in row 4 (step 0)
    const cell = rc(4, 5)
    const digit = sol(cell)
    const pair = nakedPair({ kind: 'row', index: 3 }, [rc(4, 1), rc(4, 2)], [3, 8], [cell])
    const seen = digit === 8 ? 7 : 8
    const gone = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => d !== digit && d !== seen)
    const single: Step = {
      ...nakedSingle(cell),
      facts: { kind: 'single-cell', cell, digit, seen: { row: [], column: [seen], box: [], ruledOut: gone }, ruledOutBy: gone.map((d) => ({ digit: d, step: 0 })) },
    }
    for (const text of phrasings([pair, single], 1)) {
      expect(text).toMatch(/ruled out earlier with the pair in row 4/)
      expect(text).not.toMatch(/sees: 1|row, column and box|thermometer/)
      expect(text).toMatch(new RegExp(`an? ${seen} in its column|its column (already )?holds ${seen}`, 'i'))
    }
  })

  test('a bound from a given or placed digit says the digit, not a limit ("is a 9", never "can\'t go above 9")', () => {
    // THERMO_B's tip r3c9 is a given 9 in the solution: the cells before it stay below 9
    const bounds = thermoBounds(1, THERMO_B, 'max', sol(rc(3, 9)))
    const givens = new Array(81).fill(0)
    givens[rc(3, 9)] = sol(rc(3, 9))
    for (const text of phrasings([bounds], 0, 'coords', { givens }).slice(0, 3)) {
      expect(text).toContain(`r3c9, is a ${sol(rc(3, 9))}`)
      expect(text).not.toMatch(/at most|can't go above|tops out/)
    }
  })
})

describe('pointers a viewer can follow', () => {
  test('"this box" only when the line before was in that box; otherwise the box is named', () => {
    const elsewhere = [nakedSingle(rc(9, 9)), hiddenSingle(rc(2, 2), 'box')]
    for (const text of phrasings(elsewhere, 1, 'words')) {
      expect(text).not.toMatch(/this box/)
      expect(text).toMatch(/the top-left box/i)
    }
    const same = [nakedSingle(rc(1, 1)), hiddenSingle(rc(2, 2), 'box')]
    expect(phrasings(same, 1, 'words').some((t) => /this box/.test(t))).toBe(true)
  })

  test('a thermometer is named by the box most of it lies in, not by the box of its bulb', () => {
    // bulb r3c4 (top-middle box), the other three cells in the top-left box
    const bent = [rc(3, 4), rc(3, 3), rc(2, 3), rc(1, 3)]
    const n = { style: 'words' as const, thermometers: [bent, THERMO_B] }
    expect(thermoWords(0, n)).toBe('the thermometer in the top-left box')
    // split evenly between two boxes: named by its bulb instead
    const even = [rc(3, 2), rc(3, 3), rc(3, 4), rc(2, 4)]
    expect(thermoWords(0, { ...n, thermometers: [even, THERMO_B, [rc(9, 1), rc(9, 2)]] })).toBe('the thermometer starting at row 3, column 2')
    expect(thermoWords(0, { style: 'coords', thermometers: [bent] })).toBe('the r3c4 thermometer')
  })

  test('cells inside a named row are not named with the row again ("in row 4, row 4, columns …")', () => {
    const pair = nakedPair({ kind: 'row', index: 3 }, [rc(4, 1), rc(4, 7)], [3, 8], [rc(4, 8)])
    for (const text of phrasings([pair], 0, 'words').slice(0, 3)) expect(text).not.toMatch(/row 4, row 4/)
  })
})

describe('bounds said naturally', () => {
  test('two digits left are "x or y"; every changed cell is said, the tip included, never "and so on"', () => {
    const path = [rc(5, 1), rc(5, 2), rc(5, 3), rc(6, 3), rc(7, 3)]
    const bounds: Step = {
      ...thermoBounds(0, path, 'min', 2),
      facts: {
        kind: 'thermo-bounds',
        thermometer: 0,
        direction: 'min',
        fromCell: path[0],
        fromDigit: 2,
        withSudoku: false,
        ranges: [
          { cell: path[1], min: 3, max: 4 },
          { cell: path[2], min: 4, max: 6 },
          { cell: path[3], min: 5, max: 8 },
          { cell: path[4], min: 6, max: 9 },
        ],
      },
    }
    for (const text of phrasings([bounds], 0, 'words', { thermometers: [path] }).slice(0, 3)) {
      expect(text).toContain('3 or 4')
      expect(text).toContain('4 to 6')
      expect(text).toMatch(/the tip is 6 to 9/)
      expect(text).not.toMatch(/so on/)
    }
  })

  test('all thermometer lengths one after another are one sentence, not one line each', () => {
    const o = buildOutline(puzzle(), result([thermoLength(0, THERMO_A), thermoLength(1, THERMO_B)], 'stuck'))
    const lines = o.lines.filter((l) => l.kind === 'step')
    expect(lines).toHaveLength(1)
    expect(lines[0].text).toMatch(/has three cells, so its bulb is 7 at most and its tip 3 or more/)
    expect(lines[0].text).toMatch(/has four cells, so its bulb is 6 at most and its tip 4 or more/)
  })
})

describe('folded lines', () => {
  test('a single whose other digits went with pencil marks is not folded into a run', () => {
    const pair = nakedPair({ kind: 'row', index: 3 }, [rc(4, 1), rc(4, 2)], [3, 8], [rc(4, 5)])
    const hidden: Step = { ...hiddenSingle(rc(4, 6), 'row'), facts: { ...(hiddenSingle(rc(4, 6), 'row').facts as Extract<Step['facts'], { kind: 'single-house' }>), blockers: [{ cell: rc(4, 5), step: 1 }] } }
    const steps = [nakedSingle(rc(9, 9)), pair, nakedSingle(rc(4, 4)), hidden, nakedSingle(rc(4, 9))]
    const o = buildOutline(puzzle(), result(steps))
    const lineOf = (k: number) => o.lines.find((l) => l.steps.includes(k))!
    expect(lineOf(3).steps).toEqual([3])
    expect(lineOf(3).text).toMatch(/the pair in row 4 took it out of row 4, column 5/i)
  })
})

describe('what-ifs', () => {
  test('every link is told with what pushed it; none is counted away', () => {
    const base = contradiction(rc(1, 1), 2, rc(9, 1))
    const f = base.facts
    if (f.kind !== 'contradiction') throw new Error('not a contradiction')
    const chain = [
      { technique: 'naked-single' as const, kind: 'place' as const, cell: rc(1, 2), digits: [5], because: { cell: rc(1, 1), digit: 2 } },
      { technique: 'thermo-bounds' as const, kind: 'eliminate' as const, cell: rc(1, 3), digits: [1, 2, 3, 4, 5], thermometer: 0, because: { cell: rc(1, 2), digit: 6 } },
      { technique: 'hidden-single' as const, kind: 'place' as const, cell: rc(2, 3), digits: [7], house: { kind: 'box' as const, index: 0 }, because: { cell: rc(1, 2), digit: 5 } },
    ]
    const step: Step = { ...base, facts: { ...f, chain } }
    for (const text of phrasings([step], 0).slice(0, 3)) {
      expect(text).toMatch(/r1c2 would have to be a 5, once r1c1 is a 2/)
      expect(text).toMatch(/r1c3 comes after r1c2, which would be at least 6/)
      expect(text).toMatch(/box 1 would need its 7 at r2c3, once r1c2 is a 5/)
      expect(text).not.toMatch(/steps later/)
    }
  })

  test('a what-if line is charged for the moves shown on the grid: the assumption and each link', () => {
    const step = contradiction(rc(1, 1), 2, rc(9, 1))
    const o = buildOutline(puzzle(), result([step], 'stuck'))
    const line = o.lines.find((l) => l.kind === 'step')!
    // the stub chain has one placement link and one elimination link (steps.ts)
    expect(lineActions(o, line)).toEqual({ placements: 2, marks: 2 })
    expect(line.estMs).toBe(Math.round((wordCount(line.text) / o.pace) * 60_000 + 2 * TIMING.placementMs + 2 * TIMING.markMs + TIMING.pauseMs))
    expect(line.estMs).toBe(estimateMs(line.text, o.pace, { placements: 2, marks: 2 }))
  })
})
