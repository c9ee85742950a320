import { computed, onScopeDispose, ref, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useIntervalFn } from '@vueuse/core'

/** A line as the prompter shows and times it. */
export interface PrompterLine {
  lineId: number
  estimateMs: number
}

/** Where a line began, from the start of the run: the key stamps a recording of the run is aligned by. */
export interface LineStamp {
  lineId: number
  atMs: number
}

export interface PrompterOptions {
  /** the lines said, in order */
  lines: MaybeRefOrGetter<readonly PrompterLine[]>
  /** move on by itself when the current line has had its estimated time */
  autoAdvance: MaybeRefOrGetter<boolean>
  /** the clock; Date.now unless a test gives another */
  now?: () => number
}

// often enough for a seconds display, rarely enough to cost nothing
const TICK_MS = 250

/**
 * A timed run through a take. The first advance starts the clock on the first line; each advance closes the
 * current line and opens the next, each step back closes it and re-opens the one before (time said again is
 * added to it), and advancing from the last line ends the run. A line's time is everything spent on it.
 */
export function usePrompter({ lines, autoAdvance, now = Date.now }: PrompterOptions) {
  const index = ref(0)
  const phase = ref<'ready' | 'running' | 'finished'>('ready')
  const spent = ref<Record<number, number>>({})
  const reached = ref<number[]>([])
  const stamps = ref<LineStamp[]>([])
  const clock = ref(now())
  let runStartedAt = 0
  let lineStartedAt = 0
  let endedAt = 0

  const list = computed(() => toValue(lines))
  const current = computed<PrompterLine | null>(() => list.value[index.value] ?? null)
  const next = computed<PrompterLine | null>(() => list.value[index.value + 1] ?? null)

  const ticker = useIntervalFn(() => (clock.value = now()), TICK_MS, { immediate: false })

  function open(): void {
    const line = current.value
    if (!line) return
    lineStartedAt = now()
    clock.value = lineStartedAt
    if (!reached.value.includes(line.lineId)) reached.value.push(line.lineId)
    stamps.value.push({ lineId: line.lineId, atMs: lineStartedAt - runStartedAt })
  }

  function close(): void {
    const line = current.value
    if (!line) return
    const t = now()
    spent.value = { ...spent.value, [line.lineId]: (spent.value[line.lineId] ?? 0) + (t - lineStartedAt) }
    lineStartedAt = t
  }

  function start(): void {
    if (phase.value !== 'ready' || !current.value) return
    phase.value = 'running'
    runStartedAt = now()
    open()
    ticker.resume()
  }

  function advance(): void {
    if (phase.value === 'ready') return start()
    if (phase.value !== 'running') return
    close()
    if (index.value + 1 < list.value.length) {
      index.value++
      open()
    } else finish()
  }

  function back(): void {
    if (phase.value !== 'running' || index.value === 0) return
    close()
    index.value--
    open()
  }

  function finish(): void {
    if (phase.value !== 'running') return
    close()
    endedAt = now()
    clock.value = endedAt
    phase.value = 'finished'
    ticker.pause()
  }

  /** Back to the first line with nothing timed, for another run. */
  function reset(): void {
    ticker.pause()
    phase.value = 'ready'
    index.value = 0
    spent.value = {}
    reached.value = []
    stamps.value = []
  }

  const elapsedMs = computed(() => (phase.value === 'ready' ? 0 : (phase.value === 'finished' ? endedAt : clock.value) - runStartedAt))
  /** time on the current line so far, earlier visits included */
  const onLineMs = computed(() => {
    const line = current.value
    if (!line) return 0
    return (spent.value[line.lineId] ?? 0) + (phase.value === 'running' ? Math.max(0, clock.value - lineStartedAt) : 0)
  })
  const remainingMs = computed(() => {
    if (phase.value === 'finished') return 0
    const later = list.value.slice(index.value + 1).reduce((sum, l) => sum + l.estimateMs, 0)
    return Math.max(0, (current.value?.estimateMs ?? 0) - onLineMs.value) + later
  })
  /** what the run measured, in the order the lines were first reached */
  const timedLines = computed(() => reached.value.map((lineId) => ({ lineId, ms: Math.round(spent.value[lineId] ?? 0) })))

  // automatic advance: a timer for what is left of the current line's estimate, set again whenever that changes
  // (after the change has settled: start() and advance() open the new line after moving to it)
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(
    [index, phase, () => toValue(autoAdvance), () => current.value?.estimateMs],
    () => {
      clearTimeout(timer)
      const line = current.value
      if (!toValue(autoAdvance) || phase.value !== 'running' || !line) return
      const left = line.estimateMs - (spent.value[line.lineId] ?? 0) - (now() - lineStartedAt)
      timer = setTimeout(advance, Math.max(0, left))
    },
  )
  onScopeDispose(() => clearTimeout(timer))

  return { index, phase, current, next, elapsedMs, onLineMs, remainingMs, timedLines, stamps, start, advance, back, finish, reset }
}
