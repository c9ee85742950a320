import { beforeEach, describe, expect, it } from 'vitest'
import { screen, within } from '@testing-library/vue'
import type { Role } from '@shared/schemas/auth'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const channel = { id: 1, name: 'Slow Thermos', slug: 'slow-thermos', description: '', role: 'presenter', memberCount: 3 }
const puzzles = [
  { id: 42, channelId: 1, title: 'Morning climb', author: 'Rosa Ilves', check: 'unique', outlineCount: 2, version: 3, updatedAt: '2025-05-01T10:00:00.000Z' },
  { id: 43, channelId: 1, title: 'Half-built', author: '', check: 'multiple-solutions', outlineCount: 0, version: 1, updatedAt: '2025-05-02T10:00:00.000Z' },
]

/** Channel 1 as a member with `role` sees it; returns whether its puzzle list was asked for. */
function answerAs(role: Role): { puzzlesAsked: boolean } {
  const seen = { puzzlesAsked: false }
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, role)] })),
    http.get(apiPath('/channels/1'), () => HttpResponse.json({ ...channel, role })),
    http.get(apiPath('/channels/1/puzzles'), () => {
      seen.puzzlesAsked = true
      return HttpResponse.json(puzzles)
    }),
  )
  return seen
}

describe('LibraryView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it("should list the channel's puzzles with their check and offer New puzzle to a presenter", async () => {
    answerAs('presenter')
    await renderAt(App, '/channels/1')

    const table = await screen.findByRole('table', { name: 'Puzzles' })
    const [, ...rows] = within(table).getAllByRole('row')
    expect(rows).toHaveLength(2)
    const climb = within(table).getByRole('row', { name: /Morning climb/ })
    expect(within(climb).getByRole('link', { name: 'Morning climb' })).toHaveAttribute('href', '/channels/1/puzzles/42')
    expect(climb).toHaveTextContent('Unique solution')
    expect(within(table).getByRole('row', { name: /Half-built/ })).toHaveTextContent('Several solutions')
    expect(screen.getByRole('link', { name: 'New puzzle' })).toHaveAttribute('href', '/channels/1/puzzles/new')
  })

  it('should show a viewer a short note instead of the puzzles', async () => {
    const seen = answerAs('viewer')
    await renderAt(App, '/channels/1')

    expect(await screen.findByText('worked on by the channel', { exact: false })).toBeInTheDocument()
    expect(screen.queryByRole('table')).not.toBeInTheDocument()
    expect(screen.queryByRole('link', { name: 'New puzzle' })).not.toBeInTheDocument()
    expect(seen.puzzlesAsked).toBe(false)
  })
})
