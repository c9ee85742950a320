// Property tests (fast-check): random solution grids, thermometers that rise along them and givens
// until unique, from our own seeded generator (tests/helpers/generate-thermo.ts). The SAT solver
// logic-solver (npm) confirms each puzzle independently; every path must be sound.
import fc from 'fast-check'
import { expect, test } from 'vitest'
import { countSolutions, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle } from '../../../shared/engine/index'
import { soundnessProblems } from '../../helpers/check-path'
import { generateThermo } from '../../helpers/generate-thermo'
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
      }
    }),
    { numRuns: 15, seed: 20240517 },
  )
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
