import { computed, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useQueryClient } from '@tanstack/vue-query'
import type { OutlineRecord } from '@shared/schemas/studio'
import { isApiError } from '@/api/http'
import { outlineKeys } from '@/api/queryKeys'
import { useOutline } from '@/composables/useOutlineQueries'

export interface StudioRecordOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
  /** Called once, with the first copy fetched for this visit (never an older one from the cache). */
  onOpen: (record: OutlineRecord) => void
}

/**
 * The outline record the Studio edits: loaded afresh for each visit and handed to the editor once, why it
 * could not be loaded (in words), and the query cache kept in step with each save.
 */
export function useStudioRecord({ channelId, outlineId, onOpen }: StudioRecordOptions) {
  const query = useOutline(channelId, outlineId)
  const queryClient = useQueryClient()

  let opened = false
  watch(
    () => [query.data.value, query.isFetchedAfterMount.value] as const,
    ([record, fresh]) => {
      if (!record || !fresh || opened) return
      opened = true
      onOpen(record)
    },
    { immediate: true },
  )

  const loadError = computed(() => {
    const error = query.error.value
    if (!error) return null
    if (isApiError(error) && (error.status === 404 || error.status === 403)) return "This outline doesn't exist, or you can't open it."
    return `The outline couldn't be loaded. ${error.message}`
  })

  /** Keeps the cached copy equal to what the server now holds (the answer to a save). */
  function remember(record: OutlineRecord): void {
    queryClient.setQueryData(outlineKeys.detail(toValue(channelId), toValue(outlineId)), record)
  }

  return { record: query.data, loadError, remember }
}
