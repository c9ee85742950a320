import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen, waitFor, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Membership } from '@shared/schemas/auth'
import App from '@/App.vue'
import { SESSION_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const channel = { id: 12, name: 'Thermo Thursdays', slug: 'thermo-thursdays', description: 'Weekly thermometer solves', role: 'presenter', memberCount: 2 }

function answerMe(...memberships: Membership[]) {
  api.use(http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships })))
}

/** The channel facts as a screen reader reads the description list: each term with its definition. */
function channelFacts(): Record<string, string> {
  const terms = screen.getAllByRole('term')
  const definitions = screen.getAllByRole('definition')
  return Object.fromEntries(terms.map((term, i) => [term.textContent!.trim(), definitions[i]!.textContent!.trim()]))
}

describe('App shell', () => {
  beforeEach(() => {
    localStorage.clear()
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('should list your channels with your role in each', async () => {
    saveSession()
    api.use(http.get(apiPath('/channels'), () => HttpResponse.json([channel])))

    await renderAt(App, '/')

    expect(screen.getByText('Ada Lane')).toHaveTextContent('Signed in as Ada Lane')
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Your channels')
    const [card, ...others] = within(screen.getByRole('list', { name: 'Channels' })).getAllByRole('listitem')
    expect(others).toHaveLength(0)
    expect(within(card!).getByRole('link', { name: 'Thermo Thursdays' })).toHaveAttribute('href', '/channels/12')
    expect(card).toHaveTextContent('Presenter')
  })

  it('should show a channel, your role and its members to a presenter', async () => {
    saveSession()
    answerMe(membership(12, 'presenter'))
    api.use(
      http.get(apiPath('/channels/12'), () => HttpResponse.json(channel)),
      http.get(apiPath('/channels/12/members'), () =>
        HttpResponse.json([
          { userId: 7, name: 'Ada Lane', email: 'ada@example.test', role: 'presenter' },
          { userId: 8, name: 'Bo Reyes', email: 'bo@example.test', role: 'owner' },
        ]),
      ),
    )

    await renderAt(App, '/channels/12/members')

    expect(await screen.findByRole('heading', { level: 1, name: 'Thermo Thursdays' })).toBeInTheDocument()
    expect(channelFacts()).toMatchObject({ 'Your role': 'Presenter', Members: '2' })
    const members = within(screen.getByRole('region', { name: 'Members' }))
    const rows = await members.findAllByRole('listitem')
    expect(rows.map((row) => row.textContent)).toEqual([
      expect.stringMatching(/^Ada Lane \(you\)\s*ada@example\.test\s*Presenter$/),
      expect.stringMatching(/^Bo Reyes\s*bo@example\.test\s*Owner$/),
    ])
  })

  it("should not ask a viewer's members list from the API", async () => {
    saveSession()
    answerMe(membership(12, 'viewer'))
    let membersAsked = false
    api.use(
      http.get(apiPath('/channels/12'), () => HttpResponse.json({ ...channel, role: 'viewer' })),
      http.get(apiPath('/channels/12/members'), () => {
        membersAsked = true
        return HttpResponse.json([])
      }),
    )

    await renderAt(App, '/channels/12/members')

    expect(await screen.findByRole('heading', { level: 1, name: 'Thermo Thursdays' })).toBeInTheDocument()
    expect(channelFacts()).toMatchObject({ 'Your role': 'Viewer' })
    expect(screen.getByRole('region', { name: 'Members' })).toHaveTextContent(
      'Owners, presenters and editors can see who else is in this channel.',
    )
    expect(membersAsked).toBe(false)
  })

  it('should sign out from the header, clear cached data and return to sign-in', async () => {
    saveSession()
    let endedOnServer = false
    api.use(
      http.get(apiPath('/channels'), () => HttpResponse.json([channel])),
      http.post(apiPath('/auth/sign-out'), () => {
        endedOnServer = true
        return new HttpResponse(null, { status: 204 })
      }),
    )
    const { router, queryClient } = await renderAt(App, '/')
    await screen.findByRole('link', { name: 'Thermo Thursdays' })

    await userEvent.click(screen.getByRole('button', { name: 'Sign out' }))

    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeInTheDocument()
    expect(router.currentRoute.value.query).toEqual({})
    expect(screen.queryByRole('button', { name: 'Sign out' })).not.toBeInTheDocument()
    expect(screen.queryByText('Ada Lane')).not.toBeInTheDocument()
    expect(screen.queryByText('Your session has ended', { exact: false })).not.toBeInTheDocument()
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
    expect(queryClient.getQueryCache().getAll()).toHaveLength(0)
    // the token dies on the server too, so a copy of it can't be used
    await waitFor(() => expect(endedOnServer).toBe(true))
  })

  it('should clear the session and go to sign-in, coming back afterwards, when an API call answers 401', async () => {
    saveSession()
    api.use(http.get(apiPath('/channels'), () => HttpResponse.json({ code: 'unauthorized', message: 'Token expired' }, { status: 401 })))

    const { router } = await renderAt(App, '/')

    expect(await screen.findByText('Your session has ended', { exact: false })).toBeInTheDocument()
    expect(useSessionStore().isSignedIn).toBe(false)
    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query).toMatchObject({ redirect: '/', reason: 'expired' })
  })
  it('should send you to sign-in when the token runs out on an open screen, and back there after signing in again', async () => {
    // The clock still ticks on its own (for the API answers and the screen's updates) but can be jumped ahead.
    vi.useFakeTimers({ shouldAdvanceTime: true })
    vi.setSystemTime(new Date('2030-01-01T10:00:00Z'))
    saveSession(sessionFixture({ expiresAt: '2030-01-01T10:30:00Z' }))
    api.use(
      http.get(apiPath('/channels'), () => HttpResponse.json([channel])),
      http.post(apiPath('/auth/sign-in'), () => HttpResponse.json(sessionFixture())),
    )
    const user = userEvent.setup({ advanceTimers: vi.advanceTimersByTime })
    const { router } = await renderAt(App, '/')
    expect(await screen.findByRole('link', { name: 'Thermo Thursdays' })).toBeInTheDocument()

    await vi.advanceTimersByTimeAsync(29 * 60 * 1000)
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(60 * 1000)

    expect(await screen.findByText('Your session has ended', { exact: false })).toBeInTheDocument()
    expect(screen.queryByRole('link', { name: 'Thermo Thursdays' })).not.toBeInTheDocument()
    expect(router.currentRoute.value.query).toMatchObject({ redirect: '/', reason: 'expired' })

    await user.type(screen.getByLabelText('E-mail'), 'ada@example.test')
    await user.type(screen.getByLabelText('Password'), 'correct horse')
    await user.click(screen.getByRole('button', { name: 'Sign in' }))

    expect(await screen.findByRole('link', { name: 'Thermo Thursdays' })).toBeInTheDocument()
    expect(router.currentRoute.value.fullPath).toBe('/')
  })
})
