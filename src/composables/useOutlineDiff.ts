import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { Outline, OutlineLine } from '@shared/script'

export interface OutlineDifference {
  key: string
  /** what differs: "Line 4", "Pace", "Chapters" */
  label: string
  /** this browser's version; null when it has no such line */
  mine: string | null
  theirs: string | null
}

/** Line-by-line differences between two versions of an outline (lines matched by id), plus settings and chapters. */
export function useOutlineDiff(mine: MaybeRefOrGetter<Outline | null>, theirs: MaybeRefOrGetter<Outline | null>) {
  const differences = computed<OutlineDifference[]>(() => {
    const a = toValue(mine)
    const b = toValue(theirs)
    return a && b ? diffOutlines(a, b) : []
  })
  const sameLines = computed(() => {
    const a = toValue(mine)
    if (!a) return 0
    return a.lines.length - differences.value.filter((d) => d.key.startsWith('line-') && d.mine !== null).length
  })
  return { differences, sameLines }
}

function diffOutlines(mine: Outline, theirs: Outline): OutlineDifference[] {
  const out: OutlineDifference[] = []
  if (mine.pace !== theirs.pace) out.push({ key: 'pace', label: 'Pace', mine: `${mine.pace} wpm`, theirs: `${theirs.pace} wpm` })
  if (mine.names !== theirs.names) {
    out.push({ key: 'names', label: 'Cells named', mine: namesLabel(mine.names), theirs: namesLabel(theirs.names) })
  }
  const chaptersOf = (o: Outline) => o.chapters.map((c) => `${lineNumber(o, c.lineId)}. ${c.title}`).join(' · ')
  if (chaptersOf(mine) !== chaptersOf(theirs)) out.push({ key: 'chapters', label: 'Chapters', mine: chaptersOf(mine), theirs: chaptersOf(theirs) })

  const theirsById = new Map(theirs.lines.map((l) => [l.id, l]))
  const mineIds = new Set(mine.lines.map((l) => l.id))
  mine.lines.forEach((line, i) => {
    const other = theirsById.get(line.id)
    const a = describe(line)
    const b = other ? describe(other) : null
    if (a !== b) out.push({ key: `line-${line.id}`, label: `Line ${i + 1}`, mine: a, theirs: b })
  })
  theirs.lines.forEach((line, i) => {
    if (!mineIds.has(line.id)) out.push({ key: `line-${line.id}`, label: `Line ${i + 1}`, mine: null, theirs: describe(line) })
  })
  return out
}

function describe(line: OutlineLine): string {
  const steps = line.steps.length > 1 ? ` [steps ${line.steps[0] + 1}–${line.steps[line.steps.length - 1] + 1}]` : ''
  return `${line.hidden ? '(hidden) ' : ''}${line.text}${steps}`
}

function lineNumber(o: Outline, lineId: number): number {
  return o.lines.findIndex((l) => l.id === lineId) + 1
}

function namesLabel(names: Outline['names']): string {
  return names === 'coords' ? 'as r3c4' : 'in words'
}
