import { useQuery } from '@tanstack/vue-query'
import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { MediaLink, Recording } from '@shared/schemas/recording'
import { isApiError } from '@/api/http'
import { getMediaLink } from '@/api/recordings'
import { recordingKeys } from '@/api/queryKeys'

export interface RecordingMediaOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
  recording: MaybeRefOrGetter<Recording | null>
}

// a new link well before the old one runs out, so a seek never meets an expired one
const RENEW_BEFORE_EXPIRY_MS = 30 * 60_000
const SOONEST_RENEWAL_MS = 60_000

/** How long a link may be used before a new one is asked for. */
function renewalDelay(link: MediaLink | undefined): number {
  if (!link) return 0
  return Math.max(SOONEST_RENEWAL_MS, Date.parse(link.expiresAt) - Date.now() - RENEW_BEFORE_EXPIRY_MS)
}

/**
 * The recording as an address a <video> or <audio> can play. The media route wants the session's token, which a
 * media element can't send, so the server hands out a signed link good for a few hours; the element asks it for
 * the ranges it plays, so an hour-long recording starts at once. A new link comes before the old one runs out
 * (also when the tab comes back after a long while).
 */
export function useRecordingMedia({ channelId, outlineId, recording }: RecordingMediaOptions) {
  const query = useQuery({
    queryKey: () => recordingKeys.mediaLink(toValue(channelId), toValue(outlineId), toValue(recording)?.id ?? 0),
    queryFn: ({ signal }) => getMediaLink(toValue(channelId), toValue(outlineId), toValue(recording)!.id, signal),
    // a recording still being converted has nothing a browser plays yet
    enabled: () => toValue(recording)?.playback === 'ready',
    staleTime: (q) => renewalDelay(q.state.data),
    refetchInterval: (q) => renewalDelay(q.state.data) || false,
  })
  const url = computed(() => query.data.value?.url ?? null)
  const loading = computed(() => query.isLoading.value)
  const error = computed(() => {
    const e = query.error.value
    return e ? `The recording couldn't be loaded. ${isApiError(e) ? e.message : ''}`.trim() : null
  })
  return { url, loading, error }
}
