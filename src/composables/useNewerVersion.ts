import { toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useDocumentVisibility, useIntervalFn } from '@vueuse/core'
import type { OutlineRecord } from '@shared/schemas/studio'
import { getOutlineIfChanged } from '@/api/outlines'

interface NewerVersionOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
  /** The version this screen holds; a copy newer than it is handed on. */
  version: () => number | null
  /** Called with each newer copy someone else saved. */
  onNewer: (record: OutlineRecord) => void
  /** How often to ask (5 s): "within seconds" of another person's save. */
  intervalMs?: number
}

/**
 * Asks every few seconds whether the take changed, with the ETag of the last answer: an unchanged take
 * costs the server one small query and a 304 (server/routes/outlines.ts). Paused while the tab is hidden.
 */
export function useNewerVersion({ channelId, outlineId, version, onNewer, intervalMs = 5000 }: NewerVersionOptions) {
  const visibility = useDocumentVisibility()
  let etag: string | null = null
  let asking = false

  async function ask(): Promise<void> {
    if (asking || visibility.value === 'hidden' || version() === null) return
    asking = true
    try {
      const changed = await getOutlineIfChanged(toValue(channelId), toValue(outlineId), etag)
      if (!changed) return
      etag = changed.etag
      const held = version()
      if (held !== null && changed.data.version > held) onNewer(changed.data)
    } catch {
      // a failed look is tried again on the next tick; saving reports problems of its own
    } finally {
      asking = false
    }
  }

  useIntervalFn(() => void ask(), intervalMs)
  return { ask }
}
