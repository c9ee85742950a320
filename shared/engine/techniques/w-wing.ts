/**
 * W-wing: two cells that can only be a or b, which don't see each other, joined by b's two places
 * in some house, one place seeing each cell. One of those two places is b, so the cell it sees
 * can't be b and is a: one of the two cells is a, and a cell that sees both can't be a.
 */
import { POPCOUNT, digitsOf, houseRef } from '../../grid'
import type { Cell } from '../types'
import { twoPlaceHouses } from './two-places'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { sees, seenByAll } from './xy-wing'

export const wWing: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    const pairs: Cell[] = []
    for (let c = 0; c < 81; c++) if (!board.digits[c] && POPCOUNT[board.cand[c]] === 2) pairs.push(c)
    if (pairs.length < 2) return null
    // built on first need: most boards have no matching pair that could clear anything
    let links: Int16Array | null = null
    for (let i = 0; i < pairs.length && !picker.settled; i++) {
      const c1 = pairs[i]
      const mask = board.cand[c1]
      for (let j = i + 1; j < pairs.length; j++) {
        const c2 = pairs[j]
        // cells that see each other would be a plain pair, found earlier
        if (board.cand[c2] !== mask || sees(c1, c2)) continue
        for (const b of digitsOf(mask)) {
          const aBit = mask & ~(1 << (b - 1))
          const targets = seenByAll(board, [c1, c2], aBit)
          if (!targets.length) continue
          links ??= twoPlaceHouses(board)
          const link = findLink(links, b, c1, c2)
          if (!link) continue
          const focus = [c1, c2, link.cells[0], link.cells[1]]
          picker.offer(focus, () => ({
            technique: 'w-wing',
            placements: [],
            eliminations: eliminationsOf(board, targets, aBit),
            focus,
            reason: { houses: [houseRef(link.house)], thermometers: [], cells: focus },
            facts: {
              kind: 'w-wing',
              cells: [c1, c2],
              digits: digitsOf(mask),
              digit: digitsOf(aBit)[0],
              link: { house: houseRef(link.house), digit: b, cells: link.cells },
              eliminated: targets,
            },
            difficulty: TECHNIQUES['w-wing'].difficulty,
          }))
        }
      }
    }
    return picker.best
  },
}

/** The first house whose two places for `b` see `c1` and `c2` one each, with the place seeing `c1` first. */
function findLink(links: Int16Array, b: number, c1: Cell, c2: Cell): { house: number; cells: Cell[] } | null {
  for (let h = 0; h < 27; h++) {
    const x = links[(h * 9 + b - 1) * 2]
    if (x < 0) continue
    const y = links[(h * 9 + b - 1) * 2 + 1]
    // a place on one of the pair cells would make the house hold that cell: no link between two others
    if (x === c1 || x === c2 || y === c1 || y === c2) continue
    if (sees(x, c1) && sees(y, c2)) return { house: h, cells: [x, y] }
    if (sees(y, c1) && sees(x, c2)) return { house: h, cells: [y, x] }
  }
  return null
}
