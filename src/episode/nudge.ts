/**
 * The three nudges of solve-along, worked out from a step: where to look (an area, never a digit), what kind
 * of step it is, then the step itself. The area is as wide as the step allows, so the first nudge narrows
 * the search without giving the answer away.
 */
import { boxOf, colOf, houseName, rowOf } from '@shared/grid'
import type { HouseRef } from '@shared/grid'
import { TECHNIQUES } from '@shared/engine/techniques/catalog'
import { byFactsKind, type FactsTable } from '@shared/engine/facts-table'
import type { Step } from '@shared/schemas/step'

/** Where to look: the sentence, and what the grid tints for it (houses, or a thermometer). */
export interface NudgeArea {
  text: string
  houses: HouseRef[]
  thermometers: number[]
}

const boxArea = (box: number): NudgeArea => ({ text: `Look at box ${box + 1}.`, houses: [{ kind: 'box', index: box }], thermometers: [] })
const houseArea = (house: HouseRef): NudgeArea => ({ text: `Look at ${houseName(house)}.`, houses: [house], thermometers: [] })

/** Several rows (or columns) at once: "Look at rows 2 and 7." */
function linesArea(lines: HouseRef[]): NudgeArea {
  const numbers = lines.map((h) => h.index + 1)
  const list = numbers.length <= 1 ? numbers.join('') : `${numbers.slice(0, -1).join(', ')} and ${numbers[numbers.length - 1]}`
  return { text: `Look at ${lines[0]?.kind ?? 'row'}s ${list}.`, houses: lines, thermometers: [] }
}

/** Thermometers are named by where their bulb sits: the page shows no thermometer numbers. */
function thermometerArea(index: number, bulbs: readonly number[]): NudgeArea {
  const bulb = bulbs[index]
  const where = bulb === undefined ? '' : ` with its bulb in row ${rowOf(bulb) + 1}, column ${colOf(bulb) + 1}`
  return { text: `Look at the thermometer${where}.`, houses: [], thermometers: [index] }
}

// One entry per kind of step facts, so a new kind fails to compile until it has its nudge.
const AREAS: FactsTable<NudgeArea, [bulbs: readonly number[]]> = {
  'single-cell': (f) => boxArea(boxOf(f.cell)),
  'single-house': (f) => houseArea(f.house),
  subset: (f) => houseArea(f.house),
  locked: (f) => boxArea(f.box),
  'thermo-length': (f, bulbs) => thermometerArea(f.thermometer, bulbs),
  'thermo-bounds': (f, bulbs) => thermometerArea(f.thermometer, bulbs),
  // the house whose places for the digit start the deduction; the thermometer is the second look
  'thermo-pointing': (f) => houseArea(f.house),
  'thermo-either': (f) => houseArea(f.house),
  'thermo-ends': (f) => houseArea(f.house),
  fish: (f) => linesArea(f.baseLines),
  wing: (f) => boxArea(boxOf(f.pivot)),
  'w-wing': (f) => houseArea(f.link.house),
  // the choice: the house holding the digit's places, or the box of the two-way cell
  'either-way': (f) => (f.house ? houseArea(f.house) : boxArea(boxOf(f.sides[0].cell))),
  contradiction: (f) => boxArea(boxOf(f.cell)),
}

/** The first nudge: the area a step happens in. `thermometers` are the puzzle's paths, bulb first. */
export function nudgeArea(step: Step, thermometers: readonly (readonly number[])[]): NudgeArea {
  return byFactsKind(AREAS, step.facts, thermometers.map((t) => t[0]!))
}

/** The second nudge: the kind of step, in Gridcue's plain words. */
export function nudgeKind(step: Step): string {
  return TECHNIQUES[step.technique].plainName
}
