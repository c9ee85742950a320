// Property tests (fast-check): random solution grids, thermometers that rise along them and givens
// until unique, from our own seeded generator (tests/helpers/generate-thermo.ts). The SAT solver
// logic-solver (npm) confirms each puzzle independently; every path must be sound.
import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { expect, test } from 'vitest'
import { countSolutions, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle } from '../../../shared/engine/index'
import { soundnessProblems } from '../../helpers/check-path'
import { generateThermo } from '../../helpers/generate-thermo'
import type { TierSet } from '../../helpers/thermo-tiers'
import { oracleSolve } from '../../helpers/sat-oracle'

test('generated puzzles: oracle and exact solver agree; paths are sound; stuck paths keep the solution', () => {
  fc.assert(
    fc.property(fc.integer({ min: 1000, max: 1_000_000 }), fc.integer({ min: 1, max: 7 }), fc.boolean(), (seed, count, minimize) => {
      const g = generateThermo(seed, { thermometers: count, minimize })
      const o = oracleSolve(g.givens, g.thermometers.map((p) => p.map((n) => parseCellName(n) as number)))
      expect(o).toEqual({ count: 1, solution: g.solution })
      const puzzle = parsePuzzle(g).puzzle as Puzzle
      expect(countSolutions(puzzle)).toEqual({ count: 1, solution: g.solution })
      const result = solvePath(g)
      expect(soundnessProblems(puzzle, result.steps, g.solution)).toEqual([])
      if (result.status === 'solved') expect(result.grid).toBe(g.solution)
      else {
        expect(result.status).toBe('stuck')
        const end = stateAt(puzzle, result.steps, result.steps.length)
        for (let c = 0; c < 81; c++) expect(end.candidates[c] & (1 << (Number(g.solution[c]) - 1))).not.toBe(0)
        // stuck only when truly stuck: no single assumption runs into a dead end by singles and bounds
        expect(failingAssumption(end.candidates, puzzle.thermometers)).toBeNull()
      }
    }),
    { numRuns: 15, seed: 20240517 },
  )
}, 60_000)

test('the independent dead-end finder above is not blind: it finds one wherever the engine makes a contradiction step', () => {
  let checked = 0
  // generated puzzles rarely need a what-if now: the hard tier of the three-tier set still does
  const hard = (JSON.parse(readFileSync(new URL('../../fixtures/thermo-tiers.json', import.meta.url), 'utf8')) as TierSet).tiers.hard
  for (const g of [...[600, 601, 602, 603, 604, 605].map((seed) => generateThermo(seed)), ...hard]) {
    const puzzle = parsePuzzle(g).puzzle as Puzzle
    const result = solvePath(g)
    result.steps.forEach((step, k) => {
      if (step.technique !== 'contradiction') return
      checked++
      expect(failingAssumption(stateAt(puzzle, result.steps, k).candidates, puzzle.thermometers)).not.toBeNull()
    })
  }
  expect(checked).toBeGreaterThan(0)
}, 60_000)

test('classic grids with random givens removed stay sound (or are rejected as not unique)', () => {
  const base = '483921657967345821251876493548132976729564138136798245372689514814253769695417382' // PE01 solution (oracle-checked in classic.test.ts)
  fc.assert(
    fc.property(fc.uniqueArray(fc.integer({ min: 0, max: 80 }), { minLength: 40, maxLength: 58 }), (holes) => {
      const givens = [...base].map((d, c) => (holes.includes(c) ? '.' : d)).join('')
      const result = solvePath(givens)
      const o = oracleSolve(givens)
      if (o.count !== 1) expect(result.status).toBe('invalid')
      else expect(soundnessProblems(parsePuzzle(givens).puzzle!, result.steps, base)).toEqual([])
    }),
    { numRuns: 20, seed: 7 },
  )
}, 60_000)

/**
 * An assumption (cell, digit) that singles and thermometer bounds, followed to the end, drive into
 * a cell or a house with no option; null when there is none. Written here independently of the
 * engine (common practice: the rules of sudoku and of thermometers).
 */
function failingAssumption(start: Uint16Array, thermometers: number[][]): [number, number] | null {
  const houses: number[][] = []
  for (let i = 0; i < 9; i++) {
    houses.push(Array.from({ length: 9 }, (_, j) => i * 9 + j), Array.from({ length: 9 }, (_, j) => j * 9 + i))
    houses.push(Array.from({ length: 9 }, (_, j) => (3 * Math.floor(i / 3) + Math.floor(j / 3)) * 9 + 3 * (i % 3) + (j % 3)))
  }
  const single = (m: number) => m !== 0 && (m & (m - 1)) === 0
  const consistent = (cand: Uint16Array): boolean => {
    for (let changed = true; changed; ) {
      changed = false
      const set = (c: number, m: number) => {
        if (m !== cand[c]) {
          cand[c] = m
          changed = true
        }
      }
      for (const h of houses) {
        for (const c of h) if (single(cand[c])) for (const p of h) if (p !== c) set(p, cand[p] & ~cand[c])
        for (let bit = 1; bit < 512; bit <<= 1) {
          const places = h.filter((c) => cand[c] & bit)
          if (!places.length) return false
          if (places.length === 1) set(places[0], bit)
        }
      }
      for (const path of thermometers) {
        for (let i = 1; i < path.length; i++) {
          const low = cand[path[i - 1]] & -cand[path[i - 1]]
          set(path[i], cand[path[i]] & ~((low << 1) - 1))
        }
        for (let i = path.length - 2; i >= 0; i--) {
          const high = 1 << (31 - Math.clz32(cand[path[i + 1]]))
          set(path[i], cand[path[i]] & (high - 1))
        }
      }
      if (cand.some((m) => m === 0)) return false
    }
    return true
  }
  for (let c = 0; c < 81; c++) {
    if (single(start[c])) continue
    for (let d = 1; d <= 9; d++) {
      if (!(start[c] & (1 << (d - 1)))) continue
      const cand = start.slice()
      cand[c] = 1 << (d - 1)
      if (!consistent(cand)) return [c, d]
    }
  }
  return null
}
