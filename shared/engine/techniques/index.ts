/** The technique modules in the order the solve loop tries them, grouped into tiers of equal difficulty. */
import type { TechniqueId } from '../types'
import { TECHNIQUES } from './catalog'
import { contradiction } from './contradiction'
import type { Technique } from './deduction'
import { hiddenSingle } from './hidden-single'
import { hiddenSubset } from './hidden-subset'
import { lockedBoxLine, lockedLineBox } from './locked-candidates'
import { nakedSingle } from './naked-single'
import { nakedSubset } from './naked-subset'
import { thermoBounds } from './thermo-bounds'
import { thermoLength } from './thermo-length'

// Every technique id needs a module here. Within a tier, this order breaks ties between equally
// near deductions (string keys keep their insertion order).
const MODULES: Readonly<Record<TechniqueId, Technique>> = {
  'hidden-single': hiddenSingle,
  'naked-single': nakedSingle,
  'thermo-length': thermoLength,
  'thermo-bounds': thermoBounds,
  'locked-box-line': lockedBoxLine,
  'locked-line-box': lockedLineBox,
  'naked-pair': nakedSubset(2),
  'hidden-pair': hiddenSubset(2),
  'naked-triple': nakedSubset(3),
  'hidden-triple': hiddenSubset(3),
  contradiction,
}

/** Techniques grouped by difficulty, easiest tier first; within a tier the nearest deduction wins. */
export const TIERS: Technique[][] = groupByDifficulty()

function groupByDifficulty(): Technique[][] {
  const tiers = new Map<number, Technique[]>()
  for (const [id, module] of Object.entries(MODULES) as [TechniqueId, Technique][]) {
    const d = TECHNIQUES[id].difficulty
    tiers.set(d, [...(tiers.get(d) ?? []), module])
  }
  return [...tiers.entries()].sort((a, b) => a[0] - b[0]).map(([, list]) => list)
}
