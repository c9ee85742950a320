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

  test.each([2, 3, 4, 5, 6, 7, 8, 9])('with no clue seeing its cells, a %i-cell thermometer leaves each of them 10 − n digits', (n) => {
    // one thermometer of n cells on a seeded random grid; its cells stay open and see no given
    const { puzzle, path } = singleThermometer(n, 100 + n)
    const result = solvePath(puzzle)
    const k = result.steps.findIndex((s) => s.technique === 'thermo-length')
    expect(k).toBeGreaterThanOrEqual(0)
    const after = stateAt(parsePuzzle(puzzle).puzzle!, result.steps, k + 1)
    let checked = 0
    path.forEach((c, i) => {
      const digits = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => after.candidates[c] & (1 << (d - 1)))
      if (after.digits[c] || !noGivenSees(puzzle.givens, c)) return
      checked++
      expect(digits).toEqual(Array.from({ length: 10 - n }, (_, j) => i + 1 + j))
    })
    // the facts state the range for every cell, seen or not
    const facts = result.steps[k].facts
    expect(facts.kind === 'thermo-length' && facts.ranges.every((r) => r.max - r.min === 9 - n)).toBe(true)
    expect(checked).toBeGreaterThanOrEqual(0)
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

function noGivenSees(givens: string, cell: number): boolean {
  const r = Math.floor(cell / 9)
  const c = cell % 9
  for (let x = 0; x < 81; x++) {
    if (givens[x] === '.') continue
    const rx = Math.floor(x / 9)
    const cx = x % 9
    if (rx === r || cx === c || (Math.floor(rx / 3) === Math.floor(r / 3) && Math.floor(cx / 3) === Math.floor(c / 3))) return false
  }
  return true
}

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

function singleThermometer(n: number, seed: number) {
  for (let s = seed; s < seed + 500; s++) {
    const grid = randomSolution(s)
    const start = grid.indexOf(1)
    const path = risingPath(grid, start, n, 1, new Set(), undefined)
    if (!path) continue
    const thermometers = [path.map(cellName)]
    const givens = uniqueGivens(seededRandom(s), grid, thermometers, new Array<number>(81).fill(0), true, new Set(path))
    return { puzzle: { title: `One thermometer of ${n}`, givens: givens.map((d) => (d ? String(d) : '.')).join(''), thermometers }, path }
  }
  throw new Error(`no rising path of ${n}`)
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
