import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { lineEstimates } from '@shared/rehearsal/compare'
import type { Calibration } from '@shared/schemas/rehearsal'
import type { Outline, OutlineLine } from '@shared/script'

/**
 * The take as the prompter reads it: the lines said (hidden ones are not), each with this presenter's estimate,
 * the chapter each falls in, and where the grid stands while a line is said.
 */
export function usePrompterScript(outline: MaybeRefOrGetter<Outline | null>, calibration: MaybeRefOrGetter<Calibration | null>) {
  const estimates = computed(() => {
    const doc = toValue(outline)
    return doc ? lineEstimates(doc, toValue(calibration)) : []
  })
  const lines = computed(() => estimates.value.map((e) => ({ lineId: e.lineId, estimateMs: e.estimateMs })))

  const byId = computed(() => new Map((toValue(outline)?.lines ?? []).map((l) => [l.id, l])))
  const chapterOf = computed(() => {
    const doc = toValue(outline)
    const map = new Map<number, string>()
    if (!doc) return map
    const starts = new Map(doc.chapters.map((c) => [c.lineId, c.title]))
    let title: string | null = null
    for (const line of doc.lines) {
      title = starts.get(line.id) ?? title
      if (title) map.set(line.id, title)
    }
    return map
  })

  /** The replay position while a line is said: the givens for the intro, after its last step (its highlights shown), the end for the close. */
  function stepOf(line: OutlineLine): number {
    const doc = toValue(outline)
    if (!doc || line.kind === 'intro') return 0
    if (line.kind === 'outro') return doc.steps.length
    return line.steps[line.steps.length - 1] + 1
  }

  return {
    estimates,
    lines,
    line: (lineId: number) => byId.value.get(lineId) ?? null,
    chapter: (lineId: number) => chapterOf.value.get(lineId) ?? null,
    stepOf,
  }
}
