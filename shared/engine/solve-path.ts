/**
 * The solve loop: at each step take the easiest technique that finds something, and among
 * equally easy ones the deduction nearest the previous step, since a presenter stays in one area.
 */
import { Board } from './board'
import { gridString } from '../grid'
import { parsePuzzle } from './parse'
import { TIERS } from './techniques/index'
import type { Deduction } from './techniques/deduction'
import { distance } from './techniques/deduction'
import { describeStep } from './text'
import type { Cell, Puzzle, SolveResult, Step } from './types'
import { uniquenessErrors } from './validate'

/** A human-style solve path for a puzzle (JSON object, JSON string or 81-character givens). */
export function solvePath(input: unknown): SolveResult {
  const { puzzle, errors } = parsePuzzle(input)
  if (!puzzle) return { status: 'invalid', steps: [], grid: '.'.repeat(81), difficulty: 0, errors }
  const problems = uniquenessErrors(puzzle)
  if (problems.length) return { status: 'invalid', steps: [], grid: gridString(puzzle.givens), difficulty: 0, errors: problems }
  return runPath(puzzle)
}

/** The path for a puzzle already known to be valid. */
function runPath(puzzle: Puzzle): SolveResult {
  const board = Board.fromPuzzle(puzzle)
  const steps: Step[] = []
  const marks = new Set<Cell>()
  let near: Cell[] = []
  // Assumptions already refuted by a what-if (cell × 9 + digit − 1). Their candidate is gone, so a
  // repeat can't be found; the check keeps a technique that misreads the board from saying one twice.
  const refuted = new Set<number>()
  // Each step removes at least one candidate, so 729 bounds the loop even if a technique misbehaves.
  while (!board.isSolved() && steps.length < 729) {
    const deduction = nextDeduction(board, near)
    if (!deduction) break
    if (deduction.facts.kind === 'contradiction') {
      const key = deduction.facts.cell * 9 + deduction.facts.assumed - 1
      if (refuted.has(key)) throw new Error(`solvePath: the what-if ${deduction.facts.assumed} in cell ${deduction.facts.cell} was already refuted`)
      refuted.add(key)
    }
    board.apply(deduction, steps.length)
    for (const p of deduction.placements) marks.delete(p.cell)
    if (!deduction.placements.length) {
      for (const c of deduction.focus) if (!board.digits[c]) marks.add(c)
      for (const e of deduction.eliminations) if (!board.digits[e.cell]) marks.add(e.cell)
    }
    steps.push({ ...deduction, marks: [...marks].sort((a, b) => a - b), text: describeStep(deduction) })
    near = deduction.focus
  }
  let difficulty = 0
  for (const s of steps) difficulty = Math.max(difficulty, s.difficulty)
  return { status: board.isSolved() ? 'solved' : 'stuck', steps, grid: gridString(board.digits), difficulty }
}

function nextDeduction(board: Board, near: readonly Cell[]): Deduction | null {
  for (const tier of TIERS) {
    let best: Deduction | null = null
    let bestDistance = Infinity
    for (const technique of tier) {
      const found = technique.find(board, near)
      if (!found) continue
      const d = distance(found.focus, near)
      if (d < bestDistance) {
        best = found
        bestDistance = d
      }
    }
    if (best) return best
  }
  return null
}
