/**
 * Pairs and triples, hidden form: k digits whose only places in a house are the same k cells,
 * so those cells drop every other digit.
 */
import { ALL_DIGITS, HOUSES, POPCOUNT, digitsOf, houseRef } from '../../grid'
import type { Cell } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { forEachCombination } from './naked-subset'

/** The hidden pair (size 2) or hidden triple (size 3) technique. */
export function hiddenSubset(size: 2 | 3): Technique {
  const technique = size === 2 ? 'hidden-pair' : 'hidden-triple'
  const places = new Uint16Array(9)
  return {
    find(board, near) {
      const picker = new Picker(near)
      const digits: number[] = []
      for (let h = 0; h < 27 && !picker.settled; h++) {
        const house = HOUSES[h]
        const placed = board.placedIn(h)
        digits.length = 0
        for (let d = 1; d <= 9; d++) {
          const bit = 1 << (d - 1)
          if (placed & bit) continue
          let where = 0
          for (let i = 0; i < 9; i++) if (!board.digits[house[i]] && board.cand[house[i]] & bit) where |= 1 << i
          places[d - 1] = where
          // one place is a single, found earlier; more than `size` places cannot join a subset
          if (POPCOUNT[where] >= 2 && POPCOUNT[where] <= size) digits.push(d)
        }
        if (digits.length < size) continue
        forEachCombination(digits.length, size, (idx) => {
          let where = 0
          let mask = 0
          for (const i of idx) {
            where |= places[digits[i] - 1]
            mask |= 1 << (digits[i] - 1)
          }
          if (POPCOUNT[where] !== size) return
          const cells: Cell[] = []
          for (let i = 0; i < 9; i++) if (where & (1 << i)) cells.push(house[i])
          if (!cells.some((c) => board.cand[c] & ~mask)) return
          picker.offer(cells, () => ({
            technique,
            placements: [],
            eliminations: eliminationsOf(board, cells, ALL_DIGITS & ~mask),
            focus: cells,
            reason: { houses: [houseRef(h)], thermometers: [], cells },
            facts: { kind: 'subset', form: 'hidden', house: houseRef(h), cells, digits: digitsOf(mask) },
            difficulty: TECHNIQUES[technique].difficulty,
          }))
        })
      }
      return picker.best
    },
  }
}
