import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { enableAutoUnmount, flushPromises } from '@vue/test-utils'
import App from '@/App.vue'
import ChannelView from '@/views/ChannelView.vue'
import { SESSION_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { createHarness, jsonResponse, membership, mockApi, mountAt, saveSession, sessionFixture } from './support'

const channel = { id: 12, name: 'Thermo Thursdays', slug: 'thermo-thursdays', description: 'Weekly thermometer solves', role: 'presenter', memberCount: 2 }

enableAutoUnmount(afterEach)

describe('App shell', () => {
  beforeEach(() => {
    localStorage.clear()
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('should list your channels with your role in each', async () => {
    saveSession()
    mockApi({ 'GET /api/channels': jsonResponse(200, [channel]) })

    const { wrapper } = await mountAt(App, '/')

    expect(wrapper.find('header').text()).toContain('Ada Lane')
    expect(wrapper.find('main h1').text()).toBe('Your channels')
    const card = wrapper.find('main li')
    expect(card.text()).toContain('Thermo Thursdays')
    expect(card.text()).toContain('Presenter')
    expect(card.find('a').attributes('href')).toMatch(/^\/channels\/12(\/|$)/)
  })

  it('should show a channel, your role and its members to a presenter', async () => {
    saveSession()
    mockApi({
      'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships: [membership(12, 'presenter')] }),
      'GET /api/channels/12': jsonResponse(200, channel),
      'GET /api/channels/12/members': jsonResponse(200, [
        { userId: 7, name: 'Ada Lane', email: 'ada@example.test', role: 'presenter' },
        { userId: 8, name: 'Bo Reyes', email: 'bo@example.test', role: 'owner' },
      ]),
    })

    const harness = createHarness()
    await useSessionStore().loadMemberships()
    const { wrapper } = await mountAt(ChannelView, '/', harness, { channelId: 12 })

    expect(wrapper.find('h1').text()).toBe('Thermo Thursdays')
    expect(wrapper.find('dl').text()).toContain('Presenter')
    expect(wrapper.text()).toContain('Bo Reyes')
    expect(wrapper.text()).toContain('(you)')
  })

  it('should not ask a viewer\'s members list from the API', async () => {
    saveSession()
    const fetchMock = mockApi({
      'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships: [membership(12, 'viewer')] }),
      'GET /api/channels/12': jsonResponse(200, { ...channel, role: 'viewer' }),
    })

    const harness = createHarness()
    await useSessionStore().loadMemberships()
    const { wrapper } = await mountAt(ChannelView, '/', harness, { channelId: 12 })

    expect(wrapper.find('dl').text()).toContain('Viewer')
    expect(wrapper.text()).toContain('Owners, presenters and editors can see who else is in this channel.')
    expect(fetchMock.mock.calls.map(([url]) => String(url))).not.toContain('/api/channels/12/members')
  })

  it('should sign out from the header, clear cached data and return to sign-in', async () => {
    saveSession()
    mockApi({ 'GET /api/channels': jsonResponse(200, [channel]) })
    const { wrapper, router, queryClient } = await mountAt(App, '/')

    const signOut = wrapper.findAll('header button').find((b) => b.text() === 'Sign out')!
    await signOut.trigger('click')
    await flushPromises()

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query).toEqual({})
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
    expect(queryClient.getQueryCache().getAll()).toHaveLength(0)
    expect(wrapper.find('header').exists()).toBe(false)
  })

  it('should clear the session and go to sign-in, coming back afterwards, when an API call answers 401', async () => {
    saveSession()
    mockApi({ 'GET /api/channels': jsonResponse(401, { code: 'unauthorized', message: 'Token expired' }) })

    const { wrapper, router } = await mountAt(App, '/')
    await flushPromises()

    expect(useSessionStore().isSignedIn).toBe(false)
    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query).toMatchObject({ redirect: '/', reason: 'expired' })
    expect(wrapper.text()).toContain('Your session has ended')
  })
})
