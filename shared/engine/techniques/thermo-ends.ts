/**
 * Two tips (or two bulbs): a digit d with exactly two places in a house, each with exactly 9 − d
 * cells after it on a thermometer. Whichever place holds d, the cells after it must climb d + 1,
 * d + 2, … one by one, so that thermometer's tip is a 9. One of the two tips is therefore a 9, and a
 * cell that sees both tips can't be. Mirrored: exactly d − 1 cells before each place, so one of the
 * two bulbs is a 1. The tips aren't the 9's places in any one house, so this is no locked
 * candidate; d = 9 (the places are the tips themselves) is left to locked candidates.
 */
import { PEERS, houseRef } from '../../grid'
import type { Board } from '../board'
import type { Cell } from '../types'
import { twoPlaceHouses } from './two-places'
import { Picker, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** A place's thermometer whose end its digit would fix, and that end cell. */
interface Forced {
  thermometer: number
  end: Cell
}

export const thermoEnds: Technique = {
  find(board, near) {
    if (!board.thermometers.length) return null
    const picker = new Picker(near)
    const places = twoPlaceHouses(board)
    const seesEnd = new Uint8Array(81)
    for (let h = 0; h < 27 && !picker.settled; h++) {
      for (let d = 2; d <= 8; d++) {
        const a = places[(h * 9 + d - 1) * 2]!
        if (a < 0) continue
        const b = places[(h * 9 + d - 1) * 2 + 1]!
        // both places must lie on thermometers
        if (!onThermometer(board, a) || !onThermometer(board, b)) continue
        for (const end of ['tip', 'bulb'] as const) {
          const endBit = end === 'tip' ? 1 << 8 : 1
          for (const fa of forcedEnds(board, a, d, end)) {
            for (const fb of forcedEnds(board, b, d, end)) {
              if (fa.end === fb.end) continue
              seesEnd.fill(0)
              for (const p of PEERS[fa.end]) seesEnd[p] = 1
              const cells: Cell[] = []
              for (const p of PEERS[fb.end]) if (seesEnd[p] && !board.digits[p] && board.cand[p] & endBit) cells.push(p)
              if (!cells.length) continue
              picker.offer([a, b, fa.end, fb.end], () => ({
                technique: 'thermo-ends',
                placements: [],
                eliminations: cells.map((c) => ({ cell: c, digits: [end === 'tip' ? 9 : 1] })),
                focus: [a, b, fa.end, fb.end],
                reason: { houses: [houseRef(h)], thermometers: [...new Set([fa.thermometer, fb.thermometer])], cells: [a, b] },
                facts: {
                  kind: 'thermo-ends',
                  digit: d,
                  house: houseRef(h),
                  end,
                  homes: [
                    { cell: a, thermometer: fa.thermometer, end: fa.end },
                    { cell: b, thermometer: fb.thermometer, end: fb.end },
                  ],
                  eliminated: cells,
                },
                difficulty: TECHNIQUES['thermo-ends'].difficulty,
              }))
            }
          }
        }
      }
    }
    return picker.best
  },
}

/** Where each cell stands on each thermometer through it: (thermometer, index, length) triples. */
const positions = new WeakMap<readonly Int8Array[], number[][]>()

function onThermometer(board: Board, cell: Cell): boolean {
  return positionsOf(board)[cell].length > 0
}

function positionsOf(board: Board): number[][] {
  let table = positions.get(board.thermometers)
  if (!table) {
    const made: number[][] = Array.from({ length: 81 }, () => [])
    board.thermometers.forEach((path, t) => path.forEach((c, i) => made[c].push(t, i, path.length)))
    positions.set(board.thermometers, made)
    table = made
  }
  return table
}

/**
 * The thermometers on which `cell` holding d fixes the end: 9 − d cells after it (the tip must be
 * 9), or d − 1 cells before it (the bulb must be 1).
 */
function forcedEnds(board: Board, cell: Cell, d: number, end: 'tip' | 'bulb'): Forced[] {
  const here = positionsOf(board)[cell]
  if (!here.length) return NONE
  const out: Forced[] = []
  for (let j = 0; j < here.length; j += 3) {
    const [t, i, n] = [here[j], here[j + 1], here[j + 2]]
    const path = board.thermometers[t]
    if (end === 'tip' && n - 1 - i === 9 - d) out.push({ thermometer: t, end: path[n - 1] })
    if (end === 'bulb' && i === d - 1) out.push({ thermometer: t, end: path[0] })
  }
  return out
}

const NONE: Forced[] = []
