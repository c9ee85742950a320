import { computed, shallowRef, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useTimeoutFn } from '@vueuse/core'
import { validatePuzzle } from '@shared/engine'
import type { ValidationError } from '@shared/engine'
import type { PuzzleCheck } from '@shared/schemas/studio'

export interface PuzzleCheckResult {
  status: PuzzleCheck
  problems: ValidationError[]
}

export interface PuzzleCheckOptions {
  givens: MaybeRefOrGetter<ArrayLike<number>>
  thermometers: MaybeRefOrGetter<number[][]>
  /** Quiet time after the last edit before checking again (ms). */
  delay?: number
}

const STATUS_TEXT: Record<PuzzleCheck, string> = {
  unique: 'Unique solution',
  'no-solution': 'No solution',
  'multiple-solutions': 'Several solutions',
  invalid: 'Needs fixing',
}

/** Words for a check status, shared by the Puzzle and Library screens. */
export function checkStatusText(status: PuzzleCheck): string {
  return STATUS_TEXT[status]
}

/** Runs the shared engine's validation (the exact solver counts to 2 at most) on a grid. */
function checkPuzzle(givens: ArrayLike<number>, thermometers: number[][]): PuzzleCheckResult {
  const problems = validatePuzzle({ title: 'Draft', givens: Array.from(givens), thermometers })
  if (!problems.length) return { status: 'unique', problems }
  const codes = new Set(problems.map((p) => p.code))
  if (codes.size === 1 && codes.has('no-solution')) return { status: 'no-solution', problems }
  if (codes.size === 1 && codes.has('multiple-solutions')) return { status: 'multiple-solutions', problems }
  return { status: 'invalid', problems }
}

/**
 * Live check of the grid being entered: re-runs the engine a short while after the last edit, so typing a
 * row of givens doesn't solve the grid nine times.
 */
export function usePuzzleCheck(options: PuzzleCheckOptions) {
  const delay = options.delay ?? 250
  // The inputs last checked: a flush() right after an edit makes the watcher's later call a no-op.
  let checkedGivens: ArrayLike<number> | undefined
  let checkedThermometers: number[][] | undefined
  const result = shallowRef<PuzzleCheckResult>(run())
  const { isPending: pending, start, stop } = useTimeoutFn(flush, delay, { immediate: false })

  function run(): PuzzleCheckResult {
    checkedGivens = toValue(options.givens)
    checkedThermometers = toValue(options.thermometers)
    return checkPuzzle(checkedGivens, checkedThermometers)
  }

  /** Checks now (e.g. right before saving), cancelling a waiting check. */
  function flush(): PuzzleCheckResult {
    stop()
    result.value = run()
    return result.value
  }

  watch([() => toValue(options.givens), () => toValue(options.thermometers)], ([givens, thermometers]) => {
    if (givens === checkedGivens && thermometers === checkedThermometers) return
    start()
  })

  const status = computed(() => result.value.status)
  const problems = computed(() => result.value.problems)
  const statusText = computed(() => STATUS_TEXT[result.value.status])
  // Before anything is entered, "several solutions" is the expected state, not a problem to point at.
  const nothingEntered = computed(() => Array.from(toValue(options.givens)).every((d) => !d) && toValue(options.thermometers).length === 0)
  const problemCells = computed(() => (nothingEntered.value ? [] : [...new Set(result.value.problems.flatMap((p) => p.cells))]))
  /** Structural problems (duplicate givens, broken thermometers): such a puzzle can't be saved. */
  const isMalformed = computed(() => result.value.status === 'invalid')
  const isUnique = computed(() => result.value.status === 'unique')

  return { result, pending, status, statusText, problems, problemCells, isMalformed, isUnique, flush }
}
