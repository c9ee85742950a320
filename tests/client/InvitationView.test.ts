/** The page an invitation mail links to: a new person signs up and lands in the channel; dead links say why. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { InvitationView } from '@shared/schemas/team'
import App from '@/App.vue'
import { useSessionStore } from '@/stores/session'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { sessionFixture } from './support'

// an invented channel and people
const invitation: InvitationView = { channelName: 'Lantern Logic', role: 'editor', email: 'noor@example.test', invitedBy: 'Ada Lane', accountExists: false }
const noor = sessionFixture({ token: 'token-noor', user: { id: 12, email: 'noor@example.test', name: 'Noor Haddad' } })

describe('InvitationView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
  })

  it('should sign a new person up with name and password, keep the session and open the channel', async () => {
    const sent: unknown[] = []
    api.use(
      http.get(apiPath('/invitations/abc123'), () => HttpResponse.json(invitation)),
      http.post(apiPath('/invitations/abc123/sign-up'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(noor, { status: 201 })
      }),
      http.get(apiPath('/auth/me'), () =>
        HttpResponse.json({ user: noor.user, memberships: [{ channelId: 4, channelName: 'Lantern Logic', channelSlug: 'lantern-logic', role: 'editor' }] }),
      ),
      // the channel's library, where the new member lands
      http.get(apiPath('/channels/4'), () => HttpResponse.json({ id: 4, name: 'Lantern Logic', slug: 'lantern-logic', description: '', role: 'editor', memberCount: 3 })),
      http.get(apiPath('/channels/4/puzzles'), () => HttpResponse.json([])),
      http.get(apiPath('/channels/4/episodes'), () => HttpResponse.json([])),
    )
    const { router } = await renderAt(App, '/invitations/abc123')
    const user = userEvent.setup()

    expect(await screen.findByRole('heading', { level: 1, name: 'Join Lantern Logic' })).toBeInTheDocument()
    expect(screen.getByText(/Ada Lane invites you/)).toBeInTheDocument()
    await user.type(screen.getByLabelText('Your name'), 'Noor Haddad')
    await user.type(screen.getByLabelText('Choose a password'), 'violet kettle under marble')
    await user.click(screen.getByRole('button', { name: 'Create account and join' }))

    await screen.findByRole('heading', { level: 1, name: 'Library' })
    expect(router.currentRoute.value.path).toBe('/channels/4')
    expect(sent).toEqual([{ name: 'Noor Haddad', password: 'violet kettle under marble' }])
    expect(useSessionStore().token).toBe('token-noor')
  })

  it("should say what to do with a link that has been used, in the server's words", async () => {
    // the server's wording for a used link (server/services/invitations.ts)
    const sentence = 'This invitation has been used already. Sign in to reach the channel, or ask its owner for a new invitation.'
    api.use(http.get(apiPath('/invitations/used1'), () => HttpResponse.json({ code: 'invitation-used', message: sentence }, { status: 410 })))
    await renderAt(App, '/invitations/used1')

    expect(await screen.findByText(sentence)).toBeInTheDocument()
    expect(screen.queryByRole('button', { name: 'Create account and join' })).not.toBeInTheDocument()
  })

  it('should offer a signed-in person to join instead of a sign-up form', async () => {
    localStorage.setItem('gridcue.session', JSON.stringify(sessionFixture()))
    const accepted: string[] = []
    api.use(
      http.get(apiPath('/invitations/abc123'), () => HttpResponse.json({ ...invitation, email: 'ada@example.test', accountExists: true })),
      http.post(apiPath('/invitations/abc123/accept'), ({ request }) => {
        accepted.push(request.headers.get('Authorization') ?? '')
        return HttpResponse.json({ channelId: 4, role: 'editor', alreadyMember: false })
      }),
      http.get(apiPath('/auth/me'), () =>
        HttpResponse.json({ user: sessionFixture().user, memberships: [{ channelId: 4, channelName: 'Lantern Logic', channelSlug: 'lantern-logic', role: 'editor' }] }),
      ),
      http.get(apiPath('/channels/4'), () => HttpResponse.json({ id: 4, name: 'Lantern Logic', slug: 'lantern-logic', description: '', role: 'editor', memberCount: 3 })),
      http.get(apiPath('/channels/4/puzzles'), () => HttpResponse.json([])),
      http.get(apiPath('/channels/4/episodes'), () => HttpResponse.json([])),
    )
    const { router } = await renderAt(App, '/invitations/abc123')

    await userEvent.setup().click(await screen.findByRole('button', { name: 'Join' }))

    await screen.findByRole('heading', { level: 1, name: 'Library' })
    expect(router.currentRoute.value.path).toBe('/channels/4')
    expect(accepted).toEqual(['Bearer token-abc'])
    expect(screen.queryByLabelText('Choose a password')).not.toBeInTheDocument()
  })
})
