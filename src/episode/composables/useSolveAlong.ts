import { computed, ref, watch } from 'vue'
import type { EpisodePage } from '@shared/schemas/episode'
import type { BoardPicture } from '@shared/picture/board-at'
import { pageBoard, withArea } from '../board'
import { nudgeArea, nudgeKind } from '../nudge'
import { placementsOf, stepsThrough } from '../position'

export type NudgeLevel = 0 | 1 | 2 | 3

/** What the viewer has asked to see of the next step so far (level 1: where, 2: what kind, 3: the step). */
export interface Nudge {
  level: Exclude<NudgeLevel, 0>
  where: string
  kind: string
  placements: string[]
  text: string
}

interface SavedPosition {
  on: boolean
  line: number
  level: NudgeLevel
}

/**
 * Solve-along: the viewer's own position in the solve (lines 0..line−1 are theirs to see) and the nudges
 * asked for on the next line. Everything past the position stays out of the page. The position is kept in
 * this browser only, per episode, under `storageKey`.
 */
export function useSolveAlong(page: EpisodePage, storageKey: string, storage: Pick<Storage, 'getItem' | 'setItem'> = localStorage) {
  const lineCount = page.lines.length
  // Lines without steps (the intro, the outro) give nothing away, so the position never stops on one.
  const settle = (line: number) => {
    let at = Math.min(Math.max(line, 0), lineCount)
    while (at < lineCount && page.lines[at]!.steps.length === 0) at++
    return at
  }

  const saved = readSaved(storage, storageKey)
  const on = ref(saved?.on ?? false)
  const line = ref(settle(saved?.line ?? 0))
  const level = ref<NudgeLevel>(saved && line.value < lineCount ? saved.level : 0)

  const done = computed(() => line.value >= lineCount)
  const atStart = computed(() => line.value === settle(0) && level.value === 0)
  /** the lines the viewer has reached, the only ones the page shows */
  const reached = computed(() => page.lines.slice(0, line.value))
  const next = computed(() => (done.value ? null : page.lines[line.value]!))

  const nudge = computed<Nudge | null>(() => {
    const target = next.value
    const step = target ? page.steps[target.steps[0]!] : undefined
    if (!target || !step || level.value === 0) return null
    return {
      level: level.value,
      where: nudgeArea(step, page.puzzle.thermometers).text,
      kind: nudgeKind(step),
      placements: placementsOf(page, target),
      text: target.text,
    }
  })

  /** The grid at the viewer's position: never a digit past it, except the one a third nudge has shown. */
  const board = computed<BoardPicture>(() => {
    const target = next.value
    if (target && level.value === 3) return pageBoard(page, stepsThrough(page.lines, line.value))
    const before = pageBoard(page, stepsThrough(page.lines, line.value - 1))
    const step = target ? page.steps[target.steps[0]!] : undefined
    return step && level.value > 0 ? withArea(before, nudgeArea(step, page.puzzle.thermometers)) : before
  })

  function toggle(): void {
    on.value = !on.value
  }
  function nudgeMore(): void {
    if (!done.value && level.value < 3) level.value = (level.value + 1) as NudgeLevel
  }
  function moveOn(): void {
    if (done.value) return
    line.value = settle(line.value + 1)
    level.value = 0
  }
  function restart(): void {
    line.value = settle(0)
    level.value = 0
  }

  watch([on, line, level], () => {
    try {
      storage.setItem(storageKey, JSON.stringify({ on: on.value, line: line.value, level: level.value } satisfies SavedPosition))
    } catch {
      // Storage full or refused (private windows): the position lasts until the page closes.
    }
  })

  return { on, line, level, done, atStart, reached, nudge, board, toggle, nudgeMore, moveOn, restart }
}

/** The key the position of an episode is kept under. */
export const solveAlongKey = (channelSlug: string, episodeSlug: string) => `gridcue.solve-along.${channelSlug}.${episodeSlug}`

function readSaved(storage: Pick<Storage, 'getItem'>, key: string): SavedPosition | null {
  try {
    const value: unknown = JSON.parse(storage.getItem(key) ?? 'null')
    if (typeof value !== 'object' || value === null) return null
    const { on, line, level } = value as Record<string, unknown>
    if (typeof on !== 'boolean' || !Number.isInteger(line) || (line as number) < 0) return null
    return { on, line: line as number, level: level === 1 || level === 2 || level === 3 ? level : 0 }
  } catch {
    return null
  }
}
