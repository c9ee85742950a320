/**
 * Which cells stand in a known order on a common thermometer, and how far apart: the shared
 * reading of the puzzle's thermometers for the techniques that combine a house with a thermometer.
 * Digits rise strictly along a thermometer, so a cell k places before another is at least k smaller.
 */
import type { Board } from '../board'

/** The order of every pair of cells along the puzzle's thermometers, built once per puzzle. */
export interface ThermoOrder {
  /**
   * steps[a * 81 + b]: k > 0 when a lies k places before b on a thermometer, −k when after, 0 when
   * no thermometer holds both. Where several thermometers hold both, the greatest distance is kept,
   * since it bounds the digits most.
   */
  steps: Int8Array
  /** via[a * 81 + b]: the thermometer that gives steps[a * 81 + b] (−1 when none) */
  via: Int8Array
  /** the cells ordered against each cell, as lists (so a search walks only thermometer cells) */
  related: readonly Int8Array[]
}

// Boards cloned from one puzzle share its thermometer list, so one table serves a whole path.
const cache = new WeakMap<readonly Int8Array[], ThermoOrder>()

/** The thermometer order for this board's puzzle. */
export function thermoOrder(board: Board): ThermoOrder {
  const known = cache.get(board.thermometers)
  if (known) return known
  const steps = new Int8Array(81 * 81)
  const via = new Int8Array(81 * 81).fill(-1)
  board.thermometers.forEach((path, t) => {
    for (let i = 0; i < path.length; i++) {
      for (let j = i + 1; j < path.length; j++) {
        const k = j - i
        const ab = path[i] * 81 + path[j]
        if (k <= steps[ab]) continue
        steps[ab] = k
        via[ab] = t
        const ba = path[j] * 81 + path[i]
        steps[ba] = -k
        via[ba] = t
      }
    }
  })
  const related: Int8Array[] = []
  for (let a = 0; a < 81; a++) {
    const list: number[] = []
    for (let b = 0; b < 81; b++) if (steps[a * 81 + b]) list.push(b)
    related.push(Int8Array.from(list))
  }
  const order = { steps, via, related }
  cache.set(board.thermometers, order)
  return order
}
