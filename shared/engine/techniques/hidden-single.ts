/** Only place for a digit in a row, column or box (hidden single). */
import { ALL_DIGITS, HOUSES, PEERS, houseRef, lowestDigit } from '../../grid'
import type { Board } from '../board'
import type { Cell, FactsOf } from '../types'
import { Picker, type Deduction, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

// Boxes first: a presenter scans a box for a digit before a long line.
const HOUSE_ORDER = [18, 19, 20, 21, 22, 23, 24, 25, 26, 0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17]

export const hiddenSingle: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (const h of HOUSE_ORDER) {
      if (picker.settled) break
      const cells = HOUSES[h]
      let once = 0
      let twice = 0
      for (let i = 0; i < 9; i++) {
        const c = cells[i]
        if (board.digits[c]) continue
        const m = board.cand[c]
        twice |= once & m
        once |= m
      }
      let single = once & ~twice & ALL_DIGITS
      while (single) {
        const bit = single & -single
        single ^= bit
        let cell = -1
        for (let i = 0; i < 9; i++) if (!board.digits[cells[i]] && board.cand[cells[i]] & bit) cell = cells[i]
        // a cell whose only candidate this is will be reported as a naked single instead
        picker.offer([cell], () => build(board, h, cell, lowestDigit(bit)))
      }
    }
    return picker.best
  },
}

function build(board: Board, house: number, cell: Cell, digit: number): Deduction {
  const blockedCells: Cell[] = []
  const blockers: NonNullable<FactsOf<'single-house'>['blockers']> = []
  const peers = new Set<Cell>()
  const thermometers = new Set<number>()
  for (const c of HOUSES[house]) {
    if (c === cell || board.digits[c]) continue
    blockedCells.push(c)
    // A digit in sight is the reason a viewer sees, so it wins over an earlier step that had
    // already removed the candidate; only a cell no placed digit blocks is told by its step.
    const by = PEERS[c].find((p) => board.digits[p] === digit)
    if (by !== undefined) {
      blockers.push({ cell: c, peer: by })
      peers.add(by)
      continue
    }
    const step = board.removedBy[c * 9 + digit - 1]
    if (step < 0) throw new Error(`hidden single: nothing removed ${digit} from cell ${c}`)
    blockers.push({ cell: c, step })
    for (const t of board.reasons[step]?.thermometers ?? []) thermometers.add(t)
  }
  return {
    technique: 'hidden-single',
    placements: [{ cell, digit }],
    eliminations: [],
    focus: [cell],
    reason: { houses: [houseRef(house)], thermometers: [...thermometers].sort((a, b) => a - b), cells: [...peers].sort((a, b) => a - b) },
    facts: { kind: 'single-house', cell, digit, house: houseRef(house), blockedCells, blockers },
    difficulty: TECHNIQUES['hidden-single'].difficulty,
  }
}
