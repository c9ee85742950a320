import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { http } from '@/api/http'
import { SESSION_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { freshPinia, jsonResponse, membership, mockApi, saveSession, sessionFixture } from './support'
import { z } from 'zod'

describe('session store', () => {
  beforeEach(() => {
    localStorage.clear()
    freshPinia()
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('should sign in through the API and persist the token and user under gridcue.session', async () => {
    const answer = sessionFixture({ token: 'fresh' })
    const fetchMock = mockApi({ 'POST /api/auth/sign-in': jsonResponse(200, answer) })
    const session = useSessionStore()

    await session.signIn({ email: 'ada@example.test', password: 'pw' })

    expect(session.isSignedIn).toBe(true)
    expect(session.user).toEqual(answer.user)
    expect(JSON.parse(localStorage.getItem(SESSION_STORAGE_KEY)!)).toEqual(answer)
    const [, init] = fetchMock.mock.calls[0]!
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'ada@example.test', password: 'pw' })
  })

  it('should restore a saved session that has not expired', () => {
    const saved = saveSession()

    const session = useSessionStore()

    expect(session.isSignedIn).toBe(true)
    expect(session.token).toBe(saved.token)
    expect(session.user?.name).toBe('Ada Lane')
  })

  it('should drop a saved session whose token has expired', () => {
    saveSession(sessionFixture({ expiresAt: new Date(Date.now() - 1000).toISOString() }))

    const session = useSessionStore()

    expect(session.isSignedIn).toBe(false)
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should drop a saved session that is not valid JSON or misses fields', () => {
    localStorage.setItem(SESSION_STORAGE_KEY, '{"token":42')

    expect(useSessionStore().isSignedIn).toBe(false)
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should end the session when the token expires while the app is open', () => {
    vi.useFakeTimers()
    vi.setSystemTime(new Date('2030-01-01T10:00:00Z'))
    saveSession(sessionFixture({ expiresAt: '2030-01-01T10:30:00Z' }))
    const session = useSessionStore()
    expect(session.isSignedIn).toBe(true)

    vi.advanceTimersByTime(29 * 60 * 1000)
    expect(session.isSignedIn).toBe(true)

    vi.advanceTimersByTime(60 * 1000)
    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('expired')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should not send an expired token even before its timer has fired', async () => {
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(new Date('2030-01-01T10:00:00Z'))
    saveSession(sessionFixture({ expiresAt: '2030-01-01T10:30:00Z' }))
    const session = useSessionStore()
    const fetchMock = mockApi({ 'GET /api/ping': jsonResponse(200, {}) })

    vi.setSystemTime(new Date('2030-01-01T11:00:00Z'))
    await http.get('/ping', z.object({}))

    const headers = fetchMock.mock.calls[0]![1]?.headers as Record<string, string>
    expect(headers.Authorization).toBeUndefined()
    expect(session.isSignedIn).toBe(false)
  })

  it('should end the session when an API call answers 401', async () => {
    saveSession()
    const session = useSessionStore()
    mockApi({ 'GET /api/auth/me': jsonResponse(401, { code: 'unauthorized', message: 'Sign in again' }) })

    await expect(session.loadMemberships()).rejects.toMatchObject({ status: 401 })

    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('expired')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should sign out on request and forget the token', () => {
    saveSession()
    const session = useSessionStore()

    session.signOut()

    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('signed-out')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should answer roleIn and can from the memberships and the role table', async () => {
    saveSession()
    const fetchMock = mockApi({
      'GET /api/auth/me': jsonResponse(200, {
        user: sessionFixture().user,
        memberships: [membership(1, 'owner'), membership(2, 'presenter'), membership(3, 'editor'), membership(4, 'viewer')],
      }),
    })
    const session = useSessionStore()

    await Promise.all([session.loadMemberships(), session.loadMemberships()])

    expect(fetchMock).toHaveBeenCalledTimes(1)
    expect(session.roleIn(2)).toBe('presenter')
    expect(session.roleIn(99)).toBeNull()
    expect(session.can(1, 'members.manage')).toBe(true)
    expect(session.can(2, 'outline.edit')).toBe(true)
    expect(session.can(2, 'recording.edit')).toBe(false)
    expect(session.can(3, 'episode.publish')).toBe(true)
    expect(session.can(3, 'puzzle.edit')).toBe(false)
    expect(session.can(4, 'episode.read')).toBe(true)
    expect(session.can(4, 'members.read')).toBe(false)
    expect(session.can(99, 'episode.read')).toBe(false)
  })
})
