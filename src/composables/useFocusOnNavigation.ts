import { nextTick, onScopeDispose } from 'vue'
import type { Ref } from 'vue'
import { START_LOCATION, useRouter } from 'vue-router'

/**
 * After an in-app navigation, moves focus to the new screen's content so keyboard and screen-reader users
 * don't stay on a link that has gone. The first load keeps the browser's own focus.
 */
export function useFocusOnNavigation(target: Readonly<Ref<HTMLElement | null>>): void {
  const router = useRouter()
  const stop = router.afterEach((to, from, failure) => {
    if (failure || from === START_LOCATION || to.path === from.path) return
    void nextTick(() => {
      const heading = target.value?.querySelector<HTMLElement>('h1')
      const el = heading ?? target.value
      if (!el) return
      if (!el.hasAttribute('tabindex')) el.setAttribute('tabindex', '-1')
      el.focus()
    })
  })
  onScopeDispose(stop)
}
