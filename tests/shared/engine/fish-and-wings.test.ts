// Fish (X-wing, swordfish) and wings (XY-wing, XYZ-wing, W-wing).
// Hand-made positions (from memory: textbook patterns) are laid out on the givens of the English
// Wikipedia example (tests/fixtures/classic-puzzles.json, WIKI1): a few candidates are taken out by
// hand to shape each pattern. The SAT solver logic-solver (npm) gives that puzzle's solution, and
// every hand removal and every expected elimination is checked against it, so each position is one
// the real puzzle can reach and each deduction keeps the true digit.
// Solve paths: Project Euler 96 (classic fixture), our generated thermometer fixtures
// (tests/helpers/generate-thermo.ts) and fresh generator seeds, every step replayed against the oracle.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { Board } from '../../../shared/engine/board'
import { cellName, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../../shared/engine/index'
import type { Deduction, Technique } from '../../../shared/engine/techniques/deduction'
import { fish } from '../../../shared/engine/techniques/fish'
import { wWing } from '../../../shared/engine/techniques/w-wing'
import { xyWing } from '../../../shared/engine/techniques/xy-wing'
import { xyzWing } from '../../../shared/engine/techniques/xyz-wing'
import { soundnessProblems } from '../../helpers/check-path'
import { generateThermo } from '../../helpers/generate-thermo'
import { oracleSolve } from '../../helpers/sat-oracle'

interface Fixture {
  id: string
  title: string
  givens: string
  thermometers?: string[][]
}
const load = (name: string) => (JSON.parse(readFileSync(new URL(`../../fixtures/${name}`, import.meta.url), 'utf8')) as { puzzles: Fixture[] }).puzzles
const classic = load('classic-puzzles.json')
const WIKI = classic.find((p) => p.id === 'WIKI1')!.givens
const SOLUTION = oracleSolve(WIKI).solution!

const cell = (name: string) => parseCellName(name) as number
const xWing = fish(2)
const swordfish = fish(3)

// The WIKI1 board after its givens already holds X-wings on 6 and 7 (columns 4 and 6, then columns 2
// and 3); with their eliminations made it holds no fish or wing at all, so each position below has
// only the pattern laid out on it.
const SETTLED = { r9c7: [6], r4c7: [7], r7c3: [7], r2c7: [7], r2c9: [7] }

/**
 * The settled WIKI1 board with `removed` digits taken out by hand, and `keepOnly` cells cut down to
 * the digits given; every removal is checked against the solution.
 */
function position(removed: Record<string, number[]>, keepOnly: Record<string, number[]> = {}): Board {
  const board = Board.fromPuzzle(parsePuzzle(WIKI).puzzle!)
  const out = (name: string, digits: number[]) => {
    for (const d of digits) {
      expect(board.cand[cell(name)] & (1 << (d - 1)), `${name} still holds ${d}`).not.toBe(0)
      expect(SOLUTION[cell(name)], `${name}: the solution's digit stays`).not.toBe(String(d))
      board.eliminate(cell(name), 1 << (d - 1))
    }
  }
  for (const [name, digits] of Object.entries({ ...SETTLED })) out(name, digits)
  for (const [name, digits] of Object.entries(removed)) out(name, digits)
  for (const [name, digits] of Object.entries(keepOnly)) {
    out(name, [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => !digits.includes(d) && board.cand[cell(name)] & (1 << (d - 1))))
    expect(board.cand[cell(name)]).toBe(digits.reduce((m, d) => m | (1 << (d - 1)), 0))
  }
  return board
}

/** Finds with the pattern's own cells as the previous focus, so a pattern elsewhere can't win on nearness. */
function found(technique: Technique, board: Board, near: string[]): Deduction | null {
  return technique.find(board, near.map(cell))
}

const named = (d: Deduction) => d.eliminations.map((e) => `${cellName(e.cell)}:${e.digits.join('')}`).sort()
const keepsSolution = (d: Deduction) => d.eliminations.every((e) => !e.digits.includes(Number(SOLUTION[e.cell])))

describe('hand-made positions on WIKI1 (from memory: textbook patterns; solution by logic-solver)', () => {
  test('the plain WIKI1 board holds X-wings; once they are used, no fish or wing is left', () => {
    const plain = Board.fromPuzzle(parsePuzzle(WIKI).puzzle!)
    expect(found(xWing, plain, ['r1c4'])?.facts).toMatchObject({ kind: 'fish', digit: 6, baseLines: [{ kind: 'column', index: 3 }, { kind: 'column', index: 5 }] })
    const board = position({})
    for (const t of [xWing, swordfish, xyWing, xyzWing, wWing]) for (let c = 0; c < 81; c++) expect(t.find(board, [c])).toBeNull()
  })

  // Rows 1 and 7 keep their 4 only in columns 3 and 9: r1c3/r7c9 or r1c9/r7c3.
  const X_WING = { r1c6: [4], r1c7: [4], r1c8: [4] }
  test('X-wing on 4 in rows 1 and 7, columns 3 and 9 clears the rest of both columns', () => {
    const d = found(xWing, position(X_WING), ['r1c3'])!
    expect(d.technique).toBe('x-wing')
    expect(named(d)).toEqual(['r2c3:4', 'r2c9:4', 'r3c9:4', 'r9c3:4'])
    expect(d.facts).toEqual({
      kind: 'fish',
      digit: 4,
      baseLines: [{ kind: 'row', index: 0 }, { kind: 'row', index: 6 }],
      coverLines: [{ kind: 'column', index: 2 }, { kind: 'column', index: 8 }],
      cells: ['r1c3', 'r1c9', 'r7c3', 'r7c9'].map(cell),
      eliminated: ['r2c3', 'r2c9', 'r3c9', 'r9c3'].map(cell),
    })
    expect(d.focus).toEqual(['r1c3', 'r1c9', 'r7c3', 'r7c9'].map(cell))
    expect(d.difficulty).toBe(5.5)
    expect(keepsSolution(d)).toBe(true)
  })

  test('no X-wing while row 1 keeps a third place for its 4 (r1c8)', () => {
    const { r1c8: _kept, ...rest } = X_WING
    expect(found(xWing, position(rest), ['r1c3'])).toBeNull()
  })

  // Rows 2, 4 and 6 keep their 4 only in columns 6, 7 and 8, two places each.
  const SWORDFISH = { r2c2: [4], r2c3: [4], r2c9: [4], r4c8: [4], r6c7: [4] }
  test('swordfish on 4 in rows 2, 4 and 6, columns 6, 7 and 8 clears the rest of the three columns', () => {
    const board = position(SWORDFISH)
    expect(xWing.find(board, [])).toBeNull() // a true three-line pattern, no X-wing inside it
    const d = found(swordfish, board, ['r4c7'])!
    expect(d.technique).toBe('swordfish')
    expect(named(d)).toEqual(['r1c6:4', 'r1c7:4', 'r1c8:4', 'r3c6:4', 'r3c7:4', 'r9c7:4'])
    expect(d.facts).toMatchObject({
      kind: 'fish',
      digit: 4,
      baseLines: [1, 3, 5].map((index) => ({ kind: 'row', index })),
      coverLines: [5, 6, 7].map((index) => ({ kind: 'column', index })),
      cells: ['r2c7', 'r2c8', 'r4c6', 'r4c7', 'r6c6', 'r6c8'].map(cell),
    })
    expect(d.difficulty).toBe(6.5)
    expect(keepsSolution(d)).toBe(true)
  })

  test('no swordfish while a third row also holds the 4 outside the columns (r2c2)', () => {
    const { r2c2: _kept, ...rest } = SWORDFISH
    expect(found(swordfish, position(rest), ['r4c7'])).toBeNull()
  })

  test('fish work across columns too: the X-wing turned on its side (columns 1 and 7 from the transposed grid)', () => {
    // the same X-wing read down columns: rows 3 and 9 of the 1s in WIKI1 (solution r3c1 and r9c7)
    const board = position({ r9c2: [1], r9c3: [1] })
    const d = found(xWing, board, ['r3c1'])!
    expect(d.facts).toMatchObject({ kind: 'fish', digit: 1, baseLines: [{ kind: 'row', index: 2 }, { kind: 'row', index: 8 }] })
    expect(named(d)).toEqual(['r1c7:1', 'r7c1:1'])
    // columns 1 and 7 as base lines: keep the 1 of columns 1 and 7 only in rows 3 and 9
    const cols = position({ r1c7: [1], r7c1: [1] })
    const e = found(xWing, cols, ['r3c1'])!
    expect(e.facts).toMatchObject({ kind: 'fish', digit: 1, baseLines: [{ kind: 'column', index: 0 }, { kind: 'column', index: 6 }], coverLines: [{ kind: 'row', index: 2 }, { kind: 'row', index: 8 }] })
    expect(named(e)).toEqual(['r9c2:1', 'r9c3:1'])
    expect(keepsSolution(d) && keepsSolution(e)).toBe(true)
  })

  // Pivot r1c8 {1,2}; pincers r1c7 {1,9} (same row) and r4c8 {2,9} (same column).
  const XY = { r1c8: [1, 2], r1c7: [1, 9], r4c8: [2, 9] }
  test('XY-wing: pivot r1c8 (1 or 2), pincers r1c7 (1 or 9) and r4c8 (2 or 9): the cells seeing both pincers lose 9', () => {
    const d = found(xyWing, position({}, XY), ['r1c8'])!
    expect(d.technique).toBe('xy-wing')
    expect(named(d)).toEqual(['r4c7:9', 'r5c7:9', 'r6c7:9'])
    expect(d.facts).toEqual({
      kind: 'wing',
      form: 'xy',
      pivot: cell('r1c8'),
      pivotDigits: [1, 2],
      pincers: [cell('r1c7'), cell('r4c8')],
      pincerDigits: [1, 2],
      digit: 9,
      eliminated: ['r4c7', 'r5c7', 'r6c7'].map(cell),
    })
    expect(d.difficulty).toBe(6)
    expect(keepsSolution(d)).toBe(true)
  })

  test('no XY-wing when the pincers share no digit (r4c8 is 2 or 5)', () => {
    expect(found(xyWing, position({}, { ...XY, r4c8: [2, 5] }), ['r1c8'])).toBeNull()
  })

  // Pivot r4c2 {1,2,5}; pincers r4c8 {2,5} (same row) and r6c2 {1,5} (same box and column).
  const XYZ = { r4c2: [1, 2, 5], r4c8: [2, 5], r6c2: [1, 5] }
  test('XYZ-wing: pivot r4c2 (1, 2 or 5) with r4c8 (2 or 5) and r6c2 (1 or 5): r4c3, seeing all three, loses 5', () => {
    const board = position({}, XYZ)
    expect(xyWing.find(board, [])).toBeNull()
    const d = found(xyzWing, board, ['r4c2'])!
    expect(d.technique).toBe('xyz-wing')
    expect(named(d)).toEqual(['r4c3:5'])
    expect(d.facts).toEqual({
      kind: 'wing',
      form: 'xyz',
      pivot: cell('r4c2'),
      pivotDigits: [1, 2, 5],
      pincers: [cell('r4c8'), cell('r6c2')],
      pincerDigits: [2, 1],
      digit: 5,
      eliminated: [cell('r4c3')],
    })
    expect(d.difficulty).toBe(7)
    expect(keepsSolution(d)).toBe(true)
  })

  test('no XYZ-wing when a pincer holds a digit outside the pivot (r4c8 is 2 or 9)', () => {
    expect(found(xyzWing, position({}, { ...XYZ, r4c8: [2, 9] }), ['r4c2'])).toBeNull()
  })

  // r1c3 and r2c8 both {2,4}, not seeing each other; row 4's 2 only in r4c3 (sees r1c3) and r4c8 (sees r2c8).
  const W_PAIR = { r1c3: [2, 4], r2c8: [2, 4] }
  test('W-wing: r1c3 and r2c8 (2 or 4) joined by row 4\'s two places for 2: cells seeing both lose 4', () => {
    const d = found(wWing, position({ r4c2: [2] }, W_PAIR), ['r1c3'])!
    expect(d.technique).toBe('w-wing')
    expect(named(d)).toEqual(['r1c7:4', 'r1c8:4', 'r1c9:4', 'r2c2:4', 'r2c3:4'])
    expect(d.facts).toEqual({
      kind: 'w-wing',
      cells: [cell('r1c3'), cell('r2c8')],
      digits: [2, 4],
      digit: 4,
      link: { house: { kind: 'row', index: 3 }, digit: 2, cells: [cell('r4c3'), cell('r4c8')] },
      eliminated: ['r1c7', 'r1c8', 'r1c9', 'r2c2', 'r2c3'].map(cell),
    })
    expect(d.difficulty).toBe(7.5)
    expect(keepsSolution(d)).toBe(true)
  })

  test('no W-wing while row 4 keeps a third place for its 2 (r4c2)', () => {
    expect(found(wWing, position({}, W_PAIR), ['r1c3'])).toBeNull()
  })
})

// ---- solve paths -------------------------------------------------------------------------------

const NEW = ['x-wing', 'swordfish', 'xy-wing', 'xyz-wing', 'w-wing'] as const
const paths = (t: string[][]) => t.map((p) => p.map((n) => parseCellName(n) as number))
const corpora: [string, { id: string; givens: string; thermometers: string[][] }[]][] = [
  ['Project Euler 96 and WIKI1 (classic fixture)', classic.map((p) => ({ id: p.id, givens: p.givens, thermometers: [] }))],
  ['generated thermometer fixtures', load('thermo-puzzles.json').map((p) => ({ id: p.id, givens: p.givens, thermometers: p.thermometers ?? [] }))],
  ['fresh generator seeds 7100-7111', Array.from({ length: 12 }, (_, i) => generateThermo(7100 + i)).map((g) => ({ id: `seed ${g.seed}`, givens: g.givens, thermometers: g.thermometers }))],
]

const sees = (a: number, b: number) =>
  a !== b && (Math.floor(a / 9) === Math.floor(b / 9) || a % 9 === b % 9 || (Math.floor(a / 27) === Math.floor(b / 27) && Math.floor((a % 9) / 3) === Math.floor((b % 9) / 3)))
const lineCells = (h: { kind: string; index: number }) => Array.from({ length: 9 }, (_, i) => (h.kind === 'row' ? h.index * 9 + i : i * 9 + h.index))
const digitsIn = (m: number) => [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => m & (1 << (d - 1)))

/** Checks a step's pattern against the candidates before it, with code of its own (the textbook definitions). */
function patternProblems(step: Step, digits: Uint8Array, cand: Uint16Array): string[] {
  const f = step.facts
  const problems: string[] = []
  const has = (c: number, d: number) => !digits[c] && (cand[c] & (1 << (d - 1))) !== 0
  const removes = (d: number) => step.eliminations.every((e) => e.digits.length === 1 && e.digits[0] === d)
  if (f.kind === 'fish') {
    const cover = new Set(f.coverLines.flatMap(lineCells))
    const base = new Set(f.baseLines.flatMap(lineCells))
    if (f.baseLines.length !== f.coverLines.length) problems.push('base and cover differ in size')
    for (const c of base) if (has(c, f.digit) && !cover.has(c)) problems.push(`${cellName(c)} holds ${f.digit} outside the cover`)
    for (const line of f.baseLines) if (digits.some((d, c) => d === f.digit && lineCells(line).includes(c))) problems.push('base line already has the digit')
    for (const e of step.eliminations) if (!cover.has(e.cell) || base.has(e.cell)) problems.push(`${cellName(e.cell)} is not in a cover line outside the base`)
    if (!removes(f.digit)) problems.push('removes another digit')
  } else if (f.kind === 'wing') {
    const [a, b] = f.pincers
    const pivot = digitsIn(cand[f.pivot])
    if (!sees(f.pivot, a) || !sees(f.pivot, b)) problems.push('a pincer does not see the pivot')
    const wantPivot = f.form === 'xy' ? [...f.pincerDigits].sort() : [...f.pincerDigits, f.digit].sort()
    if (pivot.join() !== wantPivot.join()) problems.push(`pivot holds ${pivot.join()}`)
    f.pincers.forEach((p, i) => {
      if (digitsIn(cand[p]).join() !== [f.pincerDigits[i], f.digit].sort().join()) problems.push(`pincer ${cellName(p)} holds ${digitsIn(cand[p]).join()}`)
    })
    for (const e of step.eliminations) {
      if (!sees(e.cell, a) || !sees(e.cell, b) || (f.form === 'xyz' && !sees(e.cell, f.pivot))) problems.push(`${cellName(e.cell)} does not see the whole wing`)
    }
    if (!removes(f.digit)) problems.push('removes another digit')
  } else if (f.kind === 'w-wing') {
    const [c1, c2] = f.cells
    const [l1, l2] = f.link.cells
    for (const c of f.cells) if (digitsIn(cand[c]).join() !== f.digits.join()) problems.push(`${cellName(c)} holds ${digitsIn(cand[c]).join()}`)
    if (sees(c1, c2)) problems.push('the two cells see each other')
    if (!sees(l1, c1) || !sees(l2, c2)) problems.push('a link cell does not see its cell')
    const house = f.link.house
    const cellsOfHouse =
      house.kind === 'box'
        ? Array.from({ length: 9 }, (_, i) => (3 * Math.floor(house.index / 3) + Math.floor(i / 3)) * 9 + 3 * (house.index % 3) + (i % 3))
        : lineCells(house)
    const places = cellsOfHouse.filter((c) => has(c, f.link.digit) || digits[c] === f.link.digit)
    if (places.sort().join() !== [l1, l2].sort().join()) problems.push(`the link digit has places ${places.map(cellName).join(', ')}`)
    if (!f.digits.includes(f.digit) || !f.digits.includes(f.link.digit) || f.digit === f.link.digit) problems.push('digits do not match')
    for (const e of step.eliminations) if (!sees(e.cell, c1) || !sees(e.cell, c2)) problems.push(`${cellName(e.cell)} does not see both cells`)
    if (!removes(f.digit)) problems.push('removes another digit')
  }
  return problems
}

describe('solve paths: every fish and wing step is the textbook pattern and keeps the true digit (oracle: logic-solver)', () => {
  const uses: Record<string, Record<string, number>> = {}
  for (const [name, puzzles] of corpora) {
    test(name, () => {
      const count: Record<string, number> = Object.fromEntries(NEW.map((t) => [t, 0]))
      for (const p of puzzles) {
        const puzzle = parsePuzzle({ title: p.id, givens: p.givens, thermometers: p.thermometers }).puzzle as Puzzle
        const o = oracleSolve(p.givens, paths(p.thermometers))
        expect(o.count, p.id).toBe(1)
        const result = solvePath(puzzle)
        expect(result.status, p.id).toBe('solved')
        expect(soundnessProblems(puzzle, result.steps, o.solution!), p.id).toEqual([])
        result.steps.forEach((step, k) => {
          if (!(NEW as readonly string[]).includes(step.technique)) return
          count[step.technique]++
          const before = stateAt(puzzle, result.steps, k)
          expect(patternProblems(step, before.digits, before.candidates), `${p.id} step ${k + 1}`).toEqual([])
          const f = step.facts as { eliminated: number[] }
          expect(f.eliminated, `${p.id} step ${k + 1}`).toEqual(step.eliminations.map((e) => e.cell))
          expect(step.eliminations.length).toBeGreaterThan(0)
        })
      }
      uses[name] = count
    }, 120_000)
  }

  test('the new techniques are used on the generated puzzles (counts per corpus logged)', () => {
    console.info('fish and wing steps per corpus:', JSON.stringify(uses))
    const generated = Object.entries(uses).filter(([name]) => !name.startsWith('Project')).map(([, c]) => c)
    expect(generated.reduce((n, c) => n + Object.values(c).reduce((a, b) => a + b, 0), 0)).toBeGreaterThan(0)
  })
})
