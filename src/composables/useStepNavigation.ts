import { computed, onScopeDispose, ref, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useRoute, useRouter } from 'vue-router'
import { refAutoReset, useDebounceFn, useEventListener } from '@vueuse/core'

export interface StepNavigationOptions {
  /** Number of engine steps; the replay runs from 0 (the givens) to stepCount (after the last step). */
  stepCount: MaybeRefOrGetter<number>
  /** Keyboard shortcuts are live only while this is true (e.g. off while a dialog is open). */
  keyboard?: MaybeRefOrGetter<boolean>
  /**
   * Delay before the URL follows the step. Holding → changes the step many times a second, and
   * browsers rate-limit history.replaceState, so the address bar catches up once the step settles.
   */
  urlDelayMs?: number
}

/** A typed step number is forgotten after this long without another key. */
const TYPED_TIMEOUT_MS = 4000
const MAX_TYPED_DIGITS = 4

/**
 * The replay position: previous/next/first/last, keyboard (← → Home End, digits then Enter),
 * and `?step=` in the URL (replaced, never pushed, so Back leaves the Studio instead of undoing steps).
 */
export function useStepNavigation(options: StepNavigationOptions) {
  const route = useRoute()
  const router = useRouter()
  const urlDelayMs = options.urlDelayMs ?? 250

  const count = computed(() => Math.max(0, Math.floor(toValue(options.stepCount))))
  // The URL may ask for a step before the outline has loaded, so keep the request and clamp on read.
  const requested = ref(readStepQuery(route.query.step) ?? 0)
  const step = computed(() => clamp(requested.value, 0, count.value))
  const atStart = computed(() => step.value === 0)
  const atEnd = computed(() => step.value >= count.value)
  /** Digits typed so far for a jump ("12" then Enter goes to step 12); empty when none, and again after a pause. */
  const typed = refAutoReset('', TYPED_TIMEOUT_MS)

  function go(k: number): void {
    if (!Number.isFinite(k)) return
    requested.value = clamp(Math.round(k), 0, count.value)
  }
  const next = () => go(step.value + 1)
  const previous = () => go(step.value - 1)
  const first = () => go(0)
  const last = () => go(count.value)

  // URL sync: write after a pause; follow the URL when something else changes it (a link, a pasted address).
  let lastWritten: string | null = null
  const writeUrl = useDebounceFn((k: number) => {
    const value = String(k)
    if (route.query.step === value) return
    lastWritten = value
    void router.replace({ query: { ...route.query, step: value }, hash: route.hash })
  }, urlDelayMs)
  watch(step, (k) => void writeUrl(k))
  watch(
    () => route.query.step,
    (raw) => {
      if (typeof raw === 'string' && raw === lastWritten) return
      const k = readStepQuery(raw)
      if (k !== null && k !== step.value) {
        writeUrl.cancel()
        requested.value = k
      }
    },
  )
  // Leaving the Studio: a write still waiting would put ?step= on the next screen's address.
  onScopeDispose(() => writeUrl.cancel())

  function onKeydown(event: KeyboardEvent): void {
    if (!(toValue(options.keyboard) ?? true)) return
    if (event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey) return
    if (ownsKeys(event.target)) return
    const key = event.key
    if (key === 'ArrowRight') next()
    else if (key === 'ArrowLeft') previous()
    else if (key === 'Home') first()
    else if (key === 'End') last()
    else if (/^[0-9]$/.test(key) && !event.repeat) {
      typed.value = (typed.value + key).slice(-MAX_TYPED_DIGITS)
    } else if (key === 'Backspace' && typed.value) {
      typed.value = typed.value.slice(0, -1)
    } else if (key === 'Escape' && typed.value) {
      typed.value = ''
    } else if (key === 'Enter' && typed.value) {
      go(Number(typed.value))
      typed.value = ''
    } else {
      return
    }
    event.preventDefault()
  }

  useEventListener(window, 'keydown', onKeydown)

  return { step, count, atStart, atEnd, typed, go, next, previous, first, last }
}

/** Step number from `?step=`; null when absent or not a whole number. */
function readStepQuery(raw: unknown): number | null {
  const value = Array.isArray(raw) ? raw[0] : raw
  if (typeof value !== 'string' || !/^\d{1,5}$/.test(value)) return null
  return Number(value)
}

function clamp(n: number, lo: number, hi: number): number {
  return Math.min(Math.max(n, lo), hi)
}

// Widgets that use these keys themselves: typing, sliders, tabs, lists, menus, and anything inside a dialog.
const KEY_OWNING_ROLES = new Set(['textbox', 'searchbox', 'combobox', 'spinbutton', 'slider', 'tab', 'listbox', 'option', 'menu', 'menuitem', 'radio', 'grid'])
const NON_TEXT_INPUTS = new Set(['button', 'checkbox', 'radio', 'submit', 'reset', 'range', 'color', 'file', 'image'])

function ownsKeys(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false
  if (target.isContentEditable) return true
  if (target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true
  if (target instanceof HTMLInputElement && !NON_TEXT_INPUTS.has(target.type)) return true
  const role = target.getAttribute('role')
  if (role && KEY_OWNING_ROLES.has(role)) return true
  return target.closest('[role="dialog"], [role="alertdialog"]') !== null
}
