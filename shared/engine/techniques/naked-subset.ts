/**
 * Pairs and triples, naked form: k cells of a house whose candidates together are only k digits,
 * so those digits leave the rest of the house.
 */
import { HOUSES, POPCOUNT, digitsOf, houseRef } from '../../grid'
import type { Cell } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** The naked pair (size 2) or naked triple (size 3) technique. */
export function nakedSubset(size: 2 | 3): Technique {
  const technique = size === 2 ? 'naked-pair' : 'naked-triple'
  return {
    find(board, near) {
      const picker = new Picker(near)
      const open: Cell[] = []
      for (let h = 0; h < 27 && !picker.settled; h++) {
        open.length = 0
        for (const c of HOUSES[h]) if (!board.digits[c] && POPCOUNT[board.cand[c]] <= size) open.push(c)
        if (open.length < size) continue
        forEachCombination(open.length, size, (idx) => {
          let union = 0
          for (const i of idx) union |= board.cand[open[i]]
          if (POPCOUNT[union] !== size) return
          const cells = idx.map((i) => open[i])
          const others = Array.from(HOUSES[h]).filter((c) => !cells.includes(c))
          let hits = 0
          for (const c of others) if (!board.digits[c]) hits |= board.cand[c] & union
          if (!hits) return
          picker.offer(cells, () => ({
            technique,
            placements: [],
            eliminations: eliminationsOf(board, others, union),
            focus: cells,
            reason: { houses: [houseRef(h)], thermometers: [], cells },
            facts: { kind: 'subset', form: 'naked', house: houseRef(h), cells, digits: digitsOf(union) },
            difficulty: TECHNIQUES[technique].difficulty,
          }))
        })
      }
      return picker.best
    },
  }
}

/** Calls `visit` with each k-element index combination of 0..n−1, ascending. */
export function forEachCombination(n: number, k: number, visit: (idx: number[]) => void): void {
  const idx = Array.from({ length: k }, (_, i) => i)
  for (;;) {
    visit(idx)
    let i = k - 1
    while (i >= 0 && idx[i] === n - k + i) i--
    if (i < 0) return
    idx[i]++
    for (let j = i + 1; j < k; j++) idx[j] = idx[j - 1] + 1
  }
}
