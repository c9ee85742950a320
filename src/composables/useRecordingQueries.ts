import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { Recording } from '@shared/schemas/recording'
import { getPeaks, listRecordings, removeRecording, updateRecording } from '@/api/recordings'
import { recordingKeys } from '@/api/queryKeys'

/** While a recording is being converted or its waveform worked out on the server, the list is asked again this often. */
const PEAKS_POLL_MS = 3000

/** The take's recordings (newest first) and the current one. */
export function useRecordingList(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const query = useQuery({
    queryKey: () => recordingKeys.byOutline(toValue(channelId), toValue(outlineId)),
    queryFn: ({ signal }) => listRecordings(toValue(channelId), toValue(outlineId), signal),
    // a failed conversion gets no waveform: nothing more to wait for
    refetchInterval: (q) => (q.state.data?.some((r) => !r.hasPeaks && r.playback !== 'failed') ? PEAKS_POLL_MS : false),
  })
  const current = computed<Recording | null>(() => query.data.value?.find((r) => r.current) ?? null)
  return { ...query, current }
}

/** Makes a recording the one the take is aligned to. */
export function useMakeCurrentRecording(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: (recordingId: number) => updateRecording(toValue(channelId), toValue(outlineId), recordingId, { current: true }),
    onSuccess: () => client.invalidateQueries({ queryKey: recordingKeys.byOutline(toValue(channelId), toValue(outlineId)), exact: true }),
  })
}

export function useRemoveRecording(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: (recordingId: number) => removeRecording(toValue(channelId), toValue(outlineId), recordingId),
    onSuccess: () => client.invalidateQueries({ queryKey: recordingKeys.byOutline(toValue(channelId), toValue(outlineId)), exact: true }),
  })
}

/** The waveform of a recording, once the server has it. */
export function useRecordingPeaks(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>, recording: MaybeRefOrGetter<Recording | null>) {
  return useQuery({
    queryKey: () => recordingKeys.peaks(toValue(channelId), toValue(outlineId), toValue(recording)?.id ?? 0),
    queryFn: ({ signal }) => getPeaks(toValue(channelId), toValue(outlineId), toValue(recording)!.id, signal),
    enabled: () => toValue(recording)?.hasPeaks === true,
    // peaks never change once made
    staleTime: Infinity,
  })
}
