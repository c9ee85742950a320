// Every validation error: its code, its message and the cells it names. Puzzles here are hand-made
// for the check; uniqueness claims are confirmed by the SAT solver logic-solver (npm).
import { describe, expect, test } from 'vitest'
import { cellName, countSolutions, parsePuzzle, solvePath, validatePuzzle, type ValidationError } from '../../../shared/engine/index'
import { oracleSolve } from '../../helpers/sat-oracle'

// English Wikipedia, article "Sudoku": the example puzzle (see tests/fixtures/classic-puzzles.json)
const WIKI = '53..7....6..195....98....6.8...6...34..8.3..17...2...6.6....28....419..5....8..79'
const file = (givens: string, thermometers: string[][] = []) => ({ title: 'Check', givens, thermometers })
const only = (errors: ValidationError[]) => {
  expect(errors).toHaveLength(1)
  return errors[0]
}

describe('parsePuzzle / validatePuzzle', () => {
  test('accepts our JSON object, a JSON string and a plain 81-character string alike', () => {
    const a = parsePuzzle(file(WIKI, [['r1c3', 'r1c4']]))
    const b = parsePuzzle(JSON.stringify(file(WIKI, [['r1c3', 'r1c4']])))
    const c = parsePuzzle(WIKI)
    expect(a.errors).toEqual([])
    expect(b.puzzle).toEqual(a.puzzle)
    expect(a.puzzle!.thermometers).toEqual([[2, 3]])
    expect(c.puzzle!.title).toBe('Untitled puzzle')
    expect(Array.from(c.puzzle!.givens)).toEqual(Array.from(a.puzzle!.givens))
    expect(parsePuzzle(WIKI.replaceAll('.', '0')).puzzle).not.toBeNull()
    expect(validatePuzzle(file(WIKI))).toEqual([])
  })

  test('malformed JSON => "not valid JSON"', () => {
    const e = only(validatePuzzle('{"title": "x", "givens": '))
    expect(e.code).toBe('malformed')
    expect(e.message).toMatch(/^The puzzle is not valid JSON/)
    expect(e.cells).toEqual([])
  })

  test('missing or mistyped fields => malformed, naming the field', () => {
    expect(only(validatePuzzle({ givens: WIKI, thermometers: [] }))).toMatchObject({ code: 'malformed', cells: [] })
    expect(only(validatePuzzle({ givens: WIKI, thermometers: [] })).message).toContain('"title"')
    expect(only(validatePuzzle({ title: 'x', givens: 42 })).message).toContain('"givens"')
    expect(only(validatePuzzle({ title: 'x', givens: WIKI, thermometers: 'r1c1' })).message).toContain('"thermometers"')
    expect(only(validatePuzzle(17)).code).toBe('malformed')
  })

  test('givens of the wrong length => givens-length', () => {
    const e = only(validatePuzzle(file(WIKI.slice(1))))
    expect(e).toEqual({ code: 'givens-length', message: 'The givens must be 81 characters (9 rows of 9); this has 80.', cells: [] })
  })

  test('a bad character => givens-character with its cell', () => {
    const e = only(validatePuzzle(file('x' + WIKI.slice(1))))
    expect(e.code).toBe('givens-character')
    expect(e.cells).toEqual([0])
    expect(e.message).toBe('Character 1 of the givens (r1c1) is "x"; use 1-9 for a given and "." for an empty cell.')
  })

  test('two equal givens in a row, a column, a box => duplicate-given with both cells', () => {
    const row = only(validatePuzzle(file('5' + '.'.repeat(7) + '5' + '.'.repeat(72))))
    expect(row).toEqual({ code: 'duplicate-given', message: 'Row 1 has the given 5 more than once: r1c1, r1c9.', cells: [0, 8] })
    const column = only(validatePuzzle(file('7' + '.'.repeat(71) + '7' + '.'.repeat(8))))
    expect(column).toMatchObject({ code: 'duplicate-given', cells: [0, 72] })
    expect(column.message).toBe('Column 1 has the given 7 more than once: r1c1, r9c1.')
    const box = validatePuzzle(file('3' + '.'.repeat(9) + '3' + '.'.repeat(70)))
    expect(box).toEqual([{ code: 'duplicate-given', message: 'Box 1 has the given 3 more than once: r1c1, r2c2.', cells: [0, 10] }])
  })

  test('a thermometer of one cell => thermometer-too-short', () => {
    expect(only(validatePuzzle(file(WIKI, [['r5c5']])))).toEqual({ code: 'thermometer-too-short', message: 'Thermometer 1 has 1 cell; a thermometer needs at least 2.', cells: [40] })
  })

  test('a thermometer of ten cells => thermometer-too-long', () => {
    const path = ['r1c1', 'r1c2', 'r1c3', 'r1c4', 'r1c5', 'r1c6', 'r1c7', 'r1c8', 'r1c9', 'r2c9']
    const e = only(validatePuzzle(file('.'.repeat(81), [path])))
    expect(e.code).toBe('thermometer-too-long')
    expect(e.message).toBe('Thermometer 1 has 10 cells; digits must rise along it, so it can have at most 9.')
    expect(e.cells).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 17])
  })

  test('a thermometer through a cell twice => thermometer-repeated-cell', () => {
    expect(only(validatePuzzle(file(WIKI, [['r4c4', 'r4c5', 'r4c4']])))).toEqual({
      code: 'thermometer-repeated-cell',
      message: 'Thermometer 1 passes through r4c4 twice.',
      cells: [30],
    })
  })

  test('consecutive cells that do not touch => thermometer-not-adjacent; corners do touch', () => {
    expect(only(validatePuzzle(file(WIKI, [['r3c3', 'r3c5']])))).toEqual({
      code: 'thermometer-not-adjacent',
      message: 'Thermometer 1: r3c3 and r3c5 follow each other on it but do not touch (side or corner).',
      cells: [20, 22],
    })
    expect(parsePuzzle(file(WIKI, [['r3c3', 'r4c4']])).errors).toEqual([])
  })

  test('a cell name that is not one => thermometer-bad-cell', () => {
    const e = only(validatePuzzle(file(WIKI, [['r1c1', 'r0c2']])))
    expect(e).toEqual({ code: 'thermometer-bad-cell', message: 'Thermometer 1, cell 2: "r0c2" is not a cell name such as r3c4 (row and column 1-9).', cells: [] })
  })

  test('givens that break a thermometer\'s order => thermometer-order with the cells', () => {
    // WIKI has r1c1 = 5 and r1c2 = 3: a thermometer from r1c1 to r1c2 cannot rise
    expect(only(validatePuzzle(file(WIKI, [['r1c1', 'r1c2']])))).toEqual({
      code: 'thermometer-order',
      message: 'Thermometer 1: r1c1 (5) comes before r1c2 (3), so the digits cannot rise along it.',
      cells: [0, 1],
    })
    // r1c2 = 3 and r2c1 = 6 with one cell between need a gap of two: 3 < x < 6 is fine, so use 5 and 6 (r1c1, r2c1)
    const gap = only(validatePuzzle(file(WIKI, [['r1c1', 'r2c2', 'r2c1']])))
    expect(gap).toMatchObject({ code: 'thermometer-order', cells: [0, 9] })
    expect(gap.message).toBe('Thermometer 1: r1c1 (5) comes before r2c1 (6), so the digits cannot rise along it with room for the cells between.')
    // a given outside its position's range: the bulb of a 3-cell thermometer can be at most 7 (r3c2 is 9)
    expect(only(validatePuzzle(file(WIKI, [['r3c2', 'r2c2', 'r2c3']])))).toEqual({
      code: 'thermometer-order',
      message: 'Thermometer 1: r3c2 is cell 1 of 3, so it must hold 1 to 7; its given is 9.',
      cells: [19],
    })
  })

  test('no solution => no-solution (oracle agrees)', () => {
    // row 1 holds 1-8, so r1c9 must be 9, but r5c9 is already 9
    const givens = '12345678.' + '.'.repeat(35) + '9' + '.'.repeat(36)
    expect(oracleSolve(givens).count).toBe(0)
    expect(only(validatePuzzle(file(givens)))).toEqual({ code: 'no-solution', message: 'The puzzle has no solution: the givens and thermometers contradict each other.', cells: [] })
    expect(solvePath(givens)).toMatchObject({ status: 'invalid', errors: [{ code: 'no-solution' }] })
  })

  test('more than one solution => multiple-solutions with two differing cells as witness (oracle agrees)', () => {
    const empty = '.'.repeat(81)
    expect(oracleSolve(empty).count).toBe(2)
    const e = only(validatePuzzle(file(empty)))
    expect(e.code).toBe('multiple-solutions')
    expect(e.cells).toHaveLength(2)
    expect(e.cells[0]).not.toBe(e.cells[1])
    expect(e.message).toMatch(new RegExp(`^The puzzle has more than one solution: for example ${cellName(e.cells[0])} can be \\d or \\d, and ${cellName(e.cells[1])} \\d or \\d\\.$`))
    // the witness is real: fixing either witness cell to each of its two digits leaves a solvable grid
    const [x] = e.cells
    const [, a, b] = /can be (\d) or (\d)/.exec(e.message)!
    for (const d of [a, b]) expect(countSolutions(parsePuzzle(empty.slice(0, x) + d + empty.slice(x + 1)).puzzle!, 1).count).toBe(1)
  })

  test('a thermometer alone can make a puzzle non-unique or unique; the checks count it', () => {
    // The empty grid with a 9-cell thermometer along row 1 fixes row 1 as 1..9 but still has many solutions.
    const row = ['r1c1', 'r1c2', 'r1c3', 'r1c4', 'r1c5', 'r1c6', 'r1c7', 'r1c8', 'r1c9']
    const e = only(validatePuzzle(file('.'.repeat(81), [row])))
    expect(e.code).toBe('multiple-solutions')
    expect(oracleSolve('.'.repeat(81), [row.map((_, i) => i)]).solution!.slice(0, 9)).toBe('123456789')
    expect(countSolutions(parsePuzzle(file('.'.repeat(81), [row])).puzzle!).solution!.slice(0, 9)).toBe('123456789')
  })
})
