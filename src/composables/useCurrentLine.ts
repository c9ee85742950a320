import { computed, ref, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { Outline } from '@shared/script'

export interface CurrentLineOptions {
  outline: MaybeRefOrGetter<Outline | null>
  /** The replay position: 0 = the givens, k = after step k. */
  step: MaybeRefOrGetter<number>
  /** Moves the replay to a position. */
  go: (step: number) => void
}

/**
 * Which script line goes with the step on the grid, and moving the replay to a line. The intro goes with the
 * givens, a step line with its steps, the closing line with the end of the path. The closing line shares the
 * last step with the line before it, so a jump to a line pins it: that line stays current until the step moves.
 */
export function useCurrentLine({ outline, step, go }: CurrentLineOptions) {
  const pinnedLine = ref<number | null>(null)

  const lineOfStep = computed(() => {
    const map = new Map<number, number>()
    for (const line of toValue(outline)?.lines ?? []) for (const s of line.steps) map.set(s, line.id)
    return map
  })

  /** Where a line starts on the replay: the givens for the intro, the end for the closing line, else after its first step. */
  function firstStepOf(lineId: number): number | null {
    const doc = toValue(outline)
    const line = doc?.lines.find((l) => l.id === lineId)
    if (!doc || !line) return null
    if (line.kind === 'intro') return 0
    if (line.kind === 'outro') return doc.steps.length
    return line.steps[0] + 1
  }

  const currentLineId = computed<number | null>(() => {
    const doc = toValue(outline)
    if (!doc) return null
    const k = toValue(step)
    if (pinnedLine.value !== null && firstStepOf(pinnedLine.value) === k) return pinnedLine.value
    if (k === 0) return doc.lines[0].id
    return lineOfStep.value.get(k - 1) ?? null
  })

  /** Moves the replay to the line's first step and makes it the current line. */
  function jumpToLine(lineId: number): void {
    const k = firstStepOf(lineId)
    if (k === null) return
    pinnedLine.value = lineId
    go(k)
  }

  /** Like jumpToLine, but leaves the replay alone when the line is already the current one. */
  function selectLine(lineId: number): void {
    if (currentLineId.value !== lineId) jumpToLine(lineId)
  }

  return { currentLineId, jumpToLine, selectLine }
}
