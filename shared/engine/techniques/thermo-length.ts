/**
 * Thermometer length rule: digits rise strictly from bulb to tip, so position i (from 1) of an
 * n-cell thermometer holds i … 9 − n + i, whatever else is known.
 */
import { digitsAbove, digitsBelow } from '../../grid'
import type { Cell } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** Mask of the digits position i (0-based) of an n-cell thermometer may hold. */
function lengthMask(i: number, n: number): number {
  return digitsAbove(i) & digitsBelow(11 - n + i)
}

export const thermoLength: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    board.thermometers.forEach((t, index) => {
      const n = t.length
      let hit = false
      for (let i = 0; i < n && !hit; i++) if (!board.digits[t[i]] && board.cand[t[i]] & ~lengthMask(i, n)) hit = true
      if (!hit) return
      const cells: Cell[] = Array.from(t)
      picker.offer(cells, () => {
        const eliminations = cells.flatMap((c, i) => eliminationsOf(board, [c], 0x1ff & ~lengthMask(i, n)))
        return {
          technique: 'thermo-length',
          placements: [],
          eliminations,
          focus: cells,
          reason: { houses: [], thermometers: [index], cells: [] },
          facts: { kind: 'thermo-length', thermometer: index, length: n, ranges: cells.map((cell, i) => ({ cell, min: i + 1, max: 10 - n + i })) },
          difficulty: TECHNIQUES['thermo-length'].difficulty,
        }
      })
    })
    return picker.best
  },
}
