/**
 * What a technique hands back: a step without the presenter's marks and text, which the
 * solve loop adds. `Picker` keeps the candidate deduction nearest to the previous focus,
 * building each record only when it beats the one held.
 */
import { cellDistance, digitsOf } from '../../grid'
import type { Board } from '../board'
import type { Cell, Elimination, Step } from '../types'

export type Deduction = Omit<Step, 'marks' | 'text'>

/** One technique module: the deduction nearest to `near`, or null when it finds nothing. */
export interface Technique {
  find(board: Board, near: readonly Cell[]): Deduction | null
}

export class Picker {
  best: Deduction | null = null
  private bestDistance = Infinity

  constructor(private readonly near: readonly Cell[]) {}

  /** Offers a deduction about `focus`; `build` runs only when it is nearer than the one held. */
  offer(focus: readonly Cell[], build: () => Deduction | null): void {
    const d = distance(focus, this.near)
    if (d >= this.bestDistance) return
    const made = build()
    if (made) {
      this.best = made
      this.bestDistance = d
    }
  }

  /** True once nothing can beat the held deduction (distance 0). */
  get settled(): boolean {
    return this.bestDistance === 0
  }
}

/** Smallest distance between any cell of `a` and any of `b`; 0 when either is empty. */
export function distance(a: readonly Cell[], b: readonly Cell[]): number {
  if (!a.length || !b.length) return 0
  let best = 9
  for (const x of a) for (const y of b) {
    const d = cellDistance(x, y)
    if (d < best) best = d
  }
  return best
}

/** Elimination records for cells that still hold some of `mask`. */
export function eliminationsOf(board: Board, cells: Iterable<Cell>, mask: number): Elimination[] {
  const out: Elimination[] = []
  for (const c of cells) {
    if (board.digits[c]) continue
    const hit = board.cand[c] & mask
    if (hit) out.push({ cell: c, digits: digitsOf(hit) })
  }
  return out
}
