/** Last candidate in a cell (naked single): every other digit is ruled out. */
import { CELL_HOUSES, HOUSES, POPCOUNT, digitsOf, houseRef, lowestDigit } from '../../grid'
import type { Board } from '../board'
import type { Cell, FactsOf, HouseRef } from '../types'
import { Picker, type Deduction, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

export const nakedSingle: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (let c = 0; c < 81 && !picker.settled; c++) {
      if (board.digits[c] || POPCOUNT[board.cand[c]] !== 1) continue
      picker.offer([c], () => build(board, c))
    }
    return picker.best
  },
}

function build(board: Board, cell: Cell): Deduction {
  const digit = lowestDigit(board.cand[cell])
  const [rowH, colH, boxH] = CELL_HOUSES[cell]
  const inRow = board.placedIn(rowH)
  const inCol = board.placedIn(colH) & ~inRow
  const inBox = board.placedIn(boxH) & ~inRow & ~inCol
  // A digit placed in a house is the reason a viewer sees on screen, so it is named first even
  // when an earlier step had already removed the candidate; the rest were removed by steps.
  const ruledOut = 0x1ff & ~board.cand[cell] & ~inRow & ~inCol & ~inBox
  const houses: HouseRef[] = []
  const cells: Cell[] = []
  for (const [h, mask] of [[rowH, inRow], [colH, inCol], [boxH, inBox]] as const) {
    if (!mask) continue
    houses.push(houseRef(h))
    for (const p of HOUSES[h]) if (p !== cell && board.digits[p] && mask & (1 << (board.digits[p] - 1))) cells.push(p)
  }
  const ruledOutBy: NonNullable<FactsOf<'single-cell'>['ruledOutBy']> = []
  const thermometers = new Set<number>()
  for (const d of digitsOf(ruledOut)) {
    const step = board.removedBy[cell * 9 + d - 1]
    // every candidate gone from an open cell was removed by a placed digit or a step (Board)
    if (step < 0) throw new Error(`naked single: no step removed ${d} from cell ${cell}`)
    ruledOutBy.push({ digit: d, step })
    // the thermometers those steps used, not every thermometer through the cell
    for (const t of board.reasons[step]?.thermometers ?? []) thermometers.add(t)
  }
  return {
    technique: 'naked-single',
    placements: [{ cell, digit }],
    eliminations: [],
    focus: [cell],
    reason: { houses, thermometers: [...thermometers].sort((a, b) => a - b), cells },
    facts: {
      kind: 'single-cell',
      cell,
      digit,
      seen: { row: digitsOf(inRow), column: digitsOf(inCol), box: digitsOf(inBox), ruledOut: digitsOf(ruledOut) },
      ruledOutBy,
    },
    difficulty: TECHNIQUES['naked-single'].difficulty,
  }
}
