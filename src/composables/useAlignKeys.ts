import { useEventListener } from '@vueuse/core'

export type AlignAction = 'stamp' | 'play' | 'back' | 'earlier' | 'later' | 'previous' | 'next' | 'replay-line' | 'cut-in' | 'cut-out'

/** The Align screen's keys, in the order the help list shows them. Ctrl+Z and Ctrl+Shift+Z come from the outline editor. */
export const ALIGN_KEYS: readonly { action: AlignAction; keys: readonly string[]; shown: string; does: string }[] = [
  { action: 'stamp', keys: ['s'], shown: 'S', does: 'the chosen line starts now; then the next line is chosen' },
  { action: 'play', keys: ['p'], shown: 'P', does: 'play or pause' },
  { action: 'back', keys: ['b'], shown: 'B', does: 'back 3 seconds' },
  { action: 'earlier', keys: ['-'], shown: '−', does: 'chosen line 0.1 s earlier' },
  { action: 'later', keys: ['+', '='], shown: '+', does: 'chosen line 0.1 s later' },
  { action: 'previous', keys: ['ArrowUp'], shown: '↑', does: 'choose the line above' },
  { action: 'next', keys: ['ArrowDown'], shown: '↓', does: 'choose the line below' },
  { action: 'replay-line', keys: ['r'], shown: 'R', does: 'play from the chosen line’s start' },
  { action: 'cut-in', keys: ['v'], shown: 'V', does: 'the video starts here (cut the recording before this point)' },
  { action: 'cut-out', keys: ['e'], shown: 'E', does: 'the video ends here (cut the recording after this point)' },
]

const ACTION_OF = new Map(ALIGN_KEYS.flatMap((entry) => entry.keys.map((key) => [key, entry.action] as const)))

/**
 * The Align screen's single-key shortcuts, anywhere on the page except while typing (a field, a dialog) and
 * never with Ctrl, Alt or ⌘ held (those belong to the browser and to undo).
 */
export function useAlignKeys(run: (action: AlignAction) => void, enabled: () => boolean): void {
  useEventListener(window, 'keydown', (event: KeyboardEvent) => {
    if (event.defaultPrevented || event.ctrlKey || event.metaKey || event.altKey || !enabled()) return
    const target = event.target instanceof HTMLElement ? event.target : null
    if (target && (target.closest('input, textarea, select, [contenteditable="true"], [role="dialog"]') || target.isContentEditable)) return
    const action = ACTION_OF.get(event.key.length === 1 ? event.key.toLowerCase() : event.key)
    if (!action) return
    event.preventDefault()
    run(action)
  })
}
