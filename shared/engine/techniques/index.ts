/** The technique modules in the order the solve loop tries them, grouped into tiers of equal difficulty. */
import type { TechniqueId } from '../types'
import { TECHNIQUES } from './catalog'
import { contradiction } from './contradiction'
import type { Technique } from './deduction'
import { eitherWay } from './either-way'
import { fish } from './fish'
import { hiddenSingle } from './hidden-single'
import { hiddenSubset } from './hidden-subset'
import { lockedBoxLine, lockedLineBox } from './locked-candidates'
import { nakedSingle } from './naked-single'
import { nakedSubset } from './naked-subset'
import { thermoBounds } from './thermo-bounds'
import { thermoEither } from './thermo-either'
import { thermoEnds } from './thermo-ends'
import { thermoLength } from './thermo-length'
import { thermoPointing } from './thermo-pointing'
import { wWing } from './w-wing'
import { xyWing } from './xy-wing'
import { xyzWing } from './xyz-wing'

// Every technique id needs a module here. Within a tier, this order breaks ties between equally
// near deductions (string keys keep their insertion order).
const MODULES: Readonly<Record<TechniqueId, Technique>> = {
  'hidden-single': hiddenSingle,
  'naked-single': nakedSingle,
  'thermo-length': thermoLength,
  'thermo-bounds': thermoBounds,
  'locked-box-line': lockedBoxLine,
  'locked-line-box': lockedLineBox,
  'thermo-pointing': thermoPointing,
  'thermo-either': thermoEither,
  'naked-pair': nakedSubset(2),
  'hidden-pair': hiddenSubset(2),
  'thermo-ends': thermoEnds,
  'naked-triple': nakedSubset(3),
  'hidden-triple': hiddenSubset(3),
  'x-wing': fish(2),
  'xy-wing': xyWing,
  swordfish: fish(3),
  'xyz-wing': xyzWing,
  'w-wing': wWing,
  'either-way': eitherWay,
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
