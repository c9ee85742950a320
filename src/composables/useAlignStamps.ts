import { computed, ref, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { Outline, OutlineEdit } from '@shared/script'
import { formatTenths } from './alignTime'

/** One nudge: a tenth of a second. */
export const NUDGE_MS = 100

export interface AlignStampsOptions {
  outline: MaybeRefOrGetter<Outline | null>
  /** Applies edits as one undoable step (the outline editor's applyAll); returns whether they applied. */
  applyAll: (edits: readonly OutlineEdit[]) => boolean
  /** The recording's position now. */
  now: () => number
}

/**
 * Key stamps: a chosen line, "it starts now" (then the next line is chosen), and nudges of a tenth of a second.
 * Each is an ordinary `alignLine` edit, so the outline editor's undo takes it back and the autosave keeps it.
 */
export function useAlignStamps({ outline, applyAll, now }: AlignStampsOptions) {
  const chosenLineId = ref<number | null>(null)
  /** What the last action did, for the screen's live region. */
  const announcement = ref('')

  const visible = computed(() => toValue(outline)?.lines.filter((l) => !l.hidden) ?? [])
  const numberOf = computed(() => new Map((toValue(outline)?.lines ?? []).map((l, i) => [l.id, i + 1])))
  const chosen = computed(() => visible.value.find((l) => l.id === chosenLineId.value) ?? null)

  // The first line without a time is where stamping picks up; a fully aligned take starts at the top.
  watch(
    visible,
    (lines) => {
      if (chosenLineId.value !== null && lines.some((l) => l.id === chosenLineId.value)) return
      chosenLineId.value = (lines.find((l) => l.alignedStartMs === undefined) ?? lines[0])?.id ?? null
    },
    { immediate: true },
  )

  function choose(lineId: number): void {
    if (visible.value.some((l) => l.id === lineId)) chosenLineId.value = lineId
  }

  function chooseBy(offset: number): void {
    const lines = visible.value
    const at = lines.findIndex((l) => l.id === chosenLineId.value)
    const next = lines[Math.min(Math.max(at + offset, 0), lines.length - 1)]
    if (next) chosenLineId.value = next.id
  }

  /**
   * The chosen line starts now. Later lines stamped earlier than now can't stay (starts run forward), so their
   * times are cleared in the same step; one undo brings them back.
   */
  function stamp(): void {
    const line = chosen.value
    if (!line) return
    const ms = now()
    const after = visible.value.slice(visible.value.indexOf(line) + 1)
    const passed = after.filter((l) => l.alignedStartMs !== undefined && l.alignedStartMs < ms)
    const edits: OutlineEdit[] = [...passed.map((l) => ({ op: 'alignLine' as const, lineId: l.id, startMs: null })), { op: 'alignLine', lineId: line.id, startMs: ms }]
    if (!applyAll(edits)) return
    const cleared = passed.length > 0 ? ` Cleared the later ${passed.length === 1 ? 'time' : 'times'} of ${passed.map((l) => `line ${numberOf.value.get(l.id)}`).join(', ')}.` : ''
    announcement.value = `Line ${numberOf.value.get(line.id)} starts at ${formatTenths(ms)}.${cleared}`
    chooseBy(1)
  }

  /** Moves the chosen line's start by `deltaMs`; a line without a time yet has nothing to move. */
  function nudge(deltaMs: number): void {
    const line = chosen.value
    if (!line) return
    const number = numberOf.value.get(line.id)
    if (line.alignedStartMs === undefined) {
      announcement.value = `Line ${number} has no time yet: stamp it first.`
      return
    }
    const ms = Math.max(0, line.alignedStartMs + deltaMs)
    if (applyAll([{ op: 'alignLine', lineId: line.id, startMs: ms }])) announcement.value = `Line ${number} starts at ${formatTenths(ms)}.`
  }

  /** Takes the chosen line's time away: it goes back to an estimate. */
  function clear(): void {
    const line = chosen.value
    if (!line || line.alignedStartMs === undefined) return
    if (applyAll([{ op: 'alignLine', lineId: line.id, startMs: null }])) announcement.value = `Line ${numberOf.value.get(line.id)} has no time now.`
  }

  return { chosenLineId, chosen, announcement, choose, chooseBy, stamp, nudge, clear }
}
