/** Grid state after any number of steps, for the replay slider; a plain replay costs microseconds. */
import { Board } from './board'
import type { GridState, Puzzle, Step } from './types'

/** State after step k (0 = before any step, steps.length = after all). */
export function stateAt(puzzle: Puzzle, steps: readonly Step[], k: number): GridState {
  if (!Number.isInteger(k) || k < 0 || k > steps.length) throw new Error(`stateAt: k must be an integer from 0 to ${steps.length}, got ${k}`)
  const board = Board.fromPuzzle(puzzle)
  for (let i = 0; i < k; i++) board.apply(steps[i], i)
  const givens = new Uint8Array(81)
  for (let c = 0; c < 81; c++) givens[c] = puzzle.givens[c] ? 1 : 0
  return { digits: board.digits, candidates: board.cand, marks: k ? steps[k - 1].marks.slice() : [], givens }
}
