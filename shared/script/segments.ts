/**
 * Where a solve turns a corner: the break-in, moves to a new part of the grid, the final
 * clean-up. Worked out on steps (not lines) so that folding, chapters and the spoken lead-ins
 * at chapter starts all agree.
 */
import type { Cell, Step } from '../engine/types'
import { boxOf } from '../grid'
import { boxWords, capitalise, thermoWords } from './words'

export interface Segment {
  /** index of the step the segment starts at */
  start: number
  title: string
  /** a few words said at the start of the segment's first line, if any */
  lead?: string
}

/** Techniques quick enough to place without much talk: they fold into runs and may be hidden. */
export const TRIVIAL: ReadonlySet<Step['technique']> = new Set<Step['technique']>(['naked-single', 'hidden-single'])
/** A clean-up tail shorter than this isn't worth its own chapter. */
const MIN_CLEANUP_STEPS = 6
/** An area chapter needs at least this many steps, so a busy solve doesn't get a chapter a minute. */
const MIN_AREA_STEPS = 5
/** Upper bound on area chapters between the break-in and the clean-up. */
const MAX_AREA_CHAPTERS = 5

/** The box a step mostly happens in: where it places, else what it highlights. */
export function stepBox(step: Step): number {
  const cell = step.placements[0]?.cell ?? step.focus[0] ?? step.eliminations[0]?.cell ?? 40
  return boxOf(cell)
}

/**
 * The solve's segments. "Finding the break-in" ends at the break-in; each later segment is titled by
 * what happens in it: the thermometer most of its steps work on ("The long thermometer"), else
 * the box it settles in. Two segments in a row about the same place are one.
 */
export function segmentSteps(steps: Step[], thermometers: Cell[][] = []): Segment[] {
  const first = steps.findIndex((s) => s.placements.length > 0)
  const segments: Segment[] = [{ start: 0, title: first === 0 ? 'The break-in' : 'Finding the break-in' }]
  if (first < 0) return segments

  let lastHard = -1
  steps.forEach((s, i) => {
    if (!TRIVIAL.has(s.technique)) lastHard = i
  })
  const cleanup = Math.max(lastHard + 1, first + 1)
  const hasCleanup = steps.length - cleanup >= MIN_CLEANUP_STEPS && cleanup > first + 1
  const middleEnd = hasCleanup ? cleanup : steps.length

  const middle = first + 1
  const minSteps = Math.max(MIN_AREA_STEPS, Math.ceil((middleEnd - middle) / MAX_AREA_CHAPTERS))
  // The break-in chapter runs on until the solve first moves elsewhere: a chapter of one line helps nobody.
  // after a search for the break-in, the story moves on at the step after it
  const starts: number[] = first > 0 && middle < middleEnd ? [middle] : []
  let s = 0
  for (let i = middle + 1; i < middleEnd; i++) {
    const here = stepBox(steps[i])
    const settles = i + 1 >= middleEnd || stepBox(steps[i + 1]) === here
    const longEnough = i - Math.max(s, middle) >= minSteps && middleEnd - i >= minSteps
    if (longEnough && settles && here !== dominantBox(steps, s, i)) {
      starts.push(i)
      s = i
    }
  }
  const visited = new Set<string>()
  let previous: string | undefined
  starts.forEach((start, k) => {
    const end = starts[k + 1] ?? middleEnd
    const box = dominantBox(steps, start, end)
    const thermo = dominantThermometer(steps, start, end)
    const name = thermo !== undefined ? thermoWords(thermo, { style: 'words', thermometers }) : boxWords(box, { style: 'words', thermometers: [] })
    // the same place twice in a row is one chapter, never "The central box" then "Back to the central box"
    if (name === previous) return
    previous = name
    const again = visited.has(name)
    visited.add(name)
    const title = again ? `Back to ${name}` : capitalise(name)
    // Only announce the move when the first step really is in that box; otherwise it would mislead.
    // openers the phrasings don't use, so a lead-in never echoes a line just before it
    const leads = again ? [`Back to ${name}.`, `Returning to ${name}.`] : [`Heading over to ${name}.`, `Over to ${name} now.`, `Onward to ${name}.`]
    const lead = thermo === undefined && stepBox(steps[start]) === box ? leads[k % leads.length] : undefined
    segments.push({ start, title, lead })
  })
  if (hasCleanup) segments.push({ start: cleanup, title: 'Filling in the rest', lead: 'Mostly filling in from here.' })
  return segments
}

/** The thermometer at least half of the steps work on (by their facts or reason), if there is one. */
function dominantThermometer(steps: Step[], from: number, to: number): number | undefined {
  const counts = new Map<number, number>()
  for (let i = from; i < to; i++) {
    const f = steps[i].facts
    const t = 'thermometer' in f && typeof f.thermometer === 'number' ? f.thermometer : steps[i].reason.thermometers[0]
    if (t !== undefined) counts.set(t, (counts.get(t) ?? 0) + 1)
  }
  const [best] = [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0])
  return best && best[1] * 2 >= to - from ? best[0] : undefined
}

function dominantBox(steps: Step[], from: number, to: number): number {
  const counts = new Array<number>(9).fill(0)
  for (let i = from; i < to; i++) counts[stepBox(steps[i])]++
  return counts.indexOf(Math.max(...counts))
}
