/**
 * Locked candidates, both directions: a box whose places for a digit lie on one line clears
 * that digit from the rest of the line; a line whose places lie in one box clears the rest of the box.
 */
import { HOUSES, boxOf, colOf, houseRef, rowOf } from '../../grid'
import type { Board } from '../board'
import type { Cell, HouseRef } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** Box → line (pointing). */
export const lockedBoxLine: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (let b = 0; b < 9 && !picker.settled; b++) {
      for (let d = 1; d <= 9; d++) {
        const cells = placesIn(board, 18 + b, d)
        if (cells.length < 2) continue
        const line = commonLine(cells)
        if (line < 0) continue
        const others = Array.from(HOUSES[line]).filter((c) => boxOf(c) !== b)
        offer(board, picker, 'locked-box-line', d, b, line, cells, others)
      }
    }
    return picker.best
  },
}

/** Line → box (claiming). */
export const lockedLineBox: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (let line = 0; line < 18 && !picker.settled; line++) {
      for (let d = 1; d <= 9; d++) {
        const cells = placesIn(board, line, d)
        if (cells.length < 2) continue
        const b = boxOf(cells[0])
        if (!cells.every((c) => boxOf(c) === b)) continue
        const others = Array.from(HOUSES[18 + b]).filter((c) => !HOUSES[line].includes(c))
        offer(board, picker, 'locked-line-box', d, b, line, cells, others)
      }
    }
    return picker.best
  },
}

function offer(board: Board, picker: Picker, technique: 'locked-box-line' | 'locked-line-box', d: number, box: number, line: number, cells: Cell[], others: Cell[]): void {
  const bit = 1 << (d - 1)
  if (!others.some((c) => !board.digits[c] && board.cand[c] & bit)) return
  const lineRef: HouseRef = houseRef(line)
  const boxRef: HouseRef = houseRef(18 + box)
  picker.offer(cells, () => ({
    technique,
    placements: [],
    eliminations: eliminationsOf(board, others, bit),
    focus: cells,
    reason: { houses: technique === 'locked-box-line' ? [boxRef, lineRef] : [lineRef, boxRef], thermometers: [], cells },
    facts: { kind: 'locked', digit: d, box, line: lineRef, direction: technique === 'locked-box-line' ? 'box-to-line' : 'line-to-box', cells },
    difficulty: TECHNIQUES[technique].difficulty,
  }))
}

function placesIn(board: Board, house: number, d: number): Cell[] {
  const bit = 1 << (d - 1)
  const out: Cell[] = []
  for (const c of HOUSES[house]) {
    if (board.digits[c] === d) return []
    if (!board.digits[c] && board.cand[c] & bit) out.push(c)
  }
  return out
}

/** The row (0..8) or column (9..17) house all cells share, or −1. */
function commonLine(cells: Cell[]): number {
  const r = rowOf(cells[0])
  if (cells.every((c) => rowOf(c) === r)) return r
  const c0 = colOf(cells[0])
  if (cells.every((c) => colOf(c) === c0)) return 9 + c0
  return -1
}
