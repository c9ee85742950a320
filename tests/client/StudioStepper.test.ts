import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createMemoryHistory, createRouter } from 'vue-router'
import type { Router } from 'vue-router'
import PrimeVue from 'primevue/config'
import StudioStepper from '@/components/StudioStepper.vue'
import { useStepNavigation } from '@/composables/useStepNavigation'
import { outlineFor } from '../helpers/studio-outline'

const outline = outlineFor('PE01')
const COUNT = outline.steps.length
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

async function setup(path = '/studio') {
  const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/studio', component: { render: () => null } }] })
  await router.push(path)
  await router.isReady()
  const wrapper = mount(StepperHarness, { attachTo: document.body, global: { plugins: [router, [PrimeVue, { theme: 'none' }]] } })
  return { wrapper, router }
}

function press(key: string, target: EventTarget = window, init: KeyboardEventInit = {}) {
  const event = new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true, ...init })
  target.dispatchEvent(event)
  return event
}

const position = (wrapper: Awaited<ReturnType<typeof setup>>['wrapper']) => wrapper.find('.stepper__position').text()
const slider = (wrapper: Awaited<ReturnType<typeof setup>>['wrapper']) => wrapper.find('[role="slider"]')

async function settleUrl() {
  await new Promise((resolve) => setTimeout(resolve, URL_DELAY + 20))
  await flushPromises()
}

describe('StudioStepper with useStepNavigation', () => {
  let router: Router | undefined
  beforeEach(() => {
    document.body.innerHTML = ''
  })
  afterEach(() => {
    router = undefined
    vi.restoreAllMocks()
  })

  it('should step with → and ←, and jump with Home and End', async () => {
    const { wrapper } = await setup()
    expect(position(wrapper)).toBe(`Start / ${COUNT}`)

    press('ArrowRight')
    press('ArrowRight')
    await flushPromises()
    expect(position(wrapper)).toBe(`2 / ${COUNT}`)
    expect(slider(wrapper).attributes('aria-valuenow')).toBe('2')

    press('ArrowLeft')
    await flushPromises()
    expect(position(wrapper)).toBe(`1 / ${COUNT}`)

    press('End')
    await flushPromises()
    expect(position(wrapper)).toBe(`${COUNT} / ${COUNT}`)
    press('ArrowRight')
    await flushPromises()
    expect(position(wrapper)).toBe(`${COUNT} / ${COUNT}`)

    press('Home')
    await flushPromises()
    expect(position(wrapper)).toBe(`Start / ${COUNT}`)
    wrapper.unmount()
  })

  it('should jump to a typed step number on Enter, and forget it on Escape', async () => {
    const { wrapper } = await setup()
    press('1')
    press('2')
    await flushPromises()
    expect(position(wrapper)).toContain('Go to step 12')

    const enter = press('Enter')
    await flushPromises()
    expect(enter.defaultPrevented).toBe(true)
    expect(position(wrapper)).toBe(`12 / ${COUNT}`)

    press('4')
    press('Escape')
    press('Enter')
    await flushPromises()
    expect(position(wrapper)).toBe(`12 / ${COUNT}`)

    press('9')
    press('9')
    press('9')
    press('Enter')
    await flushPromises()
    expect(position(wrapper)).toBe(`${COUNT} / ${COUNT}`)
    wrapper.unmount()
  })

  it('should leave keys alone while focus is in a text field', async () => {
    const { wrapper } = await setup()
    const notes = wrapper.find('textarea').element
    const title = wrapper.find('input').element
    const fromNotes = press('ArrowRight', notes)
    press('5', notes)
    press('Enter', notes)
    press('End', title)
    await flushPromises()
    expect(fromNotes.defaultPrevented).toBe(false)
    expect(position(wrapper)).toBe(`Start / ${COUNT}`)
    wrapper.unmount()
  })

  it('should leave keys alone when a modifier is held or a widget already handled them', async () => {
    const { wrapper } = await setup()
    press('ArrowRight', window, { ctrlKey: true })
    const handled = new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true, cancelable: true })
    handled.preventDefault()
    window.dispatchEvent(handled)
    await flushPromises()
    expect(position(wrapper)).toBe(`Start / ${COUNT}`)
    wrapper.unmount()
  })

  it('should step with the Previous and Next buttons', async () => {
    const { wrapper } = await setup()
    const next = wrapper.findAll('button').find((b) => b.text() === 'Next')!
    const previous = wrapper.findAll('button').find((b) => b.text() === 'Previous')!
    expect(previous.attributes('disabled')).toBeDefined()
    await next.trigger('click')
    await next.trigger('click')
    await previous.trigger('click')
    expect(position(wrapper)).toBe(`1 / ${COUNT}`)
    wrapper.unmount()
  })

  it('should keep the step in the URL with replace, not push', async () => {
    const setupResult = await setup()
    router = setupResult.router
    const { wrapper } = setupResult
    const push = vi.spyOn(router, 'push')
    const replace = vi.spyOn(router, 'replace')

    press('ArrowRight')
    press('ArrowRight')
    press('ArrowRight')
    await settleUrl()
    expect(router.currentRoute.value.query.step).toBe('3')
    expect(push).not.toHaveBeenCalled()
    // Several quick steps settle into one address-bar update.
    expect(replace).toHaveBeenCalledTimes(1)
    wrapper.unmount()
  })

  it('should open at the step in the URL and follow the URL when it changes', async () => {
    const setupResult = await setup('/studio?step=7')
    router = setupResult.router
    const { wrapper } = setupResult
    expect(position(wrapper)).toBe(`7 / ${COUNT}`)

    await router.replace('/studio?step=20')
    await flushPromises()
    expect(position(wrapper)).toBe(`20 / ${COUNT}`)

    await router.replace('/studio?step=99999')
    await flushPromises()
    expect(position(wrapper)).toBe(`${COUNT} / ${COUNT}`)
    wrapper.unmount()
  })

  it('should not snap back to an older URL value while the newer one is still on its way', async () => {
    const setupResult = await setup()
    router = setupResult.router
    const { wrapper } = setupResult
    press('ArrowRight')
    await settleUrl()
    press('ArrowRight')
    press('ArrowRight')
    await flushPromises()
    expect(position(wrapper)).toBe(`3 / ${COUNT}`)
    await settleUrl()
    expect(router.currentRoute.value.query.step).toBe('3')
    expect(position(wrapper)).toBe(`3 / ${COUNT}`)
    wrapper.unmount()
  })
})
