/**
 * XY-wing: a pivot that can only be x or y sees two pincers, one x-or-z and one y-or-z. Whichever
 * digit the pivot takes, the pincer sharing it is left with z, so one pincer is z and a cell that
 * sees both pincers can't be z.
 */
import { PEERS, POPCOUNT, boxOf, colOf, digitsOf, lowestDigit, rowOf } from '../../grid'
import type { Board } from '../board'
import type { Cell } from '../types'
import { Picker, eliminationsOf, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

export const xyWing: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    for (let p = 0; p < 81 && !picker.settled; p++) {
      if (board.digits[p] || POPCOUNT[board.cand[p]] !== 2) continue
      const pivot = board.cand[p]
      const peers = PEERS[p]
      for (let i = 0; i < 20; i++) {
        const a = peers[i]
        const ma = board.cand[a]
        // pincer a shares exactly one digit (x) with the pivot; its other digit is z
        if (board.digits[a] || POPCOUNT[ma] !== 2 || POPCOUNT[ma & pivot] !== 1) continue
        const z = ma & ~pivot
        const want = (pivot & ~ma) | z
        for (let j = 0; j < 20; j++) {
          const b = peers[j]
          // each pair of pincers once: the two roles are symmetric
          if (b <= a || board.digits[b] || board.cand[b] !== want || oneHouse(p, a, b)) continue
          const targets = seenByAll(board, [a, b], z)
          if (!targets.length) continue
          const focus = [p, a, b]
          picker.offer(focus, () => ({
            technique: 'xy-wing',
            placements: [],
            eliminations: eliminationsOf(board, targets, z),
            focus,
            reason: { houses: [], thermometers: [], cells: focus },
            facts: {
              kind: 'wing',
              form: 'xy',
              pivot: p,
              pivotDigits: digitsOf(pivot),
              pincers: [a, b],
              pincerDigits: [lowestDigit(ma & pivot), lowestDigit(want & pivot)],
              digit: lowestDigit(z),
              eliminated: targets,
            },
            difficulty: TECHNIQUES['xy-wing'].difficulty,
          }))
        }
      }
    }
    return picker.best
  },
}

/** True when three cells lie in one row, column or box: then they are a naked triple, said as one. */
export function oneHouse(a: Cell, b: Cell, c: Cell): boolean {
  return (rowOf(a) === rowOf(b) && rowOf(a) === rowOf(c)) || (colOf(a) === colOf(b) && colOf(a) === colOf(c)) || (boxOf(a) === boxOf(b) && boxOf(a) === boxOf(c))
}

/** True when two different cells share a row, column or box. */
export function sees(a: Cell, b: Cell): boolean {
  return a !== b && (rowOf(a) === rowOf(b) || colOf(a) === colOf(b) || boxOf(a) === boxOf(b))
}

/** Open cells, other than `cells` themselves, that see every one of `cells` and still hold some of `mask`. */
export function seenByAll(board: Board, cells: readonly Cell[], mask: number): Cell[] {
  const out: Cell[] = []
  const peers = PEERS[cells[0]]
  for (let i = 0; i < 20; i++) {
    const c = peers[i]
    if (board.digits[c] || !(board.cand[c] & mask) || cells.includes(c)) continue
    let all = true
    for (let k = 1; k < cells.length && all; k++) all = sees(c, cells[k])
    if (all) out.push(c)
  }
  return out.sort((x, y) => x - y)
}
