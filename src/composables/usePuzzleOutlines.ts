import { computed, ref, toValue } from 'vue'
import type { MaybeRefOrGetter, Ref } from 'vue'
import type { OutlineRecord } from '@shared/schemas/studio'
import { isApiError } from '@/api/http'
import { useCreateOutline, useDuplicateOutline, useOutlineList, useRemoveOutline } from './useOutlineQueries'
import { useTakeRefresh } from './useTakeRefresh'

export interface PuzzleOutlinesOptions {
  channelId: MaybeRefOrGetter<number>
  puzzleId: MaybeRefOrGetter<number | 'new'>
  /** Owners and presenters find paths and duplicate or delete takes. */
  canChange: MaybeRefOrGetter<boolean>
  /** The live check of the grid: a path is found only for a puzzle with exactly one solution. */
  check: { pending: Readonly<Ref<boolean>>; isUnique: Readonly<Ref<boolean>> }
  /** The puzzle's id once what is on screen is saved (saving first if needed), or null if it couldn't be saved. */
  savedPuzzleId: () => Promise<number | null>
  /** A new take was written, e.g. to open it in the Studio. */
  onCreated: (outline: OutlineRecord) => unknown
}

/** A puzzle's outlines (its takes) and what can be done with them: find the path (again, for a stale take), duplicate, delete. */
export function usePuzzleOutlines({ channelId, puzzleId, canChange, check, savedPuzzleId, onCreated }: PuzzleOutlinesOptions) {
  const list = useOutlineList(channelId, puzzleId)
  const create = useCreateOutline(channelId)
  const duplicateMutation = useDuplicateOutline(channelId)
  const removeMutation = useRemoveOutline(channelId)
  /** The take being duplicated or deleted: the other takes' buttons wait for it. */
  const busyId = ref<number | null>(null)
  const problem = ref<string | null>(null)
  const finding = ref(false)
  const takeRefresh = useTakeRefresh({
    channelId,
    version: (outlineId) => list.data.value?.find((o) => o.id === outlineId)?.version ?? null,
  })

  const findBlockedReason = computed(() => {
    if (!toValue(canChange)) return 'Owners and presenters can find the path.'
    if (check.pending.value) return 'Checking the grid…'
    if (!check.isUnique.value) return 'Gridcue finds the path once the puzzle has exactly one solution.'
    return null
  })

  async function findPath(): Promise<void> {
    problem.value = null
    finding.value = true
    try {
      const id = await savedPuzzleId()
      if (id === null) return
      await onCreated(await create.mutateAsync({ puzzleId: id }))
    } catch (error) {
      problem.value = withReason("Gridcue couldn't find the path.", error)
    } finally {
      finding.value = false
    }
  }

  async function duplicate(outlineId: number): Promise<void> {
    await onTake(outlineId, "The outline couldn't be duplicated.", () => duplicateMutation.mutateAsync(outlineId))
  }

  async function remove(outlineId: number): Promise<void> {
    const id = toValue(puzzleId)
    if (typeof id !== 'number') return
    await onTake(outlineId, "The outline couldn't be deleted.", () => removeMutation.mutateAsync({ outlineId, puzzleId: id }))
  }

  async function onTake(outlineId: number, failure: string, action: () => Promise<unknown>): Promise<void> {
    problem.value = null
    busyId.value = outlineId
    try {
      await action()
    } catch (error) {
      problem.value = withReason(failure, error)
    } finally {
      busyId.value = null
    }
  }

  return {
    list,
    busyId,
    problem: computed(() => problem.value ?? takeRefresh.problem.value),
    finding,
    findBlockedReason,
    findPath,
    duplicate,
    remove,
    refresh: takeRefresh.refresh,
    refreshingId: takeRefresh.busyId,
    refreshOutcome: takeRefresh.outcome,
  }
}

function withReason(failure: string, error: unknown): string {
  return `${failure} ${isApiError(error) ? error.message : ''}`.trim()
}
