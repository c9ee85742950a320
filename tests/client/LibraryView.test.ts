import { beforeEach, describe, expect, it } from 'vitest'
import { screen, within } from '@testing-library/vue'
import type { Role } from '@shared/schemas/auth'
import type { EpisodeSummary } from '@shared/schemas/episode'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const channel = { id: 1, name: 'Slow Thermos', slug: 'slow-thermos', description: '', role: 'presenter', memberCount: 3 }
const puzzles = [
  { id: 42, channelId: 1, title: 'Morning climb', author: 'Rosa Ilves', check: 'unique', outlineCount: 2, staleOutlineCount: 1, version: 3, updatedAt: '2025-05-01T10:00:00.000Z' },
  { id: 43, channelId: 1, title: 'Half-built', author: '', check: 'multiple-solutions', outlineCount: 0, staleOutlineCount: 0, version: 1, updatedAt: '2025-05-02T10:00:00.000Z' },
]

function episode(id: number, title: string, state: EpisodeSummary['state'], publishAt: string): EpisodeSummary {
  const slug = title.toLowerCase().replace(/[^a-z]+/g, '-')
  return { id, outlineId: 60 + id, slug, title, visibility: 'public', state, publishAt, pageUrl: `/episodes/slow-thermos/${slug}`, puzzleTitle: 'Morning climb', setter: 'Rosa Ilves' }
}
// as the server sends them to the studio team, newest publish date first
const episodes = [
  episode(3, 'Climbing at dawn', 'scheduled', '2099-06-01T18:00:00.000Z'),
  { ...episode(2, 'Morning climb, members cut', 'live', '2025-05-03T10:00:00.000Z'), visibility: 'members' as const },
  episode(1, 'First climb', 'unpublished', '2025-05-01T10:00:00.000Z'),
]

/** Channel 1 as a member with `role` sees it; returns whether its puzzle list was asked for. */
function answerAs(role: Role, channelEpisodes: EpisodeSummary[] = episodes): { puzzlesAsked: boolean } {
  const seen = { puzzlesAsked: false }
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, role)] })),
    http.get(apiPath('/channels/1'), () => HttpResponse.json({ ...channel, role })),
    http.get(apiPath('/channels/1/puzzles'), () => {
      seen.puzzlesAsked = true
      return HttpResponse.json(puzzles)
    }),
    http.get(apiPath('/channels/1/episodes'), () => HttpResponse.json(channelEpisodes)),
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

  it('should flag the takes made before their puzzle changed', async () => {
    answerAs('presenter')
    await renderAt(App, '/channels/1')

    const table = await screen.findByRole('table', { name: 'Puzzles' })
    expect(within(table).getByRole('row', { name: /Morning climb/ })).toHaveTextContent('1 made before a change')
    expect(within(table).getByRole('row', { name: /Half-built/ })).not.toHaveTextContent('made before a change')
  })

  it('should list every episode with its state, visibility and a plain link to its page for the studio team', async () => {
    answerAs('editor')
    await renderAt(App, '/channels/1')

    const section = screen.getByRole('region', { name: 'Episodes' })
    const items = within(within(section).getByRole('list', { name: 'Episodes' })).getAllByRole('listitem')
    expect(items.map((item) => within(item).getByRole('link').textContent)).toEqual(['Climbing at dawn', 'Morning climb, members cut', 'First climb'])
    expect(items[0]).toHaveTextContent(/Scheduled for .*2099/)
    expect(items[1]).toHaveTextContent('Live')
    expect(items[1]).toHaveTextContent('Channel members only')
    expect(items[2]).toHaveTextContent('Unpublished')
    expect(within(items[1]!).getByRole('link')).toHaveAttribute('href', '/episodes/slow-thermos/morning-climb-members-cut')
  })

  it("should show a viewer the channel's live episodes only, and no puzzles", async () => {
    const seen = answerAs('viewer')
    await renderAt(App, '/channels/1')

    const list = screen.getByRole('list', { name: 'Episodes' })
    const [only, ...others] = within(list).getAllByRole('listitem')
    expect(others).toHaveLength(0)
    expect(within(only!).getByRole('link', { name: 'Morning climb, members cut' })).toHaveAttribute('href', '/episodes/slow-thermos/morning-climb-members-cut')
    expect(only).toHaveTextContent('Morning climb by Rosa Ilves')
    expect(only).not.toHaveTextContent('Live')
    expect(screen.queryByRole('table')).not.toBeInTheDocument()
    expect(screen.queryByRole('link', { name: 'New puzzle' })).not.toBeInTheDocument()
    expect(seen.puzzlesAsked).toBe(false)
  })

  it('should tell a viewer where episodes will appear while there are none', async () => {
    answerAs('viewer', [])
    await renderAt(App, '/channels/1')

    expect(screen.getByRole('region', { name: 'Episodes' })).toHaveTextContent("No episodes yet. The channel's episodes appear here once they are published.")
    expect(screen.queryByRole('list', { name: 'Episodes' })).not.toBeInTheDocument()
  })
})
