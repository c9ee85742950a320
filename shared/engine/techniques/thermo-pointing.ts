/**
 * A house points along a thermometer: when every place for a digit in a house lies before one
 * cell on thermometers through that cell, the digit sits somewhere below the cell, so the cell is
 * higher than it, by at least the smallest number of places between them; every place lying after
 * the cell makes it lower in the same way. Thermometer bounds can't see this: they read the
 * smallest candidate of the cell before, not where the house must put its digit.
 */
import { HOUSES, digitsAbove, digitsBelow, digitsOf, houseRef } from '../../grid'
import type { Cell } from '../types'
import { Picker, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { thermoOrder } from './thermo-order'

export const thermoPointing: Technique = {
  find(board, near) {
    if (!board.thermometers.length) return null
    const { steps, via, related } = thermoOrder(board)
    const picker = new Picker(near)
    const homes: Cell[] = []
    for (let h = 0; h < 27 && !picker.settled; h++) {
      const house = HOUSES[h]
      for (let d = 1; d <= 9; d++) {
        const bit = 1 << (d - 1)
        homes.length = 0
        // every place must lie on a thermometer, so a place on none (or a placed d) ends the search
        let usable = true
        for (let i = 0; i < 9 && usable; i++) {
          const c = house[i]
          if (board.digits[c] === d) usable = false
          else if (!board.digits[c] && board.cand[c] & bit) {
            if (!related[c].length) usable = false
            else homes.push(c)
          }
        }
        // one place is a hidden single, an easier step
        if (!usable || homes.length < 2) continue
        // the target must share a thermometer with every place, so the first place's list holds it
        const first = related[homes[0]]
        for (let j = 0; j < first.length; j++) {
          const p = first[j]
          if (board.digits[p]) continue
          const side = Math.sign(steps[homes[0] * 81 + p])
          let nearest = 9
          for (let i = 0; i < homes.length; i++) {
            const k = steps[homes[i] * 81 + p] * side
            if (k <= 0) {
              nearest = 0
              break
            }
            if (k < nearest) nearest = k
          }
          if (!nearest) continue
          // before: p ≥ d + nearest; after: p ≤ d − nearest
          const bound = side > 0 ? d + nearest : d - nearest
          const out = side > 0 ? digitsBelow(Math.min(bound, 10)) : digitsAbove(Math.max(bound, 0))
          const hit = board.cand[p] & out
          // emptying the cell would mean a broken grid, which is the contradiction search's business
          if (!hit || hit === board.cand[p]) continue
          const cells = homes.slice()
          picker.offer([...cells, p], () => ({
            technique: 'thermo-pointing',
            placements: [],
            eliminations: [{ cell: p, digits: digitsOf(hit) }],
            focus: [...cells, p],
            reason: { houses: [houseRef(h)], thermometers: [...new Set(cells.map((c) => via[c * 81 + p]))], cells },
            facts: {
              kind: 'thermo-pointing',
              digit: d,
              house: houseRef(h),
              side: side > 0 ? 'before' : 'after',
              homes: cells.map((c) => ({ cell: c, thermometer: via[c * 81 + p], steps: Math.abs(steps[c * 81 + p]) })),
              cell: p,
              bound,
            },
            difficulty: TECHNIQUES['thermo-pointing'].difficulty,
          }))
        }
      }
    }
    return picker.best
  },
}
