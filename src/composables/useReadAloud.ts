import { onScopeDispose, ref, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { fetchReadAloud } from '@/api/rehearsals'

/** A read-aloud preview of a stretch of lines: made on the server, played from a blob address that is let go again. */
export function useReadAloud(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const audioUrl = ref<string | null>(null)
  const busy = ref(false)
  const error = ref<string | null>(null)

  function release(): void {
    if (audioUrl.value) URL.revokeObjectURL(audioUrl.value)
    audioUrl.value = null
  }

  async function make(fromLineId: number, toLineId: number): Promise<void> {
    busy.value = true
    error.value = null
    try {
      const blob = await fetchReadAloud(toValue(channelId), toValue(outlineId), { fromLineId, toLineId })
      release()
      audioUrl.value = URL.createObjectURL(blob)
    } catch (e) {
      error.value = e instanceof Error ? e.message : 'The preview could not be made.'
    } finally {
      busy.value = false
    }
  }

  onScopeDispose(release)
  return { audioUrl, busy, error, make }
}
