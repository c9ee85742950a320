import { ref, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useQueryClient } from '@tanstack/vue-query'
import type { OutlineRecord, OutlineRefreshed } from '@shared/schemas/studio'
import { isApiError } from '@/api/http'
import { refreshOutline } from '@/api/outlines'
import { outlineKeys, puzzleKeys } from '@/api/queryKeys'
import { isStaleError } from '@/api/stale'

interface TakeRefreshOptions {
  channelId: MaybeRefOrGetter<number>
  /** The version of the take as last read or saved here; a refresh over a newer one is refused. */
  version: (outlineId: number) => number | null
  /** Sends edits still on their way first, so the refresh carries them (throws when they can't be saved). */
  saveFirst?: () => Promise<void>
  /** The take with its fresh path, to put on screen. */
  onRefreshed?: (take: OutlineRecord) => void
}

/** What "find the path again" kept and lost, shown until the next refresh. */
export type RefreshOutcome = Pick<OutlineRefreshed, 'kept' | 'lost'> & { outlineId: number }

/** "Find the path again" for a take whose puzzle changed: the server solves again and carries the edited lines over. */
export function useTakeRefresh({ channelId, version, saveFirst, onRefreshed }: TakeRefreshOptions) {
  const client = useQueryClient()
  const busyId = ref<number | null>(null)
  const problem = ref<string | null>(null)
  const outcome = ref<RefreshOutcome | null>(null)

  async function refresh(outlineId: number): Promise<void> {
    const at = version(outlineId)
    if (at === null) return
    busyId.value = outlineId
    problem.value = null
    try {
      await saveFirst?.()
      const answer = await refreshOutline(toValue(channelId), outlineId, version(outlineId) ?? at)
      const channel = toValue(channelId)
      client.setQueryData(outlineKeys.detail(channel, outlineId), answer.take)
      void client.invalidateQueries({ queryKey: outlineKeys.byPuzzle(channel, answer.take.puzzleId) })
      void client.invalidateQueries({ queryKey: puzzleKeys.all(channel), exact: true })
      outcome.value = { outlineId, kept: answer.kept, lost: answer.lost }
      onRefreshed?.(answer.take)
    } catch (error) {
      problem.value = reasonOf(error)
    } finally {
      busyId.value = null
    }
  }

  return { busyId, problem, outcome, refresh }
}

function reasonOf(error: unknown): string {
  if (isStaleError(error)) return 'Someone saved this take a moment ago. Open it again to see their edits, then find the path again.'
  const why = isApiError(error) || error instanceof Error ? error.message : ''
  return `Gridcue couldn't find the path again. ${why}`.trim()
}
