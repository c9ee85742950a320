import { onScopeDispose, ref } from 'vue'

/**
 * The microphone during a run: the browser's MediaRecorder, started before the run's clock so the line stamps
 * count from the recording's start. One recording at a time; the microphone is let go when it stops.
 */
export function useRunRecorder() {
  const supported = typeof navigator !== 'undefined' && !!navigator.mediaDevices?.getUserMedia && typeof MediaRecorder !== 'undefined'
  const recording = ref(false)
  const error = ref<string | null>(null)
  let recorder: MediaRecorder | null = null
  let chunks: Blob[] = []

  function release(): void {
    recorder?.stream.getTracks().forEach((t) => t.stop())
    recorder = null
    recording.value = false
  }

  /** Asks for the microphone and starts recording; false (with a sentence in `error`) when it can't. */
  async function start(): Promise<boolean> {
    error.value = null
    if (!supported) {
      error.value = "This browser can't record from a microphone."
      return false
    }
    try {
      const stream = await navigator.mediaDevices.getUserMedia({ audio: true })
      chunks = []
      recorder = new MediaRecorder(stream)
      recorder.addEventListener('dataavailable', (event) => {
        if (event.data.size > 0) chunks.push(event.data)
      })
      recorder.start()
      recording.value = true
      return true
    } catch {
      error.value = 'The microphone could not be used. Allow it for this site, or rehearse without recording.'
      release()
      return false
    }
  }

  /** Stops recording and answers what was recorded (null when nothing was). */
  function stop(): Promise<Blob | null> {
    const active = recorder
    if (!active || active.state === 'inactive') {
      release()
      return Promise.resolve(null)
    }
    return new Promise((resolve) => {
      active.addEventListener(
        'stop',
        () => {
          const type = active.mimeType || chunks[0]?.type || 'audio/webm'
          resolve(chunks.length > 0 ? new Blob(chunks, { type }) : null)
          release()
        },
        { once: true },
      )
      active.stop()
    })
  }

  onScopeDispose(() => {
    if (recorder && recorder.state !== 'inactive') recorder.stop()
    release()
  })

  return { supported, recording, error, start, stop }
}
