/**
 * The client tests' stand-in API: msw intercepts fetch, so the real HTTP client runs unchanged.
 * Each test declares the answers it needs with `api.use(...)`; anything undeclared fails the test.
 */
import { setupServer } from 'msw/node'
import { HttpResponse, http } from 'msw'
import { afterAll, afterEach, beforeAll } from 'vitest'
import { config } from '@/config'

// the header's bell asks for the person's notifications on every signed-in screen: none, unless a test says otherwise
export const api = setupServer(http.get(apiPath('/notifications'), () => HttpResponse.json({ unread: 0, items: [] })))

/** An API path as the client requests it, e.g. `apiPath('/channels/3/puzzles')`. */
export function apiPath(path: string): string {
  return new URL(`${config.apiBase}${path}`, location.origin).href
}

export { HttpResponse, http }

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }))
afterEach(() => api.resetHandlers())
afterAll(() => api.close())
