import { ref, toValue } from 'vue'
import type { MaybeRefOrGetter, Ref } from 'vue'
import { isApiError } from '@/api/http'
import { useRemovePuzzle } from './usePuzzleQueries'

export interface PuzzleDeleteOptions {
  channelId: MaybeRefOrGetter<number>
  puzzleId: MaybeRefOrGetter<number | 'new'>
  /** Where a failed delete is told: the screen's one problem line, shared with saving. */
  problem: Ref<string | null>
  /** After the puzzle is gone, e.g. back to the Library. */
  onDeleted: () => unknown
}

/** Deleting a puzzle with its outlines, only after a second confirmation in place. */
export function usePuzzleDelete({ channelId, puzzleId, problem, onDeleted }: PuzzleDeleteOptions) {
  const mutation = useRemovePuzzle(channelId)
  const confirming = ref(false)
  /** Set once the puzzle is gone: its unsaved edits no longer matter. */
  const deleted = ref(false)

  async function deleteForGood(): Promise<void> {
    const id = toValue(puzzleId)
    if (typeof id !== 'number') return
    problem.value = null
    try {
      await mutation.mutateAsync(id)
      deleted.value = true
      await onDeleted()
    } catch (error) {
      confirming.value = false
      problem.value = `The puzzle couldn't be deleted. ${isApiError(error) ? error.message : ''}`.trim()
    }
  }

  return { confirming, deleting: mutation.isPending, deleted, deleteForGood }
}
