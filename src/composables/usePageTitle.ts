import { toValue, watchEffect } from 'vue'
import type { MaybeRefOrGetter } from 'vue'

/** Keeps the browser tab title in step with the screen, so screen-reader users hear where they are. */
export function usePageTitle(title: MaybeRefOrGetter<string>): void {
  watchEffect(() => {
    const text = toValue(title)
    document.title = text ? `${text} · Gridcue` : 'Gridcue'
  })
}
