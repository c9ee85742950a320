/**
 * Thermometer bounds carried along the path: each cell must exceed the smallest digit possible
 * before it ('min', walking from the bulb) and stay below the largest digit possible after it
 * ('max', walking from the tip). Candidates already narrowed by sudoku or by another
 * thermometer sharing a cell feed the same walk, which is how bounds combine with the grid.
 */
import { ALL_DIGITS, digitsAbove, digitsBelow, digitsOf, highestDigit, lowestDigit } from '../../grid'
import type { Board } from '../board'
import type { Cell, Elimination } from '../types'
import { Picker, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'

/** One chain of tightened cells that all owe their new bound to one source cell. */
interface BoundRun {
  direction: 'min' | 'max'
  /** position of the source cell on the thermometer */
  source: number
  /** positions whose candidates shrink, with the mask they keep */
  changed: { index: number; keep: number }[]
}

/**
 * The runs a walk in one direction would tighten; empty when the thermometer is already tight.
 * A broken thermometer (a cell left with nothing, or a placed digit out of bounds) gives no runs,
 * unless `throughBreak` is set: then the walk stops at the break and reports it as a run that
 * empties that cell, which is how the contradiction search sees a dead end on a thermometer.
 */
function boundRuns(digits: Uint8Array, cand: Uint16Array, t: Int8Array, direction: 'min' | 'max', throughBreak = false): BoundRun[] {
  const n = t.length
  const runs: BoundRun[] = []
  let bound = direction === 'min' ? 0 : 10
  let source = -1
  for (let k = 0; k < n; k++) {
    const i = direction === 'min' ? k : n - 1 - k
    const c = t[i]
    const m = cand[c]
    const keep = m & (direction === 'min' ? digitsAbove(bound) : digitsBelow(bound))
    if (keep !== m && (!keep || digits[c])) {
      if (!throughBreak) return [] // a broken thermometer is the contradiction search's business, not a step
      const last = runs[runs.length - 1]
      if (last && last.source === source) last.changed.push({ index: i, keep: 0 })
      else runs.push({ direction, source, changed: [{ index: i, keep: 0 }] })
      return runs
    }
    if (keep !== m) {
      const last = runs[runs.length - 1]
      if (last && last.source === source) last.changed.push({ index: i, keep })
      else runs.push({ direction, source, changed: [{ index: i, keep }] })
    } else source = i
    bound = direction === 'min' ? lowestDigit(keep) : highestDigit(keep)
  }
  return runs
}

export const thermoBounds: Technique = {
  find(board, near) {
    const picker = new Picker(near)
    board.thermometers.forEach((t, index) => {
      for (const direction of ['min', 'max'] as const) {
        for (const run of boundRuns(board.digits, board.cand, t, direction)) {
          const focus: Cell[] = [t[run.source], ...run.changed.map((x) => t[x.index])]
          picker.offer(focus, () => build(board, index, run))
        }
      }
    })
    return picker.best
  },
}

function build(board: Board, index: number, run: BoundRun) {
  const t = board.thermometers[index]
  const fromCell = t[run.source]
  const fromMask = board.cand[fromCell]
  const eliminations: Elimination[] = run.changed.map(({ index: i, keep }) => ({ cell: t[i], digits: digitsOf(board.cand[t[i]] & ~keep) }))
  // Would the thermometer alone (givens, placed digits and its length) have removed the same digits?
  const pure = new Uint16Array(81)
  for (const c of t) pure[c] = board.digits[c] ? 1 << (board.digits[c] - 1) : ALL_DIGITS
  const pureKeep = new Map<number, number>()
  for (const r of [...boundRuns(board.digits, pure, t, 'min'), ...boundRuns(board.digits, pure, t, 'max')]) {
    for (const x of r.changed) pureKeep.set(x.index, (pureKeep.get(x.index) ?? ALL_DIGITS) & x.keep)
  }
  const withSudoku = run.changed.some(({ index: i, keep }) => (board.cand[t[i]] & ~keep & (pureKeep.get(i) ?? ALL_DIGITS)) !== 0)
  return {
    technique: 'thermo-bounds' as const,
    placements: [],
    eliminations,
    focus: [fromCell, ...run.changed.map((x) => t[x.index])],
    reason: { houses: [], thermometers: [index], cells: [fromCell] },
    facts: {
      kind: 'thermo-bounds' as const,
      thermometer: index,
      direction: run.direction,
      fromCell,
      fromDigit: run.direction === 'min' ? lowestDigit(fromMask) : highestDigit(fromMask),
      ranges: run.changed.map(({ index: i, keep }) => ({ cell: t[i], min: lowestDigit(keep), max: highestDigit(keep) })),
      withSudoku,
    },
    difficulty: TECHNIQUES['thermo-bounds'].difficulty,
  }
}
