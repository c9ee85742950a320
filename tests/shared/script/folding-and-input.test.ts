import { describe, expect, test } from 'vitest'
import { buildOutline } from '../../../shared/script/index'
import { aDigit } from '../../../shared/script/words'
import { THERMO_A, contradiction, hiddenSingle, nakedSingle, puzzle, rc, result, sol, thermoLength } from './steps'

describe('buildOutline folding', () => {
  test('a run of easy placements on one thermometer becomes one line that says it finishes it', () => {
    // r9c9 first (the break-in stays a line of its own), then the three cells of the top-left thermometer.
    const steps = [hiddenSingle(rc(9, 9)), nakedSingle(THERMO_A[0]), hiddenSingle(THERMO_A[1], 'row'), nakedSingle(THERMO_A[2])]
    const o = buildOutline(puzzle(), result(steps))
    const lines = o.lines.filter((l) => l.kind === 'step')
    expect(lines.map((l) => l.steps)).toEqual([[0], [1, 2, 3]])
    // every digit with its cell (issue #13): a run never lists bare digits
    expect(lines[1].text).toMatch(/(finishes|completes|is done now).*the thermometer in the top-left box.*a 3 at row 1, column 1; a 6 at row 1, column 2; and an 8 at row 1, column 3\.$/i)
    const coords = buildOutline(puzzle(), result(steps), { names: 'coords' })
    expect(coords.lines[2].text).toContain('r1c1 is 3, r1c2 is 6 and r1c3 is 8')
  })

  test('a run in one box that leaves it unfinished is folded without claiming to finish it', () => {
    const steps = [hiddenSingle(rc(9, 9)), hiddenSingle(rc(4, 4)), nakedSingle(rc(5, 5)), hiddenSingle(rc(6, 6))]
    const o = buildOutline(puzzle(), result(steps))
    const run = o.lines.find((l) => l.steps.length === 3)!
    expect(run.text).toContain(`${sol(rc(4, 4))} at row 4, column 4; ${aDigit(sol(rc(5, 5)))} at row 5, column 5; and ${aDigit(sol(rc(6, 6)))} at row 6, column 6`)
    expect(run.text).not.toMatch(/finish|complete|done/)
  })

  test('the break-in and harder steps are never folded; every step is covered once, in order', () => {
    const steps = [nakedSingle(rc(1, 1)), nakedSingle(rc(1, 2)), thermoLength(0, THERMO_A), nakedSingle(rc(2, 1)), nakedSingle(rc(2, 2))]
    const o = buildOutline(puzzle(), result(steps))
    expect(o.lines.flatMap((l) => l.steps)).toEqual([0, 1, 2, 3, 4])
    expect(o.lines.find((l) => l.steps.includes(0))!.steps).toEqual([0])
    expect(o.lines.find((l) => l.steps.includes(2))!.steps).toEqual([2])
    expect(o.lines.find((l) => l.steps.includes(3))!.steps).toEqual([3, 4])
  })
})

describe('buildOutline(bad input) => clear errors', () => {
  const ok = [nakedSingle(rc(1, 1))]
  test('empty steps', () => {
    expect(() => buildOutline(puzzle(), result([]))).toThrow('the solve path is empty: there are no steps to narrate')
  })
  test('an invalid puzzle result', () => {
    const r = { ...result([]), status: 'invalid' as const, errors: [{ code: 'no-solution' as const, message: 'the puzzle has no solution', cells: [] }] }
    expect(() => buildOutline(puzzle(), r)).toThrow('the puzzle is invalid, so there is nothing to narrate: the puzzle has no solution')
  })
  test('steps from another puzzle: a placement on a given', () => {
    const givens = new Array(81).fill(0)
    givens[rc(1, 1)] = 5
    expect(() => buildOutline(puzzle({ givens }), result(ok))).toThrow("step 1 doesn't belong to this puzzle: it places 3 at r1c1, which already holds 5")
  })
  test('steps from another puzzle: a clash in a house', () => {
    const givens = new Array(81).fill(0)
    givens[rc(1, 9)] = 3
    expect(() => buildOutline(puzzle({ givens }), result(ok))).toThrow("step 1 doesn't belong to this puzzle: it places 3 at r1c1, and r1c9 already holds 3")
  })
  test('steps from another puzzle: a thermometer it does not have', () => {
    expect(() => buildOutline(puzzle({ thermometers: [] }), result([thermoLength(0, THERMO_A)]))).toThrow(
      "step 1 doesn't belong to this puzzle: it uses thermometer 1, and the puzzle has 0",
    )
  })
  test('a malformed step', () => {
    const broken = { ...contradiction(rc(1, 1), 2, rc(2, 2)), facts: { kind: 'contradiction', cell: 99 } }
    expect(() => buildOutline(puzzle(), result([broken as never]))).toThrow(/^step 1 is malformed: facts/)
  })
  test.each([0, 59, 401, Number.NaN, -160])('pace %s', (pace) => {
    expect(() => buildOutline(puzzle(), result(ok), { pace })).toThrow(/^pace must be/)
  })
  test('pace 60 and 400 are the limits and are accepted', () => {
    expect(buildOutline(puzzle(), result(ok), { pace: 60 }).pace).toBe(60)
    expect(buildOutline(puzzle(), result(ok), { pace: 400 }).pace).toBe(400)
  })
  test('a target shorter than the intro', () => {
    expect(() => buildOutline(puzzle(), result(ok), { targetMs: 5_000 })).toThrow(/^target 0:05 is shorter than the intro \(0:\d\d\)$/)
  })
})
