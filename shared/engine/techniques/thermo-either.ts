/**
 * Either place of a digit rules a cell out: a digit with exactly two places in a house is in one
 * of them, so a cell loses whatever both possibilities deny it. Each place limits the cell through
 * a thermometer they share (k places before the cell: the cell is at least digit + k; k places
 * after: at most digit − k) or by seeing it (it can't repeat the digit). At least one of the two
 * goes through a thermometer: two places that both see the cell are locked candidates, and two
 * on the same side of it along thermometers are thermometer pointing, both easier to say. The cell
 * may be one of the places: then it is the digit, or the other place's thermometer bounds it.
 */
import { CELL_HOUSES, digitsAbove, digitsBelow, digitsOf, houseRef } from '../../grid'
import type { Board } from '../board'
import type { Cell, FactsOf } from '../types'
import { twoPlaceHouses } from './two-places'
import { Picker, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { thermoOrder, type ThermoOrder } from './thermo-order'

type Home = FactsOf<'thermo-either'>['homes'][number]

export const thermoEither: Technique = {
  find(board, near) {
    if (!board.thermometers.length) return null
    const order = thermoOrder(board)
    const picker = new Picker(near)
    const places = twoPlaceHouses(board)
    for (let h = 0; h < 27 && !picker.settled; h++) {
      for (let d = 1; d <= 9; d++) {
        const a = places[(h * 9 + d - 1) * 2]!
        if (a < 0) continue
        const b = places[(h * 9 + d - 1) * 2 + 1]!
        // at least one place must lie on a thermometer
        if (!(order.related[a].length || order.related[b].length)) continue
        // a place itself: it is the digit, or the other place is and the thermometer between them bounds it
        tryPlace(board, order, picker, h, d, a, b)
        tryPlace(board, order, picker, h, d, b, a)
        // another cell shares a thermometer with at least one place, so one of their lists holds it
        tryTargets(board, order, picker, h, d, a, b, order.related[a])
        tryTargets(board, order, picker, h, d, a, b, order.related[b])
      }
    }
    return picker.best
  },
}

function tryTargets(board: Board, order: ThermoOrder, picker: Picker, h: number, d: number, a: Cell, b: Cell, targets: Int8Array): void {
  const { steps } = order
  for (let j = 0; j < targets.length; j++) {
    const x = targets[j]
    if (board.digits[x] || x === a || x === b) continue
    const ka = steps[a * 81 + x]
    const kb = steps[b * 81 + x]
    // both on one side along thermometers: thermometer pointing says it more simply
    if (ka * kb > 0) continue
    const hit = board.cand[x] & denied(d, ka, a, x) & denied(d, kb, b, x)
    if (!hit || hit === board.cand[x]) continue
    picker.offer([a, b, x], () => build(order, h, d, [a, b], x, hit))
  }
}

/** `x`, one of the two places, keeps d and only what the other place `y` holding d would leave it. */
function tryPlace(board: Board, order: ThermoOrder, picker: Picker, h: number, d: number, x: Cell, y: Cell): void {
  const k = order.steps[y * 81 + x]
  if (!k) return
  const hit = board.cand[x] & denied(d, k, y, x) & ~(1 << (d - 1))
  if (!hit) return
  picker.offer([x, y], () => build(order, h, d, [x, y], x, hit))
}

/** The digits `cell` can't hold if `home` holds d: by a thermometer k places apart, or by seeing it. */
function denied(d: number, k: number, home: Cell, cell: Cell): number {
  if (k > 0) return digitsBelow(Math.min(d + k, 10))
  if (k < 0) return digitsAbove(Math.max(d + k, 0))
  return sharedHouse(home, cell) >= 0 ? 1 << (d - 1) : 0
}

/** A house both cells lie in, or −1. */
function sharedHouse(a: Cell, b: Cell): number {
  const ha = CELL_HOUSES[a]
  const hb = CELL_HOUSES[b]
  for (let i = 0; i < 3; i++) if (ha[i] === hb[i]) return ha[i]
  return -1
}

function build(order: ThermoOrder, h: number, d: number, homes: Cell[], x: Cell, hit: number) {
  const linkOf = (home: Cell): Home => {
    if (home === x) return { via: 'itself', cell: home }
    const k = order.steps[home * 81 + x]
    if (k) return { via: 'thermometer', cell: home, thermometer: order.via[home * 81 + x], side: k > 0 ? 'before' : 'after', steps: Math.abs(k) }
    return { via: 'house', cell: home, house: houseRef(sharedHouse(home, x)) }
  }
  // in house order, whichever of them is the cell
  const links = [...homes].sort((p, q) => p - q).map(linkOf)
  return {
    technique: 'thermo-either' as const,
    placements: [],
    eliminations: [{ cell: x, digits: digitsOf(hit) }],
    focus: homes.includes(x) ? links.map((l) => l.cell) : [...homes, x],
    reason: {
      houses: [houseRef(h), ...links.flatMap((l) => (l.via === 'house' ? [l.house] : []))],
      thermometers: [...new Set(links.flatMap((l) => (l.via === 'thermometer' ? [l.thermometer] : [])))],
      cells: links.map((l) => l.cell),
    },
    facts: { kind: 'thermo-either' as const, digit: d, house: houseRef(h), cell: x, homes: links },
    difficulty: TECHNIQUES['thermo-either'].difficulty,
  }
}
