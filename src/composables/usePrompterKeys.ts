import { useEventListener } from '@vueuse/core'

export type PrompterCommand = 'advance' | 'back' | 'mirror' | 'bigger' | 'smaller' | 'contrast' | 'auto' | 'fullscreen' | 'finish'

/**
 * The prompter's keys, listed on screen from this same table. Space, Page Down/Up and the arrows are what
 * foot pedals and presentation clickers send (common practice); the letters are our own.
 */
export const PROMPTER_KEYS: readonly { command: PrompterCommand; keys: readonly string[]; shown: string; does: string }[] = [
  { command: 'advance', keys: [' ', 'PageDown', 'ArrowRight', 'ArrowDown'], shown: 'Space · Page Down · → · ↓', does: 'next line (the first press starts the run)' },
  { command: 'back', keys: ['PageUp', 'ArrowLeft', 'ArrowUp'], shown: 'Page Up · ← · ↑', does: 'line before' },
  { command: 'finish', keys: ['e', 'E'], shown: 'E', does: 'end the run' },
  { command: 'auto', keys: ['t', 'T'], shown: 'T', does: 'timed advance on or off' },
  { command: 'mirror', keys: ['m', 'M'], shown: 'M', does: 'mirror for glass' },
  { command: 'bigger', keys: ['+', '='], shown: '+', does: 'larger text' },
  { command: 'smaller', keys: ['-', '_'], shown: '−', does: 'smaller text' },
  { command: 'contrast', keys: ['k', 'K'], shown: 'K', does: 'next colour scheme' },
  { command: 'fullscreen', keys: ['f', 'F'], shown: 'F', does: 'full screen' },
]

const COMMAND_OF = new Map(PROMPTER_KEYS.flatMap(({ command, keys }) => keys.map((key) => [key, command] as const)))

// where typing happens (the run's name) and dialogs: those keep their keys
function typingInto(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false
  if (target.isContentEditable || target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true
  if (target instanceof HTMLInputElement && !['button', 'checkbox', 'radio', 'range'].includes(target.type)) return true
  return target.closest('[role="dialog"], [role="alertdialog"], form') !== null
}

/** Calls `run` with the command a key press means, while `active()` is true. */
export function usePrompterKeys(run: (command: PrompterCommand) => void, active: () => boolean = () => true): void {
  useEventListener(window, 'keydown', (event: KeyboardEvent) => {
    if (!active() || event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey || typingInto(event.target)) return
    const command = COMMAND_OF.get(event.key)
    if (!command) return
    event.preventDefault()
    // a held key repeats: one press, one line (a pedal held down must not run through the script)
    if (event.repeat && (command === 'advance' || command === 'back')) return
    run(command)
  })
  // a button keeps the focus after a click, and Space on it would click it again on release
  useEventListener(window, 'keyup', (event: KeyboardEvent) => {
    if (active() && event.key === ' ' && event.target instanceof HTMLButtonElement && !typingInto(event.target)) event.preventDefault()
  })
}
