/** Home: the person's channels, and a new channel of their own. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { ChannelSummary } from '@shared/schemas/channel'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

// an invented channel
const created: ChannelSummary = { id: 8, name: 'Quiet Ladders', slug: 'quiet-ladders', description: '', role: 'owner', memberCount: 1 }

describe('HomeView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it('should create a channel from its name and open it, its owner now', async () => {
    const sent: unknown[] = []
    let memberships = [membership(1, 'viewer')]
    api.use(
      http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships })),
      http.get(apiPath('/channels'), () => HttpResponse.json([])),
      http.post(apiPath('/channels'), async ({ request }) => {
        sent.push(await request.json())
        memberships = [...memberships, membership(8, 'owner')]
        return HttpResponse.json(created, { status: 201 })
      }),
      http.get(apiPath('/channels/8'), () => HttpResponse.json(created)),
      http.get(apiPath('/channels/8/puzzles'), () => HttpResponse.json([])),
      http.get(apiPath('/channels/8/episodes'), () => HttpResponse.json([])),
    )
    const { router } = await renderAt(App, '/')
    const user = userEvent.setup()

    await user.click(screen.getByRole('button', { name: 'New channel' }))
    const dialog = await screen.findByRole('dialog', { name: 'New channel' })
    await user.click(within(dialog).getByRole('button', { name: 'Create channel' }))
    expect(within(dialog).getByLabelText('Channel name')).toHaveAccessibleDescription('Give the channel a name')
    await user.type(within(dialog).getByLabelText('Channel name'), '  Quiet Ladders ')
    await user.click(within(dialog).getByRole('button', { name: 'Create channel' }))

    // the guard lets the owner in only once it has read the new membership
    await screen.findByRole('heading', { level: 1, name: 'Library' })
    expect(router.currentRoute.value.path).toBe('/channels/8')
    expect(sent).toEqual([{ name: 'Quiet Ladders', description: '' }])
  })
})
