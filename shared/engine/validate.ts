/** Full validation: structure, then existence and uniqueness of the solution. */
import { findSolutions } from './exact-solver'
import { cellName, gridString } from '../grid'
import { parsePuzzle } from './parse'
import type { Puzzle, ValidationError } from './types'

/** Counts solutions up to `limit` with the exact solver; `solution` is the first one found. */
export function countSolutions(puzzle: Puzzle, limit = 2): { count: number; solution?: string } {
  const found = findSolutions(puzzle.givens, puzzle.thermometers, Math.max(1, limit))
  return found.length ? { count: found.length, solution: gridString(found[0]) } : { count: 0 }
}

/** Every problem with a puzzle, including no solution or more than one. */
export function validatePuzzle(input: unknown): ValidationError[] {
  const { puzzle, errors } = parsePuzzle(input)
  if (!puzzle) return errors
  return uniquenessErrors(puzzle)
}

/** No-solution and multiple-solution errors for a structurally valid puzzle. */
export function uniquenessErrors(puzzle: Puzzle): ValidationError[] {
  const found = findSolutions(puzzle.givens, puzzle.thermometers, 2)
  if (found.length === 0) {
    return [{ code: 'no-solution', message: 'The puzzle has no solution: the givens and thermometers contradict each other.', cells: [] }]
  }
  if (found.length > 1) {
    const [a, b] = found
    const differing: number[] = []
    for (let c = 0; c < 81 && differing.length < 2; c++) if (a[c] !== b[c]) differing.push(c)
    const [x, y] = differing
    return [
      {
        code: 'multiple-solutions',
        message: `The puzzle has more than one solution: for example ${cellName(x)} can be ${a[x]} or ${b[x]}, and ${cellName(y)} ${a[y]} or ${b[y]}.`,
        cells: differing,
      },
    ]
  }
  return []
}
