import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory } from 'vue-router'
import type { RouteRecordRaw } from 'vue-router'
import { createAppRouter, routes, safeRedirect } from '@/router'
import { freshPinia, jsonResponse, membership, mockApi, saveSession, sessionFixture } from './support'

const Blank = { render: () => null }

// A route only owners and presenters may open, standing in for the screens that will need it.
const withStudio: RouteRecordRaw[] = [
  ...routes.filter((r) => r.name !== 'not-found'),
  { path: '/channels/:channelId(\\d+)/studio', name: 'studio', component: Blank, meta: { requiresAuth: true, roles: ['owner', 'presenter'] } },
  ...routes.filter((r) => r.name === 'not-found'),
]

function meWith(...memberships: ReturnType<typeof membership>[]) {
  return mockApi({ 'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships }) })
}

describe('router guard', () => {
  beforeEach(() => {
    localStorage.clear()
    freshPinia()
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('should redirect an anonymous user to sign-in with the requested path as redirect', async () => {
    const router = createAppRouter(createMemoryHistory())

    await router.push('/channels/12?tab=people')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.redirect).toBe('/channels/12?tab=people')
  })

  it('should let anyone see the not-found page', async () => {
    const router = createAppRouter(createMemoryHistory())

    await router.push('/no/such/page')

    expect(router.currentRoute.value.name).toBe('not-found')
  })

  it('should let a signed-in member into their channel', async () => {
    saveSession()
    meWith(membership(12, 'viewer'))
    const router = createAppRouter(createMemoryHistory())

    await router.push('/channels/12')

    expect(router.currentRoute.value.path).toBe('/channels/12')
    expect(router.currentRoute.value.name).not.toMatch(/^(sign-in|home|not-found)$/)
  })

  it('should keep a signed-in user out of a channel they are not in', async () => {
    saveSession()
    meWith(membership(12, 'owner'))
    const router = createAppRouter(createMemoryHistory())

    await router.push('/channels/13')

    expect(router.currentRoute.value.name).toBe('home')
    expect(router.currentRoute.value.query.notice).toBe('forbidden')
  })

  it('should block a viewer from a route whose roles leave viewers out', async () => {
    saveSession()
    meWith(membership(12, 'viewer'))
    const router = createAppRouter(createMemoryHistory(), withStudio)

    await router.push('/channels/12/studio')

    expect(router.currentRoute.value.name).toBe('home')
    expect(router.currentRoute.value.query.notice).toBe('forbidden')
  })

  it('should let a presenter into that same route', async () => {
    saveSession()
    meWith(membership(12, 'presenter'))
    const router = createAppRouter(createMemoryHistory(), withStudio)

    await router.push('/channels/12/studio')

    expect(router.currentRoute.value.name).toBe('studio')
  })

  it('should send a user whose token is refused back to sign-in', async () => {
    saveSession()
    mockApi({ 'GET /api/auth/me': jsonResponse(401, { code: 'unauthorized', message: 'Sign in' }) })
    const router = createAppRouter(createMemoryHistory())

    await router.push('/channels/12')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query).toMatchObject({ redirect: '/channels/12', reason: 'expired' })
  })

  it('should send a signed-in user away from sign-in to the redirect target', async () => {
    saveSession()
    const router = createAppRouter(createMemoryHistory())

    await router.push({ name: 'sign-in', query: { redirect: '/somewhere' } })

    expect(router.currentRoute.value.fullPath).toBe('/somewhere')
  })

  it('should only follow redirects inside the app', () => {
    expect(safeRedirect('/channels/3')).toBe('/channels/3')
    expect(safeRedirect('https://evil.example')).toBe('/')
    expect(safeRedirect('//evil.example')).toBe('/')
    expect(safeRedirect('/\\evil.example')).toBe('/')
    expect(safeRedirect(['/a'])).toBe('/')
    expect(safeRedirect('/sign-in?redirect=/x')).toBe('/')
  })
})
