import { useTitle } from '@vueuse/core'
import { toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'

/** Keeps the browser tab title in step with the screen, so screen-reader users hear where they are. */
export function usePageTitle(title: MaybeRefOrGetter<string>): void {
  // The next screen sets its own title, so there is nothing to restore when this one goes.
  useTitle(() => toValue(title), { titleTemplate: (text) => (text ? `${text} · Gridcue` : 'Gridcue'), restoreOnUnmount: false })
}
