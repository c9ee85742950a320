import { computed, ref, shallowRef, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useEventListener } from '@vueuse/core'
import type { Timeline } from '@shared/script'

/** How far "back a little" goes. */
const BACK_MS = 3000

/**
 * The recording's position, and the line being said there: the last visible line whose start is at or before
 * it. Every time is read from the timeline, so aligned starts win over estimates as soon as they exist.
 */
export function useAlignPlayback(timing: MaybeRefOrGetter<Timeline | null>) {
  const media = shallowRef<HTMLMediaElement | null>(null)
  const currentMs = ref(0)
  const playing = ref(false)

  const follow = () => {
    if (media.value) currentMs.value = Math.round(media.value.currentTime * 1000)
  }
  useEventListener(media, ['timeupdate', 'seeked'], follow)
  useEventListener(media, ['play', 'pause', 'ended'], () => (playing.value = media.value ? !media.value.paused : false))

  const playingLineId = computed<number | null>(() => {
    const lines = toValue(timing)?.lines.filter((l) => !l.hidden) ?? []
    let found: number | null = lines[0]?.id ?? null
    for (const line of lines) {
      if (line.startMs <= currentMs.value) found = line.id
      else break
    }
    return found
  })

  /** The position right now, to the millisecond the element knows (a stamp must not wait for the next timeupdate). */
  function now(): number {
    return media.value ? Math.round(media.value.currentTime * 1000) : currentMs.value
  }

  function seek(ms: number): void {
    const at = Math.max(0, Math.round(ms))
    currentMs.value = at
    if (media.value) media.value.currentTime = at / 1000
  }

  function togglePlay(): void {
    const element = media.value
    if (!element) return
    // a refused play (the browser wants a click first) leaves the element paused, which the buttons show
    if (element.paused) void element.play()?.catch(() => {})
    else element.pause()
  }

  function back(): void {
    seek(now() - BACK_MS)
  }

  return { media, currentMs, playing, playingLineId, now, seek, togglePlay, back }
}
