/**
 * Replaying a solve path's placements over the givens: what the grid shows before a line.
 * Only digits matter to the script (is this thermometer finished?), so candidates aren't tracked.
 */
import type { Step } from '../engine/types'

/** Digits (0 = empty) after the first `count` steps have been played. */
export function digitsAfter(givens: string, steps: Step[], count: number): Uint8Array {
  const grid = new Uint8Array(81)
  for (let i = 0; i < 81; i++) grid[i] = givens[i] === '.' ? 0 : Number(givens[i])
  for (let k = 0; k < count && k < steps.length; k++) {
    for (const p of steps[k].placements) grid[p.cell] = p.digit
  }
  return grid
}
