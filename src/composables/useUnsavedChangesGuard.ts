import { toValue, type MaybeRefOrGetter } from 'vue'
import { onBeforeRouteLeave } from 'vue-router'
import { useEventListener } from '@vueuse/core'

export interface UnsavedChangesGuardOptions {
  /** True while leaving would lose (or not yet have sent) the user's edits. */
  dirty: MaybeRefOrGetter<boolean>
  /**
   * The question asked before an in-app navigation. Leave it out when the edits are kept anyway
   * (a local copy, a save sent on the way out): then only closing the tab asks, because the
   * browser may not finish that save.
   */
  confirmLeave?: string
}

/**
 * One guard for every editor screen: the browser's own prompt when the tab closes with edits
 * outstanding, and a confirmation before moving to another screen inside the app.
 */
export function useUnsavedChangesGuard({ dirty, confirmLeave }: UnsavedChangesGuardOptions): void {
  useEventListener(window, 'beforeunload', (event: BeforeUnloadEvent) => {
    if (toValue(dirty)) event.preventDefault()
  })
  if (confirmLeave === undefined) return
  onBeforeRouteLeave(() => !toValue(dirty) || window.confirm(confirmLeave))
}
