// Thermometer logic. Puzzles: tests/fixtures/thermo-puzzles.json (made by our own generator,
// tests/helpers/generate-thermo.ts) and puzzles built here from seeded random grids; each is
// checked against the SAT solver logic-solver (npm) as an independent oracle. Trade facts are
// "common practice" (docs/shared handbook, product facts).
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { cellName, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../../shared/engine/index'
import { soundnessProblems } from '../../helpers/check-path'
import { randomSolution, seededRandom, uniqueGivens } from '../../helpers/generate-thermo'
import { oracleSolve } from '../../helpers/sat-oracle'

interface Fixture {
  id: string
  title: string
  givens: string
  thermometers: string[][]
  solution: string
}
const fixtures = (JSON.parse(readFileSync(new URL('../../fixtures/thermo-puzzles.json', import.meta.url), 'utf8')) as { puzzles: Fixture[] }).puzzles
const paths = (t: string[][]) => t.map((p) => p.map((n) => parseCellName(n) as number))
const solved = fixtures.map((f) => ({ f, puzzle: parsePuzzle(f).puzzle as Puzzle, result: solvePath(f) }))

describe('generated thermometer puzzles (source: tests/helpers/generate-thermo.ts; oracle: logic-solver)', () => {
  test.each(solved.map((s) => [s.f.id, s] as const))('%s: unique by the oracle, path sound and solved', (_, { f, puzzle, result }) => {
    const o = oracleSolve(f.givens, paths(f.thermometers))
    expect(o.count).toBe(1)
    expect(o.solution).toBe(f.solution)
    expect(soundnessProblems(puzzle, result.steps, o.solution!)).toEqual([])
    expect(result.status).toBe('solved')
    expect(result.grid).toBe(o.solution)
  })

  test('the corpus exercises both thermometer techniques and few-given puzzles', () => {
    const used = new Set(solved.flatMap((s) => s.result.steps.map((x) => x.technique)))
    expect(used).toContain('thermo-length')
    expect(used).toContain('thermo-bounds')
    expect(fixtures.filter((f) => [...f.givens].filter((c) => c !== '.').length <= 16).length).toBeGreaterThanOrEqual(4)
    const withSudoku = solved.flatMap((s) => s.result.steps).filter((x) => x.facts.kind === 'thermo-bounds' && x.facts.withSudoku)
    expect(withSudoku.length).toBeGreaterThan(0)
  })
})

describe('trade facts (common practice)', () => {
  test('an n-cell thermometer leaves each cell 10 − n candidates: every length step says so', () => {
    const lengthSteps = solved.flatMap((s) => s.result.steps).filter((x) => x.facts.kind === 'thermo-length')
    expect(lengthSteps.length).toBeGreaterThan(10)
    for (const step of lengthSteps) {
      if (step.facts.kind !== 'thermo-length') continue
      const n = step.facts.length
      step.facts.ranges.forEach((r, i) => {
        expect(r.max - r.min + 1).toBe(10 - n)
        expect(r.min).toBe(i + 1) // position i of n holds i … 9 − n + i
      })
    }
  })

  test.each([2, 3, 4, 5, 6, 7, 8, 9])('a %i-cell thermometer leaves each open cell its 10 − n range; a cell no digit sees keeps all of it', (n) => {
    // one thermometer of n cells on a seeded random grid, its cells kept open; the first seed whose
    // path applies the length rule while some thermometer cell sees no digit at all
    const { puzzle, path, result, k } = singleThermometer(n, 100 + n)
    const parsed = parsePuzzle(puzzle).puzzle!
    const before = stateAt(parsed, result.steps, k)
    const after = stateAt(parsed, result.steps, k + 1)
    let unseen = 0
    path.forEach((c, i) => {
      if (after.digits[c]) return
      const range = Array.from({ length: 10 - n }, (_, j) => i + 1 + j) // position i of n holds i … 9 − n + i
      const seen = seenDigits(before.digits, c)
      const digits = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => after.candidates[c] & (1 << (d - 1)))
      // only the digits its houses already hold are missing from the range
      expect(digits).toEqual(range.filter((d) => !seen.has(d)))
      if (seen.size) return
      unseen++
      expect(digits).toEqual(range)
      expect(digits).toHaveLength(10 - n)
    })
    expect(unseen).toBeGreaterThanOrEqual(1)
    // the facts state the range for every cell, seen or not
    const facts = result.steps[k].facts
    expect(facts.kind === 'thermo-length' && facts.ranges.every((r) => r.max - r.min === 9 - n)).toBe(true)
  })

  test('a 5-cell thermometer whose bulb is 5 reads 5, 6, 7, 8, 9', () => {
    const { puzzle, path } = bulbFiveThermometer()
    const o = oracleSolve(puzzle.givens, [path])
    expect(o.count).toBe(1)
    expect(path.map((c) => o.solution![c]).join('')).toBe('56789')
    const result = solvePath(puzzle)
    expect(result.status).toBe('solved')
    const k = result.steps.findIndex((s) => s.facts.kind === 'thermo-bounds' && s.facts.fromCell === path[0])
    expect(k).toBeGreaterThanOrEqual(0)
    const step = result.steps[k]
    expect(step.facts).toMatchObject({ kind: 'thermo-bounds', direction: 'min', fromDigit: 5 })
    const after = stateAt(parsePuzzle(puzzle).puzzle!, result.steps, k + 1)
    path.forEach((c, i) => expect(after.candidates[c]).toBe(1 << (4 + i)))
    expect(step.text).toContain(`${cellName(path[0])} is at least 5`)
  })

  test('a middle cell never keeps the smallest or largest digit still available on its thermometer', () => {
    // Whenever the engine reaches past thermometer bounds (a harder technique), every thermometer is tight.
    let checked = 0
    for (const { puzzle, result } of solved) {
      result.steps.forEach((step, k) => {
        if (step.difficulty <= 2) return
        const state = stateAt(puzzle, result.steps, k)
        for (const path of puzzle.thermometers) {
          let union = 0
          for (const c of path) union |= state.candidates[c]
          const smallest = 1 << (31 - Math.clz32(union & -union))
          const largest = 1 << (31 - Math.clz32(union))
          for (const c of path.slice(1, -1)) {
            checked++
            expect(state.candidates[c] & (smallest | largest)).toBe(0)
          }
        }
      })
    }
    expect(checked).toBeGreaterThan(50)
  })

  test('past thermometer bounds, each candidate on a thermometer has a smaller one before it and a larger one after it', () => {
    // bounds read the cells' actual candidate sets, holes included, not only their ranges
    let checked = 0
    for (const { puzzle, result } of solved) {
      result.steps.forEach((step, k) => {
        if (step.difficulty <= 2) return
        const state = stateAt(puzzle, result.steps, k)
        for (const path of puzzle.thermometers) {
          path.forEach((c, i) => {
            const has = (x: number, d: number) => (state.candidates[x] & (1 << (d - 1))) !== 0
            for (let d = 1; d <= 9; d++) {
              if (!has(c, d)) continue
              checked++
              if (i > 0) expect([1, 2, 3, 4, 5, 6, 7, 8, 9].some((x) => x < d && has(path[i - 1], x))).toBe(true)
              if (i < path.length - 1) expect([1, 2, 3, 4, 5, 6, 7, 8, 9].some((x) => x > d && has(path[i + 1], x))).toBe(true)
            }
          })
        }
      })
    }
    expect(checked).toBeGreaterThan(500)
  })
})

describe('thermometers that share cells, and bounds combined with sudoku', () => {
  test('two thermometers through one cell: the shared cell carries both bounds, path sound', () => {
    // r5c5 is the tip of one thermometer and the bulb of another, so it sits between both ranges
    const rnd = seededRandom(7)
    for (let seed = 1; seed < 200; seed++) {
      const grid = randomSolution(seed)
      const first = risingPath(grid, 40, 3, -1)
      const second = first && risingPath(grid, first[first.length - 1], 3, 1, new Set(first))
      if (!first || !second) continue
      const pathA = [...first].reverse()
      const thermometers = [pathA.map(cellName), second.map(cellName)]
      const givens = uniqueGivens(rnd, grid, thermometers, new Array<number>(81).fill(0), true)
      const file = { title: 'Shared cell', givens: givens.map((d) => (d ? String(d) : '.')).join(''), thermometers }
      const o = oracleSolve(file.givens, paths(thermometers))
      expect(o.count).toBe(1)
      const result = solvePath(file)
      expect(soundnessProblems(parsePuzzle(file).puzzle!, result.steps, o.solution!)).toEqual([])
      const thermoSteps = result.steps.filter((s) => s.technique.startsWith('thermo'))
      expect(new Set(thermoSteps.map((s) => (s.facts as { thermometer: number }).thermometer)).size).toBe(2)
      expect(thermoSteps.some((s) => s.focus.includes(40))).toBe(true)
      expect(result.status).toBe('solved')
      return
    }
    throw new Error('no grid with two rising paths through r5c5')
  })

  test('a digit already in a house narrows a thermometer cell, and the bound moves on from it', () => {
    const steps: Step[] = solved.flatMap((s) => s.result.steps)
    const fed = steps.find((s) => s.facts.kind === 'thermo-bounds' && s.facts.withSudoku)
    expect(fed).toBeDefined()
    expect(fed!.text).toContain('counting digits already in their houses')
  })
})

/** A king-adjacent path of `length` cells from `start` along which the grid rises (dir 1) or falls (dir −1) by any step. */
function risingPath(grid: number[], start: number, length: number, dir: 1 | -1, avoid = new Set<number>(), exact?: number[]): number[] | null {
  const walk = (path: number[]): number[] | null => {
    if (path.length === length) return path
    const last = path[path.length - 1]
    for (let dr = -1; dr <= 1; dr++) for (let dc = -1; dc <= 1; dc++) {
      const r = Math.floor(last / 9) + dr
      const c = (last % 9) + dc
      if ((!dr && !dc) || r < 0 || r > 8 || c < 0 || c > 8) continue
      const next = r * 9 + c
      if (path.includes(next) || avoid.has(next)) continue
      const want = exact ? grid[next] === exact[path.length] : (grid[next] - grid[last]) * dir > 0
      if (!want) continue
      const found = walk([...path, next])
      if (found) return found
    }
    return null
  }
  return walk([start])
}

/**
 * A puzzle with one n-cell thermometer (cells kept free of givens, and no given where the bulb
 * sees it) whose path applies the length rule (step k) while some thermometer cell sees no digit.
 */
function singleThermometer(n: number, seed: number) {
  for (let s = seed; s < seed + 500; s++) {
    const grid = randomSolution(s)
    const start = grid.indexOf(1)
    const path = risingPath(grid, start, n, 1, new Set(), undefined)
    if (!path) continue
    const thermometers = [path.map(cellName)]
    const keepOpen = new Set([...path, ...peersOf(path[0])])
    const givens = uniqueGivens(seededRandom(s), grid, thermometers, new Array<number>(81).fill(0), true, keepOpen)
    const puzzle = { title: `One thermometer of ${n}`, givens: givens.map((d) => (d ? String(d) : '.')).join(''), thermometers }
    const result = solvePath(puzzle)
    const k = result.steps.findIndex((x) => x.technique === 'thermo-length')
    if (k < 0) continue
    const before = stateAt(parsePuzzle(puzzle).puzzle!, result.steps, k)
    if (path.some((c) => !before.digits[c] && !seenDigits(before.digits, c).size)) return { puzzle, path, result, k }
  }
  throw new Error(`no puzzle with a rising path of ${n} and an unseen cell`)
}

/** Digits placed in the 20 cells sharing a row, column or box with a cell. */
function seenDigits(digits: ArrayLike<number>, cell: number): Set<number> {
  const box = (x: number) => 3 * Math.floor(x / 27) + Math.floor((x % 9) / 3)
  const out = new Set<number>()
  for (let x = 0; x < 81; x++) {
    if (x === cell || !digits[x]) continue
    if (Math.floor(x / 9) === Math.floor(cell / 9) || x % 9 === cell % 9 || box(x) === box(cell)) out.add(digits[x])
  }
  return out
}

/** The 20 cells sharing a row, column or box with a cell. */
function peersOf(cell: number): number[] {
  const box = (x: number) => 3 * Math.floor(x / 27) + Math.floor((x % 9) / 3)
  return Array.from({ length: 81 }, (_, x) => x).filter((x) => x !== cell && (Math.floor(x / 9) === Math.floor(cell / 9) || x % 9 === cell % 9 || box(x) === box(cell)))
}

function bulbFiveThermometer() {
  for (let s = 1; s < 500; s++) {
    const grid = randomSolution(s)
    for (let start = 0; start < 81; start++) {
      if (grid[start] !== 5) continue
      const path = risingPath(grid, start, 5, 1, new Set(), [5, 6, 7, 8, 9])
      if (!path) continue
      const thermometers = [path.map(cellName)]
      const begin = new Array<number>(81).fill(0)
      begin[path[0]] = 5
      const givens = uniqueGivens(seededRandom(s), grid, thermometers, begin, true, new Set(path.slice(1)))
      return { puzzle: { title: 'Bulb five', givens: givens.map((d) => (d ? String(d) : '.')).join(''), thermometers }, path }
    }
  }
  throw new Error('no 5-6-7-8-9 path found')
}
