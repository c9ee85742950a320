import { vi } from 'vitest'
import { mount, flushPromises } from '@vue/test-utils'
import type { Component } from 'vue'
import { createPinia, setActivePinia } from 'pinia'
import type { Pinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { RouteRecordRaw, Router } from 'vue-router'
import PrimeVue from 'primevue/config'
import { VueQueryPlugin } from '@tanstack/vue-query'
import type { QueryClient } from '@tanstack/vue-query'
import type { Membership, SignInResponse } from '@shared/schemas/auth'
import { createQueryClient } from '@/api/queryClient'
import { createAppRouter, routes } from '@/router'
import { SESSION_STORAGE_KEY } from '@/stores/session'

export const ada = { id: 7, email: 'ada@example.test', name: 'Ada Lane' }

/** A session as the server hands it out, valid for an hour unless told otherwise. */
export function sessionFixture(overrides: Partial<SignInResponse> = {}): SignInResponse {
  return {
    token: 'token-abc',
    expiresAt: new Date(Date.now() + 60 * 60 * 1000).toISOString(),
    user: ada,
    ...overrides,
  }
}

export function saveSession(session: SignInResponse = sessionFixture()): SignInResponse {
  localStorage.setItem(SESSION_STORAGE_KEY, JSON.stringify(session))
  return session
}

export function membership(channelId: number, role: Membership['role']): Membership {
  return { channelId, channelName: `Channel ${channelId}`, channelSlug: `channel-${channelId}`, role }
}

export function jsonResponse(status: number, body?: unknown): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  })
}

type Handler = (url: string, init: RequestInit) => Response | Promise<Response>

/** Replaces fetch with a route table keyed by "METHOD /path"; anything unlisted answers 404. */
export function mockApi(table: Record<string, Handler | Response | (() => Response)>) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = String(input)
    const key = `${init.method ?? 'GET'} ${url}`
    const entry = table[key]
    if (entry === undefined) return jsonResponse(404, { code: 'not-found', message: `No mock for ${key}` })
    if (entry instanceof Response) return entry.clone()
    return entry(url, init)
  })
  vi.stubGlobal('fetch', fetchMock)
  return fetchMock
}

export function freshPinia(): Pinia {
  const pinia = createPinia()
  setActivePinia(pinia)
  return pinia
}

export interface Harness {
  router: Router
  pinia: Pinia
  queryClient: QueryClient
}

/** The app's real plugins (PrimeVue unthemed, to skip style injection) around a memory-history router. */
export function createHarness(routeList: RouteRecordRaw[] = routes): Harness {
  const pinia = freshPinia()
  const router = createAppRouter(createMemoryHistory(), routeList)
  const queryClient = createQueryClient()
  queryClient.setDefaultOptions({ queries: { ...queryClient.getDefaultOptions().queries, retry: false } })
  return { router, pinia, queryClient }
}

export async function mountAt(
  component: Component,
  path: string,
  harness: Harness = createHarness(),
  props: Record<string, unknown> = {},
) {
  await harness.router.push(path)
  await harness.router.isReady()
  const wrapper = mount(component, {
    props,
    attachTo: document.body,
    global: {
      plugins: [harness.pinia, harness.router, [PrimeVue, { theme: 'none' }], [VueQueryPlugin, { queryClient: harness.queryClient }]],
    },
  })
  await flushPromises()
  return { wrapper, ...harness }
}
