import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { enableAutoUnmount } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { RouterView } from 'vue-router'
import type { Role } from '@shared/schemas/auth'
import { jsonResponse, membership, mockApi, mountAt, saveSession, sessionFixture } from './support'

enableAutoUnmount(afterEach)

const Shell = defineComponent({ render: () => h(RouterView) })
const channel = { id: 1, name: 'Slow Thermos', slug: 'slow-thermos', description: '', role: 'presenter', memberCount: 3 }

function api(role: Role) {
  return mockApi({
    'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships: [membership(1, role)] }),
    'GET /api/channels/1': jsonResponse(200, { ...channel, role }),
    'GET /api/channels/1/puzzles': jsonResponse(200, [
      { id: 42, channelId: 1, title: 'Morning climb', author: 'Rosa Ilves', check: 'unique', outlineCount: 2, version: 3, updatedAt: '2025-05-01T10:00:00.000Z' },
      { id: 43, channelId: 1, title: 'Half-built', author: '', check: 'multiple-solutions', outlineCount: 0, version: 1, updatedAt: '2025-05-02T10:00:00.000Z' },
    ]),
  })
}

describe('LibraryView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it("should list the channel's puzzles with their check and offer New puzzle to a presenter", async () => {
    api('presenter')
    const { wrapper } = await mountAt(Shell, '/channels/1')
    const rows = wrapper.findAll('tbody tr')
    expect(rows).toHaveLength(2)
    expect(wrapper.text()).toContain('Morning climb')
    expect(wrapper.text()).toContain('Unique solution')
    expect(wrapper.text()).toContain('Several solutions')
    expect(wrapper.findAll('a').find((a) => a.text() === 'Morning climb')!.attributes('href')).toBe('/channels/1/puzzles/42')
    expect(wrapper.findAll('a').find((a) => a.text() === 'New puzzle')!.attributes('href')).toBe('/channels/1/puzzles/new')
  })

  it('should show a viewer a short note instead of the puzzles', async () => {
    const fetchMock = api('viewer')
    const { wrapper } = await mountAt(Shell, '/channels/1')
    expect(wrapper.text()).toContain('worked on by the channel')
    expect(wrapper.find('table').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('New puzzle')
    expect(fetchMock.mock.calls.some(([url]) => String(url) === '/api/channels/1/puzzles')).toBe(false)
  })
})
