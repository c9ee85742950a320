/** Where each digit has exactly two places in a house: the table several "either place" techniques read. */
import { HOUSES } from '../../grid'
import type { Board } from '../board'

/** For each house and digit (index house × 9 + digit − 1), its two places, or −1 when it has more or fewer. */
export function twoPlaceHouses(board: Board): Int16Array {
  const out = new Int16Array(27 * 9 * 2).fill(-1)
  for (let h = 0; h < 27; h++) {
    const house = HOUSES[h]
    for (let d = 1; d <= 9; d++) {
      const bit = 1 << (d - 1)
      let first = -1
      let second = -1
      let count = 0
      for (let k = 0; k < 9 && count <= 2; k++) {
        const c = house[k]
        if (board.digits[c] === d) {
          count = 3
          break
        }
        if (board.digits[c] || !(board.cand[c] & bit)) continue
        if (count === 0) first = c
        else second = c
        count++
      }
      if (count !== 2) continue
      out[(h * 9 + d - 1) * 2] = first
      out[(h * 9 + d - 1) * 2 + 1] = second
    }
  }
  return out
}
