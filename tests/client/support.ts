import type { Recording } from '@shared/schemas/recording'
import { createPinia, setActivePinia } from 'pinia'
import type { Pinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { RouteRecordRaw, Router } from 'vue-router'
import type { QueryClient } from '@tanstack/vue-query'
import type { Membership, SignInResponse } from '@shared/schemas/auth'
import { createQueryClient } from '@/api/queryClient'
import { createAppRouter, routes } from '@/router'
import { SESSION_STORAGE_KEY } from '@/stores/session'

/** A session as the server hands it out, valid for an hour unless told otherwise. */
export function sessionFixture(overrides: Partial<SignInResponse> = {}): SignInResponse {
  return {
    token: 'token-abc',
    expiresAt: new Date(Date.now() + 60 * 60 * 1000).toISOString(),
    user: { id: 7, email: 'ada@example.test', name: 'Ada Lane' },
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

/** The app's real plugins around a memory-history router (PrimeVue is added, unthemed, by the render helpers). */
export function createHarness(routeList: RouteRecordRaw[] = routes): Harness {
  const pinia = freshPinia()
  const router = createAppRouter(createMemoryHistory(), routeList)
  const queryClient = createQueryClient()
  queryClient.setDefaultOptions({ queries: { ...queryClient.getDefaultOptions().queries, retry: false } })
  return { router, pinia, queryClient }
}

/** "r3c4" as the grid's cells are named for screen readers: "row 3, column 4". */
export const spokenCell = (name: string): string => name.replace(/^r(\d)c(\d)$/, 'row $1, column $2')

/** A take's current recording as the server lists it: a minute of audio, ready to play. */
export function recordingFixture(overrides: Partial<Recording> = {}): Recording {
  return {
    id: 5,
    outlineId: 31,
    name: 'take-one.webm',
    mime: 'audio/webm',
    kind: 'audio',
    sizeBytes: 480_000,
    durationMs: 60_000,
    current: true,
    hasPeaks: true,
    playback: 'ready',
    uploadedBy: 'Ada Lane',
    uploadedAt: '2026-11-30T09:00:00.000Z',
    ...overrides,
  }
}
