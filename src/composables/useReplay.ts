import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { stateAt, TECHNIQUES } from '@shared/engine'
import type { Puzzle, Step } from '@shared/engine'
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
 * What the grid shows at a replay position: the state after step k with that step's focus, reasons,
 * eliminations, placements and contradiction chain. State is rebuilt from the givens on every change;
 * the engine's replay costs microseconds, so there is no cache to keep in step with edits.
 */
export function useReplay(outline: MaybeRefOrGetter<Outline | null>, step: MaybeRefOrGetter<number>) {
  // Edits never touch the puzzle or the steps, so these keep their identity across edits and aren't rebuilt.
  const puzzleDoc = computed(() => toValue(outline)?.puzzle ?? null)
  const steps = computed<readonly Step[]>(() => toValue(outline)?.steps ?? [])
  const puzzle = computed<Puzzle | null>(() => {
    const p = puzzleDoc.value
    if (!p) return null
    return { title: '', givens: Array.from(p.givens, (ch) => (ch === '.' ? 0 : Number(ch))), thermometers: p.thermometers }
  })
  const stuck = computed(() => toValue(outline)?.status === 'stuck')
  const k = computed(() => Math.min(Math.max(toValue(step), 0), steps.value.length))
  const current = computed<Step | null>(() => (k.value > 0 ? (steps.value[k.value - 1] ?? null) : null))

  const board = computed(() => {
    const p = puzzle.value
    if (!p) return null
    const state = stateAt(p, steps.value, k.value)
    const s = current.value
    const atStop = stuck.value && k.value === steps.value.length
    const empty: number[] = []
    if (atStop) for (let c = 0; c < 81; c++) if (!state.digits[c]) empty.push(c)
    return {
      digits: state.digits,
      givens: state.givens,
      thermometers: p.thermometers,
      candidates: state.candidates,
      // Where the engine stopped, every empty cell shows what is left: that is where a person takes over.
      marks: atStop ? empty : state.marks,
      focus: s?.focus ?? [],
      reasonCells: s?.reason.cells ?? [],
      reasonHouses: s?.reason.houses ?? [],
      reasonThermometers: s?.reason.thermometers ?? [],
      eliminated: s?.eliminations ?? [],
      placed: s?.placements.map((pl) => pl.cell) ?? [],
      chain: s?.facts.kind === 'contradiction' ? [s.facts.cell, ...s.facts.chain.map((link) => link.cell)] : [],
    }
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
export type ReplayBoard = NonNullable<ReturnType<typeof useReplay>['board']['value']>
