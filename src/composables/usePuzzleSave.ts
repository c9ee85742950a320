import { ref, shallowRef, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useTimeoutFn } from '@vueuse/core'
import type { PuzzleDraft, PuzzleRecord } from '@shared/schemas/studio'
import { DATABASE_UNAVAILABLE, isApiError, retryDelayMs } from '@/api/http'
import { isStaleError } from '@/api/stale'
import type { PuzzleForm } from './usePuzzleForm'
import { useSavePuzzle } from './usePuzzleQueries'

export interface PuzzleSaveOptions {
  channelId: MaybeRefOrGetter<number>
  puzzleId: MaybeRefOrGetter<number | 'new'>
  form: PuzzleForm
  /** After a new puzzle's first save, e.g. to move to its own address. */
  onCreated: (record: PuzzleRecord) => unknown
}

interface SaveOptions {
  /** save over this version (the newer one in a conflict) instead of the one the form was read at */
  overVersion?: number
}

/** Two versions of one puzzle: what this person tried to save, and what someone else saved first. */
export interface PuzzleConflict {
  mine: PuzzleDraft
  theirs: PuzzleRecord
}

/**
 * Saving the Puzzle screen's form, and the way out when someone else saved first: keep mine (save over their
 * version), take theirs (my edits set aside), or bring mine back. While the database is away the form keeps
 * the edits and the save is tried again by itself, as the server's message promises.
 */
export function usePuzzleSave({ channelId, puzzleId, form, onCreated }: PuzzleSaveOptions) {
  const mutation = useSavePuzzle(channelId)
  /** The line under the header: what went wrong, or how the last save went. */
  const problem = ref<string | null>(null)
  const notice = ref<string | null>(null)
  const conflict = shallowRef<PuzzleConflict | null>(null)
  const conflictOpen = ref(false)
  /** The user's own edits, kept after they chose the saved version, until they save again. */
  const setAside = shallowRef<PuzzleDraft | null>(null)
  /** The save to try again once the database is back: its options, failures so far, and when. */
  let pending = { options: {} as SaveOptions, failures: 0, inMs: 0 }
  const retry = useTimeoutFn(() => void save(pending.options), () => pending.inMs, { immediate: false })

  async function save(options: SaveOptions = {}): Promise<PuzzleRecord | null> {
    retry.stop()
    problem.value = null
    notice.value = null
    const verdict = form.check.flush()
    if (verdict.status === 'invalid') {
      problem.value = `Fix the grid before saving: ${verdict.problems[0]?.message ?? 'it is malformed.'}`
      return null
    }
    const valid = form.validate()
    if ('problem' in valid) {
      problem.value = valid.problem
      return null
    }

    const sent = valid.draft
    const sentSnapshot = form.snapshot.value
    const id = toValue(puzzleId)
    try {
      const saved = await mutation.mutateAsync({ draft: sent, puzzleId: id, version: options.overVersion ?? form.baseVersion.value })
      form.markSaved(saved, sentSnapshot)
      pending.failures = 0
      setAside.value = null
      notice.value = saved.check === 'unique' ? 'Saved.' : 'Saved as a draft: the puzzle needs exactly one solution before Gridcue can find its path.'
      if (id === 'new') await onCreated(saved)
      return saved
    } catch (error) {
      if (isStaleError<PuzzleRecord>(error)) {
        conflict.value = { mine: sent, theirs: error.current }
        conflictOpen.value = true
        return null
      }
      problem.value = isApiError(error) ? error.message : 'The puzzle could not be saved.'
      if (isApiError(error) && error.code === DATABASE_UNAVAILABLE) {
        pending = { options, failures: pending.failures + 1, inMs: retryDelayMs(pending.failures) }
        retry.start()
      }
      return null
    }
  }

  /** Closes the conflict and hands it over, once. */
  function settleConflict(): PuzzleConflict | null {
    const settled = conflict.value
    conflictOpen.value = false
    conflict.value = null
    return settled
  }

  async function keepMine(): Promise<void> {
    const settled = settleConflict()
    if (settled) await save({ overVersion: settled.theirs.version })
  }

  function takeTheirs(): void {
    const settled = settleConflict()
    if (!settled) return
    setAside.value = form.draft()
    form.load(settled.theirs, settled.theirs.version, settled.theirs.id)
  }

  function bringBackMine(): void {
    const mine = setAside.value
    if (!mine) return
    setAside.value = null
    form.restore(mine)
  }

  return { saving: mutation.isPending, problem, notice, conflict, conflictOpen, setAside, save, keepMine, takeTheirs, bringBackMine }
}
