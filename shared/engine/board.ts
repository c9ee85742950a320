/**
 * The working grid a solve path runs on: digits and candidate masks, plus the puzzle's
 * thermometers. A placed cell keeps its own digit as its only candidate, so thermometer
 * bounds read placed and open cells the same way.
 */
import { ALL_DIGITS, HOUSES, PEERS } from '../grid'
import type { Cell, Digit, Puzzle } from './types'

export class Board {
  constructor(
    readonly digits: Uint8Array,
    readonly cand: Uint16Array,
    /** thermometer paths, bulb first */
    readonly thermometers: readonly Int8Array[],
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
    return new Board(this.digits.slice(), this.cand.slice(), this.thermometers)
  }

  /** Puts a digit in a cell and removes it from the cell's peers. */
  place(cell: Cell, digit: Digit): void {
    const bit = 1 << (digit - 1)
    this.digits[cell] = digit
    this.cand[cell] = bit
    const peers = PEERS[cell]
    for (let i = 0; i < 20; i++) this.cand[peers[i]] &= ~bit
  }

  /** Removes a mask of digits from an open cell. */
  eliminate(cell: Cell, mask: number): void {
    this.cand[cell] &= ~mask
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
