import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import { computed, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { RehearsalCreate } from '@shared/schemas/rehearsal'
import { listRehearsals, removeRehearsal, saveRehearsal } from '@/api/rehearsals'

/** Under the take, like its recordings, so leaving the channel drops them with the rest of its cache. */
const rehearsalKey = (channelId: number, outlineId: number) => ['channels', channelId, 'outlines', outlineId, 'rehearsals'] as const

/** The take's runs (newest first) and its presenter's calibrated timing (null until they have enough lines). */
export function useRehearsals(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>, enabled: MaybeRefOrGetter<boolean> = true) {
  const query = useQuery({
    queryKey: () => rehearsalKey(toValue(channelId), toValue(outlineId)),
    queryFn: ({ signal }) => listRehearsals(toValue(channelId), toValue(outlineId), signal),
    enabled: () => toValue(enabled),
  })
  return {
    ...query,
    runs: computed(() => query.data.value?.runs ?? []),
    calibration: computed(() => query.data.value?.calibration ?? null),
  }
}

/** Saving and discarding runs; either refreshes the list (and with it the calibration). */
export function useRehearsalChanges(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  const refresh = () => client.invalidateQueries({ queryKey: rehearsalKey(toValue(channelId), toValue(outlineId)) })
  const save = useMutation({
    mutationFn: (body: RehearsalCreate) => saveRehearsal(toValue(channelId), toValue(outlineId), body),
    onSuccess: refresh,
  })
  const discard = useMutation({
    mutationFn: (rehearsalId: number) => removeRehearsal(toValue(channelId), toValue(outlineId), rehearsalId),
    onSuccess: refresh,
  })
  return { save, discard }
}
