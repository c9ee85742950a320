/**
 * The working grid a solve path runs on: digits and candidate masks, plus the puzzle's
 * thermometers. A placed cell keeps its own digit as its only candidate, so thermometer
 * bounds read placed and open cells the same way.
 *
 * Provenance: for every candidate that is gone, the board remembers why, so a step can state its
 * true reason ("we ruled that 3 out with the pair in row 4") instead of pointing at houses that
 * don't hold the digit. A candidate is removed either by a digit placed (or given) in a peer,
 * `blockedBy`, or by an earlier step's eliminations, `removedBy`; the first removal wins.
 */
import { ALL_DIGITS, HOUSES, PEERS } from '../grid'
import type { Cell, Digit, Puzzle, Step } from './types'

/** No step or cell: the candidate is still there (or left its cell when the cell itself was filled). */
const NOBODY = -1

export class Board {
  /** the reason of every step applied so far, by step index, so a single can name what its removers used */
  reasons: Step['reason'][] = []

  constructor(
    readonly digits: Uint8Array,
    readonly cand: Uint16Array,
    /** thermometer paths, bulb first */
    readonly thermometers: readonly Int8Array[],
    /** per cell × 9 + digit − 1: index of the step whose eliminations removed it, or NOBODY */
    readonly removedBy: Int16Array = new Int16Array(81 * 9).fill(NOBODY),
    /** per cell × 9 + digit − 1: the peer whose placed or given digit removed it, or NOBODY */
    readonly blockedBy: Int8Array = new Int8Array(81 * 9).fill(NOBODY),
  ) {}

  /** Givens placed and their digits removed from peers; thermometers not yet applied. */
  static fromPuzzle(puzzle: Puzzle): Board {
    const board = new Board(new Uint8Array(81), new Uint16Array(81).fill(ALL_DIGITS), puzzle.thermometers.map((t) => Int8Array.from(t)))
    for (let c = 0; c < 81; c++) {
      const d = puzzle.givens[c]
      if (d >= 1 && d <= 9) board.place(c, d)
    }
    return board
  }

  clone(): Board {
    const copy = new Board(this.digits.slice(), this.cand.slice(), this.thermometers, this.removedBy.slice(), this.blockedBy.slice())
    copy.reasons = this.reasons.slice()
    return copy
  }

  /** Puts a digit in a cell and removes it from the cell's peers, noting the cell as their blocker. */
  place(cell: Cell, digit: Digit): void {
    const bit = 1 << (digit - 1)
    this.digits[cell] = digit
    this.cand[cell] = bit
    const peers = PEERS[cell]
    for (let i = 0; i < 20; i++) {
      const p = peers[i]
      if (!(this.cand[p] & bit)) continue
      this.cand[p] &= ~bit
      this.blockedBy[p * 9 + digit - 1] = cell
    }
  }

  /** Removes a mask of digits from an open cell; `step` is the index of the step doing it. */
  eliminate(cell: Cell, mask: number, step = NOBODY): void {
    let gone = this.cand[cell] & mask
    this.cand[cell] &= ~mask
    while (gone) {
      const bit = gone & -gone
      gone ^= bit
      this.removedBy[cell * 9 + 31 - Math.clz32(bit)] = step
    }
  }

  /** Applies step number `index` (from 0) of a path, recording it as the remover of what it eliminates. */
  apply(step: Pick<Step, 'placements' | 'eliminations' | 'reason'>, index: number): void {
    for (const p of step.placements) this.place(p.cell, p.digit)
    for (const e of step.eliminations) {
      let mask = 0
      for (const d of e.digits) mask |= 1 << (d - 1)
      this.eliminate(e.cell, mask, index)
    }
    this.reasons[index] = step.reason
  }

  /** Mask of digits already placed in a house. */
  placedIn(house: number): number {
    let m = 0
    const cells = HOUSES[house]
    for (let i = 0; i < 9; i++) {
      const d = this.digits[cells[i]]
      if (d) m |= 1 << (d - 1)
    }
    return m
  }

  isSolved(): boolean {
    for (let c = 0; c < 81; c++) if (!this.digits[c]) return false
    return true
  }
}
