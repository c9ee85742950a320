/**
 * A fast exact solver: bitmask candidates, propagation of singles and thermometer bounds,
 * then depth-first search on the cell with the fewest candidates. Used for validation only;
 * it proves nothing a presenter could say aloud.
 */
import { ALL_DIGITS, HOUSES, PEERS, POPCOUNT, digitsAbove, digitsBelow, highestDigit, lowestDigit } from '../grid'
import type { Cell } from './types'

/** Up to `limit` solutions of a grid (givens 0 = empty) with thermometers, each as 81 digits. */
export function findSolutions(givens: ArrayLike<number>, thermometers: readonly (readonly Cell[])[], limit: number): Uint8Array[] {
  const cand = new Uint16Array(81)
  const queue: number[] = []
  for (let c = 0; c < 81; c++) {
    const d = givens[c]
    if (d >= 1 && d <= 9) {
      cand[c] = 1 << (d - 1)
      queue.push(c)
    } else cand[c] = ALL_DIGITS
  }
  const search = new Search(thermometers.map((t) => Int8Array.from(t)), limit)
  if (search.propagate(cand, queue)) search.run(cand)
  return search.solutions
}

class Search {
  readonly solutions: Uint8Array[] = []
  constructor(
    private readonly thermometers: readonly Int8Array[],
    private readonly limit: number,
  ) {}

  run(cand: Uint16Array): void {
    // Branch on the cell with the fewest candidates: it keeps the tree narrow.
    let best = -1
    let bestCount = 10
    for (let c = 0; c < 81; c++) {
      const n = POPCOUNT[cand[c]]
      if (n > 1 && n < bestCount) {
        best = c
        bestCount = n
        if (n === 2) break
      }
    }
    if (best < 0) {
      this.solutions.push(toDigits(cand))
      return
    }
    let m = cand[best]
    while (m && this.solutions.length < this.limit) {
      const bit = m & -m
      m ^= bit
      const next = cand.slice()
      next[best] = bit
      if (this.propagate(next, [best])) this.run(next)
    }
  }

  /** Tightens candidates in place; false when a cell or a house runs out of options. */
  propagate(cand: Uint16Array, queue: number[]): boolean {
    for (;;) {
      // 1. every fixed cell removes its digit from its peers
      while (queue.length) {
        const c = queue.pop() as number
        const bit = cand[c]
        const peers = PEERS[c]
        for (let i = 0; i < 20; i++) {
          const p = peers[i]
          const m = cand[p]
          if (m & bit) {
            const left = m & ~bit
            if (!left) return false
            cand[p] = left
            if (POPCOUNT[left] === 1) queue.push(p)
          }
        }
      }
      // 2. a digit with one place in a house goes there
      for (let h = 0; h < 27; h++) {
        const cells = HOUSES[h]
        let once = 0
        let twice = 0
        for (let i = 0; i < 9; i++) {
          const m = cand[cells[i]]
          twice |= once & m
          once |= m
        }
        if (once !== ALL_DIGITS) return false
        let single = once & ~twice
        while (single) {
          const bit = single & -single
          single ^= bit
          for (let i = 0; i < 9; i++) {
            const c = cells[i]
            if (cand[c] & bit) {
              if (cand[c] !== bit) {
                cand[c] = bit
                queue.push(c)
              }
              break
            }
          }
        }
      }
      // 3. thermometers: each cell above the smallest option before it, below the largest after it
      for (const t of this.thermometers) {
        if (!tightenThermometer(cand, t, queue)) return false
      }
      if (!queue.length) return true
    }
  }
}

function tightenThermometer(cand: Uint16Array, t: Int8Array, queue: number[]): boolean {
  const n = t.length
  let low = 0
  for (let i = 0; i < n; i++) {
    const c = t[i]
    const m = cand[c] & digitsAbove(low)
    if (!m) return false
    if (m !== cand[c]) {
      cand[c] = m
      if (POPCOUNT[m] === 1) queue.push(c)
    }
    low = lowestDigit(m)
  }
  let high = 10
  for (let i = n - 1; i >= 0; i--) {
    const c = t[i]
    const m = cand[c] & digitsBelow(high)
    if (!m) return false
    if (m !== cand[c]) {
      cand[c] = m
      if (POPCOUNT[m] === 1) queue.push(c)
    }
    high = highestDigit(m)
  }
  return true
}

function toDigits(cand: Uint16Array): Uint8Array {
  const out = new Uint8Array(81)
  for (let c = 0; c < 81; c++) out[c] = lowestDigit(cand[c])
  return out
}

