import { computed, onScopeDispose, ref, shallowRef, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useQueryClient } from '@tanstack/vue-query'
import type { Recording } from '@shared/schemas/recording'
import { isApiError } from '@/api/http'
import { isAbortError, uploadRecording } from '@/api/recordings'
import type { UploadProgress } from '@/api/recordings'
import { recordingKeys } from '@/api/queryKeys'
import { useUnsavedChangesGuard } from './useUnsavedChangesGuard'

export interface RecordingUploadOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
}

/**
 * One upload at a time: its progress, a cancel, and what went wrong in the server's own words (the limit in a
 * 413, the kind of file in a 415). The take's list is refreshed once the server has the file.
 */
export function useRecordingUpload({ channelId, outlineId }: RecordingUploadOptions) {
  const client = useQueryClient()
  const fileName = ref<string | null>(null)
  const progress = shallowRef<UploadProgress | null>(null)
  const error = ref<string | null>(null)
  /** A short sentence after an upload ends well or is cancelled. */
  const notice = ref<string | null>(null)
  let controller: AbortController | null = null

  const uploading = computed(() => fileName.value !== null)

  async function upload(file: File): Promise<void> {
    if (controller) return
    controller = new AbortController()
    fileName.value = file.name
    progress.value = { loaded: 0, total: file.size }
    error.value = null
    notice.value = null
    let recording: Recording
    try {
      recording = await uploadRecording(toValue(channelId), toValue(outlineId), file, {
        signal: controller.signal,
        onProgress: (p) => (progress.value = p),
      })
    } catch (e) {
      if (isAbortError(e)) notice.value = `The upload of ${file.name} was cancelled; nothing was kept.`
      else error.value = `${file.name} wasn't uploaded. ${isApiError(e) ? e.message : 'Something went wrong; try again.'}`
      return
    } finally {
      controller = null
      fileName.value = null
      progress.value = null
    }
    notice.value = `${recording.name} is uploaded.`
    await client.invalidateQueries({ queryKey: recordingKeys.byOutline(toValue(channelId), toValue(outlineId)), exact: true })
  }

  function cancel(): void {
    controller?.abort()
  }

  useUnsavedChangesGuard({ dirty: uploading, confirmLeave: 'A recording is still uploading. Leave and stop the upload?' })
  onScopeDispose(cancel)

  return { fileName, progress, uploading, error, notice, upload, cancel }
}
