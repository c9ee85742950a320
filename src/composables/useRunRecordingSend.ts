import { ref, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useQueryClient } from '@tanstack/vue-query'
import { scriptOf } from '@shared/schemas/outline'
import { alignLine } from '@shared/script'
import { getOutline, saveOutline } from '@/api/outlines'
import { outlineKeys, recordingKeys } from '@/api/queryKeys'
import { updateRecording, uploadRecording } from '@/api/recordings'
import { isStaleError } from '@/api/stale'
import type { LineStamp } from './usePrompter'

/** The file extension a recorded type is stored under (the server reads the content, not the name). */
function extensionOf(type: string): string {
  if (type.includes('ogg')) return 'ogg'
  if (type.includes('mp4')) return 'm4a'
  return 'webm'
}

/**
 * Sends a run's recording to the take as its current recording, through the recordings upload, and writes the
 * run's line advances as the take's aligned line starts (the same edits the align screen's key stamps make), so
 * the align screen opens with the recording already placed. Earlier aligned starts belonged to another
 * recording and are cleared.
 */
export function useRunRecordingSend(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  const sending = ref(false)
  const error = ref<string | null>(null)
  const sent = ref(false)

  async function send(audio: Blob, stamps: readonly LineStamp[], name: string): Promise<void> {
    const c = toValue(channelId)
    const o = toValue(outlineId)
    sending.value = true
    error.value = null
    sent.value = false
    try {
      const file = new File([audio], `${name.replace(/[^\w .-]+/g, '').trim() || 'rehearsal'}.${extensionOf(audio.type)}`, { type: audio.type })
      const recording = await uploadRecording(c, o, file)
      if (!recording.current) await updateRecording(c, o, recording.id, { current: true })
      void client.invalidateQueries({ queryKey: recordingKeys.byOutline(c, o), exact: true })

      const record = await getOutline(c, o)
      let doc = record.outline
      for (const line of doc.lines) if (line.alignedStartMs !== undefined) doc = alignLine(doc, line.id, null)
      // a line said twice (after going back) starts where it was first said
      const firstStart = new Map<number, number>()
      for (const s of stamps) if (!firstStart.has(s.lineId)) firstStart.set(s.lineId, s.atMs)
      for (const [lineId, atMs] of firstStart) doc = alignLine(doc, lineId, atMs)
      await saveOutline(c, o, { version: record.version, script: scriptOf(doc) })
      void client.invalidateQueries({ queryKey: outlineKeys.detail(c, o) })
      sent.value = true
    } catch (e) {
      error.value = isStaleError(e)
        ? 'The recording was added to the take, but the take was saved by someone else meanwhile, so its line starts were not written. Place them on the align screen.'
        : `The recording could not be sent. ${e instanceof Error ? e.message : ''}`.trim()
    } finally {
      sending.value = false
    }
  }

  return { sending, error, sent, send }
}
