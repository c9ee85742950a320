import { onScopeDispose } from 'vue'

/** Keys that scroll the page when nothing focused takes them. */
const SCROLL_KEYS = new Set(['ArrowUp', 'ArrowDown', 'PageUp', 'PageDown', 'Home', 'End', ' '])

/**
 * Brings the playing item of a list into view as playback moves on, without fighting the viewer: not while
 * they have scrolled in the last `quietMs`, never with a smooth scroll when they asked for reduced motion, and
 * only in the wide layout, where the grid stays put beside the list (on a phone the list sits below the grid,
 * and scrolling the page would carry the grid away). `wideQuery` is the layout's breakpoint in episode.css.
 */
export function useFollowScroll({ quietMs = 4000, wideQuery = '(min-width: 60rem)' } = {}) {
  let scrolledAt = Number.NEGATIVE_INFINITY
  const onScroll = () => {
    scrolledAt = performance.now()
  }
  const onKey = (event: KeyboardEvent) => {
    if (SCROLL_KEYS.has(event.key)) onScroll()
  }
  const passive = { passive: true } as const
  window.addEventListener('wheel', onScroll, passive)
  window.addEventListener('touchmove', onScroll, passive)
  window.addEventListener('keydown', onKey, passive)
  onScopeDispose(() => {
    window.removeEventListener('wheel', onScroll)
    window.removeEventListener('touchmove', onScroll)
    window.removeEventListener('keydown', onKey)
  })

  const matches = (query: string) => typeof window.matchMedia === 'function' && window.matchMedia(query).matches
  const behavior = (): ScrollBehavior => (matches('(prefers-reduced-motion: reduce)') ? 'auto' : 'smooth')

  /** Follows playback to `el`, unless the viewer is scrolling or the layout would lose the grid. */
  function follow(el: Element): void {
    if (performance.now() - scrolledAt < quietMs || !matches(wideQuery)) return
    el.scrollIntoView({ block: 'nearest', behavior: behavior() })
  }

  /** Takes the viewer to `el` because they asked (a `#step-n` link): in any layout, at once or smoothly. */
  function jump(el: Element): void {
    el.scrollIntoView({ block: 'center', behavior: behavior() })
  }

  return { follow, jump }
}
