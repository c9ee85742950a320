import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { Outline, OutlineLine } from '@shared/script'
import { conflictKey, type MergeConflict, type ScriptMerge } from '@shared/takes/merge-scripts'

export interface OutlineDifference {
  /** the conflict's key (`conflictKey`), which a choice is recorded under */
  key: string
  /** where both changed: "Line 4", "Pace", "Chapters" */
  label: string
  /** this browser's version; null when it has no such line */
  mine: string | null
  theirs: string | null
}

/** The places both people changed (the merge's conflicts), each as the two versions in words; and how many changes were merged without asking. */
export function useOutlineDiff(merge: MaybeRefOrGetter<ScriptMerge | null>, mine: MaybeRefOrGetter<Outline | null>) {
  const differences = computed<OutlineDifference[]>(() => {
    const m = toValue(merge)
    const a = toValue(mine)
    return m && a ? m.conflicts.map((c) => describeConflict(c, a)) : []
  })
  return { differences }
}

function describeConflict(c: MergeConflict, mine: Outline): OutlineDifference {
  const key = conflictKey(c)
  switch (c.kind) {
    case 'line':
      return { key, label: `Line ${mine.lines.findIndex((l) => l.id === c.lineId) + 1}`, mine: c.mine && describe(c.mine), theirs: c.theirs && describe(c.theirs) }
    case 'setting':
      return { key, label: SETTING_LABELS[c.setting], mine: settingText(c.setting, c.mine), theirs: settingText(c.setting, c.theirs) }
    case 'chapters':
      return { key, label: 'Chapters', mine: c.mine.map((ch) => ch.title).join(' · '), theirs: c.theirs.map((ch) => ch.title).join(' · ') }
    case 'lines':
      return { key, label: 'Lines joined or split', mine: `${c.mine.length} lines`, theirs: `${c.theirs.length} lines` }
  }
}

const SETTING_LABELS = { pace: 'Pace', names: 'Cells named', targetMs: 'Target length', trim: 'Recording cut' } as const

function settingText(setting: keyof typeof SETTING_LABELS, value: unknown): string {
  if (value === undefined) return 'not set'
  if (setting === 'pace') return `${String(value)} wpm`
  if (setting === 'names') return value === 'coords' ? 'as r3c4' : 'in words'
  if (setting === 'targetMs') return `${Math.round(Number(value) / 1000)} s`
  const trim = value as { inMs: number; outMs?: number }
  return `from ${(trim.inMs / 1000).toFixed(1)} s${trim.outMs === undefined ? '' : ` to ${(trim.outMs / 1000).toFixed(1)} s`}`
}

function describe(line: OutlineLine): string {
  const steps = line.steps.length > 1 ? ` [steps ${line.steps[0] + 1}–${line.steps[line.steps.length - 1] + 1}]` : ''
  return `${line.hidden ? '(hidden) ' : ''}${line.text}${steps}`
}
