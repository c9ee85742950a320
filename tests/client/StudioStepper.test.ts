import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { render, screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { createMemoryHistory, createRouter } from 'vue-router'
import PrimeVue from 'primevue/config'
import StudioStepper from '@/components/StudioStepper.vue'
import { useStepNavigation } from '@/composables/useStepNavigation'
import { outlineFor } from '../helpers/studio-outline'
import './render'

const COUNT = outlineFor('PE01').steps.length
const URL_DELAY = 50

// The Studio's own wiring, reduced to the stepper: the composable owns the step, the component shows it.
const StepperHarness = defineComponent({
  setup() {
    const nav = useStepNavigation({ stepCount: () => COUNT, urlDelayMs: URL_DELAY })
    return () =>
      h('div', [
        h('label', { for: 'notes' }, 'Notes'),
        h('textarea', { id: 'notes' }),
        h('input', { id: 'title', 'aria-label': 'Title' }),
        h(StudioStepper, { step: nav.step.value, count: nav.count.value, typed: nav.typed.value, onGo: nav.go }),
      ])
  },
})

async function renderStepper(path = '/studio') {
  const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/studio', component: { render: () => null } }] })
  await router.push(path)
  await router.isReady()
  render(StepperHarness, { global: { plugins: [router, [PrimeVue, { theme: 'none' }]] } })
  // after the Studio's own listener, so it sees what that one did
  window.addEventListener('keydown', noteKeys)
  return { router }
}

const slider = () => screen.getByRole('slider', { name: 'Step' })
/** Where the replay is, as the slider tells a screen reader. */
const position = () => slider().getAttribute('aria-valuetext')
const at = (k: number) => (k === 0 ? 'Start, before any step' : `Step ${k} of ${COUNT}`)
const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

/** Whether the Studio took the last key pressed for itself (it prevents the default of keys it uses). */
let lastKeyTaken: boolean | null = null
function noteKeys(event: KeyboardEvent) {
  lastKeyTaken = event.defaultPrevented
}

describe('StudioStepper with useStepNavigation', () => {
  beforeEach(() => {
    vi.useFakeTimers()
    lastKeyTaken = null
  })
  afterEach(() => {
    window.removeEventListener('keydown', noteKeys)
    vi.useRealTimers()
  })

  it('should step with → and ←, and jump with Home and End', async () => {
    await renderStepper()
    expect(position()).toBe(at(0))
    expect(screen.getByText(`Start / ${COUNT}`)).toBeInTheDocument()

    await user().keyboard('{ArrowRight}{ArrowRight}')
    expect(position()).toBe(at(2))
    expect(slider()).toHaveAttribute('aria-valuenow', '2')
    expect(screen.getByText(`2 / ${COUNT}`)).toBeInTheDocument()

    await user().keyboard('{ArrowLeft}')
    expect(position()).toBe(at(1))

    await user().keyboard('{End}')
    expect(position()).toBe(at(COUNT))
    await user().keyboard('{ArrowRight}')
    expect(position()).toBe(at(COUNT))

    await user().keyboard('{Home}')
    expect(position()).toBe(at(0))
  })

  it('should jump to a typed step number on Enter, and forget it on Escape', async () => {
    await renderStepper()
    await user().keyboard('12')
    expect(screen.getByText(/Go to step 12/)).toBeInTheDocument()

    await user().keyboard('{Enter}')
    expect(lastKeyTaken).toBe(true)
    expect(position()).toBe(at(12))
    expect(screen.queryByText(/Go to step/)).not.toBeInTheDocument()

    await user().keyboard('4{Escape}{Enter}')
    expect(position()).toBe(at(12))

    await user().keyboard('999{Enter}')
    expect(position()).toBe(at(COUNT))
  })

  it('should forget typed digits after a few quiet seconds', async () => {
    await renderStepper()
    await user().keyboard('7')
    expect(screen.getByText(/Go to step 7/)).toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(4000)
    expect(screen.queryByText(/Go to step/)).not.toBeInTheDocument()
    await user().keyboard('{Enter}')
    expect(position()).toBe(at(0))
  })

  it('should leave keys alone while focus is in a text field', async () => {
    await renderStepper()
    await user().click(screen.getByRole('textbox', { name: 'Notes' }))
    await user().keyboard('{ArrowRight}')
    expect(lastKeyTaken).toBe(false)
    await user().keyboard('5{Enter}')
    await user().click(screen.getByRole('textbox', { name: 'Title' }))
    await user().keyboard('{End}')
    expect(position()).toBe(at(0))
  })

  it('should leave keys alone when a modifier is held or a widget already handled them', async () => {
    await renderStepper()
    await user().keyboard('{Control>}{ArrowRight}{/Control}')
    const handled = new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true, cancelable: true })
    handled.preventDefault()
    window.dispatchEvent(handled)
    expect(position()).toBe(at(0))
  })

  it('should step with the Previous and Next buttons', async () => {
    await renderStepper()
    const next = screen.getByRole('button', { name: 'Next' })
    const previous = screen.getByRole('button', { name: 'Previous' })
    expect(previous).toBeDisabled()
    await user().click(next)
    await user().click(next)
    await user().click(previous)
    expect(position()).toBe(at(1))
    expect(previous).toBeEnabled()
  })

  it('should keep the step in the URL with replace, not push', async () => {
    const { router } = await renderStepper()
    const push = vi.spyOn(router, 'push')
    const replace = vi.spyOn(router, 'replace')

    await user().keyboard('{ArrowRight}{ArrowRight}{ArrowRight}')
    await vi.advanceTimersByTimeAsync(URL_DELAY)
    expect(router.currentRoute.value.query.step).toBe('3')
    expect(push).not.toHaveBeenCalled()
    // Several quick steps settle into one address-bar update.
    expect(replace).toHaveBeenCalledTimes(1)
  })

  it('should open at the step in the URL and follow the URL when it changes', async () => {
    const { router } = await renderStepper('/studio?step=7')
    expect(position()).toBe(at(7))

    await router.replace('/studio?step=20')
    expect(position()).toBe(at(20))

    await router.replace('/studio?step=99999')
    expect(position()).toBe(at(COUNT))
  })

  it('should not snap back to an older URL value while the newer one is still on its way', async () => {
    const { router } = await renderStepper()
    await user().keyboard('{ArrowRight}')
    await vi.advanceTimersByTimeAsync(URL_DELAY)
    await user().keyboard('{ArrowRight}{ArrowRight}')
    expect(position()).toBe(at(3))
    await vi.advanceTimersByTimeAsync(URL_DELAY)
    expect(router.currentRoute.value.query.step).toBe('3')
    expect(position()).toBe(at(3))
  })
})
