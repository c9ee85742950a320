/**
 * Renders a component the way the app runs it (real router with memory history, Pinia, PrimeVue unthemed,
 * vue-query) for Testing Library's queries. Importing it brings jest-dom's matchers and unmounts whatever a
 * test rendered once the test ends.
 */
import '@testing-library/jest-dom/vitest'
import { afterEach, vi } from 'vitest'
import { cleanup, render } from '@testing-library/vue'
import { flushPromises } from '@vue/test-utils'
import type { Component } from 'vue'
import PrimeVue from 'primevue/config'
import { VueQueryPlugin } from '@tanstack/vue-query'
import { createHarness } from './support'
import type { Harness } from './support'

export interface RenderAtOptions {
  /** Plugins to reuse, e.g. built from a route table with stand-ins. */
  harness?: Harness
  props?: Record<string, unknown>
}

/** Goes to `path` through the app's guard, renders `component` there and lets its first requests answer. */
export async function renderAt(component: Component, path: string, { harness = createHarness(), props = {} }: RenderAtOptions = {}) {
  await harness.router.push(path)
  await harness.router.isReady()
  const result = render(component, {
    props,
    global: {
      plugins: [harness.pinia, harness.router, [PrimeVue, { theme: 'none' }], [VueQueryPlugin, { queryClient: harness.queryClient }]],
    },
  })
  await settle()
  return { ...result, ...harness }
}

/** Renders one component with PrimeVue (unthemed) only: for pieces that need no router, store or server. */
export function renderComponent(component: Component, { props = {} }: Pick<RenderAtOptions, 'props'> = {}) {
  return render(component, { props, global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
}

/**
 * Lets pending promises, answers and timers due now run. Under fake timers that means moving the fake clock
 * by nothing, since the usual wait for the next real tick would never come.
 */
export async function settle(): Promise<void> {
  if (vi.isFakeTimers()) await vi.advanceTimersByTimeAsync(0)
  else await flushPromises()
}

// Vitest runs without globals, so Testing Library can't register its own cleanup.
afterEach(cleanup)
