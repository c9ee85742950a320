/**
 * Folding: a run of easy placements in one area is said as one line
 * ("…and that finishes the thermometer: 6, 7, 8 and 9"). The line keeps every step it covers,
 * so replay stays exact.
 */
import type { Cell, Step } from '../engine/types'
import { boxOf, colOf, rowOf } from '../grid'
import { segmentSteps, TRIVIAL } from './segments'

/** Longer runs than this stop sounding like "a few quick ones". */
export const MAX_RUN = 6

/**
 * Groups step indices into lines: runs of easy steps in one area together, the thermometer lengths
 * at the start together, everything else alone.
 */
export function groupSteps(steps: Step[], thermometers: Cell[][]): number[][] {
  const breakIn = steps.findIndex((s) => s.placements.length > 0)
  const starts = new Set(segmentSteps(steps, thermometers).map((s) => s.start))
  // The break-in is a moment, and a chapter start opens a line: neither is buried in a run.
  // A run names digits and cells, not reasons: only singles a viewer can check on the grid fold.
  const foldable = (i: number) => TRIVIAL.has(steps[i].technique) && i !== breakIn && steps[i].placements.length > 0 && blockersVisible(steps[i])
  const lengthOnly = (i: number) => steps[i].facts.kind === 'thermo-length' && steps[i].placements.length === 0
  const groups: number[][] = []
  for (let i = 0; i < steps.length; i++) {
    const last = groups[groups.length - 1]
    if (last !== undefined && lengthOnly(i) && last.every(lengthOnly) && last[last.length - 1] === i - 1) {
      last.push(i)
      continue
    }
    const extend =
      last !== undefined &&
      foldable(i) &&
      !starts.has(i) &&
      last.length < MAX_RUN &&
      last.every(foldable) &&
      last[last.length - 1] === i - 1 &&
      oneArea([...last, i].flatMap((k) => steps[k].placements.map((p) => p.cell)), thermometers)
    if (extend) last.push(i)
    else groups.push([i])
  }
  return groups
}

/**
 * True when a single rests only on digits on the grid: none of its other digits or other cells was
 * ruled out by an earlier step (pencil marks a viewer may not have in mind).
 */
function blockersVisible(step: Step): boolean {
  const f = step.facts
  if (f.kind === 'single-cell') return f.seen.ruledOut.length === 0
  if (f.kind === 'single-house') return (f.blockers ?? []).every((b) => 'peer' in b)
  return true
}

/** True when the cells share a thermometer, a box, a row or a column. */
function oneArea(cells: Cell[], thermometers: Cell[][]): boolean {
  if (cells.length === 0) return false
  if (thermometers.some((path) => cells.every((c) => path.includes(c)))) return true
  return [boxOf, rowOf, colOf].some((of) => cells.every((c) => of(c) === of(cells[0])))
}
