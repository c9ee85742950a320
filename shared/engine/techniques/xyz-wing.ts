/**
 * XYZ-wing: a pivot that can only be x, y or z sees two pincers, one x-or-z and one y-or-z. If the
 * pivot is x the first pincer is z, if it is y the second is, and if it is z it holds the z itself:
 * one of the three cells is z, so a cell that sees all three can't be z.
 */
import { PEERS, POPCOUNT, digitsOf, lowestDigit } from '../../grid'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { oneHouse, seenByAll } from './xy-wing'

export const xyzWing: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (let p = 0; p < 81 && !picker.settled; p++) {
      if (board.digits[p] || POPCOUNT[board.cand[p]] !== 3) continue
      const pivot = board.cand[p]
      const peers = PEERS[p]
      for (let i = 0; i < 20; i++) {
        const a = peers[i]
        const ma = board.cand[a]
        if (board.digits[a] || POPCOUNT[ma] !== 2 || (ma & pivot) !== ma) continue
        for (let j = 0; j < 20; j++) {
          const b = peers[j]
          const mb = board.cand[b]
          // two different two-digit pincers inside the pivot's three share exactly one digit, z
          if (b <= a || board.digits[b] || POPCOUNT[mb] !== 2 || (mb & pivot) !== mb || mb === ma || oneHouse(p, a, b)) continue
          const z = ma & mb
          const targets = seenByAll(board, [p, a, b], z)
          if (!targets.length) continue
          const focus = [p, a, b]
          picker.offer(focus, () => ({
            technique: 'xyz-wing',
            placements: [],
            eliminations: eliminationsOf(board, targets, z),
            focus,
            reason: { houses: [], thermometers: [], cells: focus },
            facts: {
              kind: 'wing',
              form: 'xyz',
              pivot: p,
              pivotDigits: digitsOf(pivot),
              pincers: [a, b],
              pincerDigits: [lowestDigit(ma & ~z), lowestDigit(mb & ~z)],
              digit: lowestDigit(z),
              eliminated: targets,
            },
            difficulty: TECHNIQUES['xyz-wing'].difficulty,
          }))
        }
      }
    }
    return picker.best
  },
}
