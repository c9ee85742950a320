import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { TECHNIQUES } from '@shared/engine'
import type { Step } from '@shared/engine'
import { boardAt, type BoardPicture } from '@shared/picture/board-at'
import type { Outline } from '@shared/script'

export interface ReplayHeader {
  /** 0 before any step */
  number: number
  plainName: string
  tradeTerm: string
  /** the engine's one-line description of the step */
  text: string
}

/**
 * What the grid shows at a replay position (the shared `boardAt`: the state after step k with that step's
 * highlights), and the step's header. State is rebuilt from the givens on every change; the engine's replay
 * costs microseconds, so there is no cache to keep in step with edits.
 */
export function useReplay(outline: MaybeRefOrGetter<Outline | null>, step: MaybeRefOrGetter<number>) {
  // Edits never touch the puzzle or the steps, so these keep their identity across edits and the board isn't rebuilt.
  const puzzle = computed(() => toValue(outline)?.puzzle ?? null)
  const steps = computed<Step[]>(() => toValue(outline)?.steps ?? [])
  const stuck = computed(() => toValue(outline)?.status === 'stuck')
  const k = computed(() => Math.min(Math.max(toValue(step), 0), steps.value.length))
  const current = computed<Step | null>(() => (k.value > 0 ? (steps.value[k.value - 1] ?? null) : null))

  const board = computed<BoardPicture | null>(() => {
    const p = puzzle.value
    return p ? boardAt({ puzzle: p, steps: steps.value, status: stuck.value ? 'stuck' : 'solved' }, k.value) : null
  })

  const header = computed<ReplayHeader | null>(() => {
    const s = current.value
    if (!s) return null
    const info = TECHNIQUES[s.technique]
    return { number: k.value, plainName: info.plainName, tradeTerm: info.tradeTerm, text: s.text }
  })

  /** On the last step of a path that stops short: the place where a person takes over. */
  const atStop = computed(() => stuck.value && k.value === steps.value.length && steps.value.length > 0)

  return { board, header, stuck, atStop, stepCount: computed(() => steps.value.length) }
}

/** Everything the grid draws at one replay position (GridBoard's props). */
export type ReplayBoard = BoardPicture
