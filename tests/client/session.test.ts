import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { z } from 'zod'
import { http as client } from '@/api/http'
import { SESSION_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { api, apiPath, http, HttpResponse } from './msw'
import { freshPinia, membership, saveSession, sessionFixture } from './support'

/** What another tab's change to the saved session looks like from here. */
function storageChangedElsewhere(key: string | null = SESSION_STORAGE_KEY): void {
  window.dispatchEvent(new StorageEvent('storage', { key }))
}

describe('session store', () => {
  beforeEach(() => {
    localStorage.clear()
    freshPinia()
  })
  afterEach(() => {
    useSessionStore().$dispose()
    vi.useRealTimers()
  })

  it('should sign in through the API and persist the token and user under gridcue.session', async () => {
    const answer = sessionFixture({ token: 'fresh' })
    const sent: unknown[] = []
    api.use(
      http.post(apiPath('/auth/sign-in'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(answer)
      }),
    )
    const session = useSessionStore()

    await session.signIn({ email: 'ada@example.test', password: 'pw' })

    expect(session.isSignedIn).toBe(true)
    expect(session.user).toEqual(answer.user)
    expect(JSON.parse(localStorage.getItem(SESSION_STORAGE_KEY)!)).toEqual(answer)
    expect(sent).toEqual([{ email: 'ada@example.test', password: 'pw' }])
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
    const authorization: (string | null)[] = []
    api.use(
      http.get(apiPath('/ping'), ({ request }) => {
        authorization.push(request.headers.get('Authorization'))
        return HttpResponse.json({})
      }),
    )

    vi.setSystemTime(new Date('2030-01-01T11:00:00Z'))
    await client.get('/ping', z.object({}))

    expect(authorization).toEqual([null])
    expect(session.isSignedIn).toBe(false)
  })

  it('should end the session when an API call answers 401', async () => {
    saveSession()
    const session = useSessionStore()
    api.use(http.get(apiPath('/auth/me'), () => HttpResponse.json({ code: 'unauthorized', message: 'Sign in again' }, { status: 401 })))

    await expect(session.loadMemberships()).rejects.toMatchObject({ status: 401 })

    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('expired')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should sign out on the server with the token, and forget the token here at once', async () => {
    const saved = saveSession()
    const sent: (string | null)[] = []
    let answer: () => void = () => {}
    api.use(
      http.post(apiPath('/auth/sign-out'), async ({ request }) => {
        sent.push(request.headers.get('Authorization'))
        await new Promise<void>((resolve) => (answer = resolve))
        return new HttpResponse(null, { status: 204 })
      }),
    )
    const session = useSessionStore()

    const signingOut = session.signOut()

    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('signed-out')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
    await vi.waitFor(() => expect(sent).toEqual([`Bearer ${saved.token}`]))
    answer()
    await signingOut
  })

  it.each([
    ['the server fails', () => HttpResponse.json({ code: 'internal', message: 'Something went wrong' }, { status: 500 })],
    ['the token was already refused', () => HttpResponse.json({ code: 'unauthenticated', message: 'Please sign in first.' }, { status: 401 })],
    ['the network is down', () => HttpResponse.error()],
  ])('should still sign out here when %s', async (_case, reply) => {
    saveSession()
    api.use(http.post(apiPath('/auth/sign-out'), reply))
    const session = useSessionStore()

    await session.signOut()

    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('signed-out')
    expect(localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull()
  })

  it('should sign out here when another tab signs out or clears the storage', () => {
    saveSession()
    const session = useSessionStore()

    storageChangedElsewhere('some.other.key')
    expect(session.isSignedIn).toBe(true)

    localStorage.clear()
    storageChangedElsewhere(null)
    expect(session.isSignedIn).toBe(false)
    expect(session.endReason).toBe('signed-out')
  })

  it('should take on the session another tab signed in with', () => {
    saveSession()
    const session = useSessionStore()
    const bo = { id: 8, email: 'bo@example.test', name: 'Bo Reyes' }

    saveSession(sessionFixture({ token: 'token-bo', user: bo }))
    storageChangedElsewhere()

    expect(session.token).toBe('token-bo')
    expect(session.user).toEqual(bo)
  })

  it('should answer roleIn and can from the memberships and the role table', async () => {
    saveSession()
    let meCalls = 0
    api.use(
      http.get(apiPath('/auth/me'), () => {
        meCalls += 1
        return HttpResponse.json({
          user: sessionFixture().user,
          memberships: [membership(1, 'owner'), membership(2, 'presenter'), membership(3, 'editor'), membership(4, 'viewer')],
        })
      }),
    )
    const session = useSessionStore()

    await Promise.all([session.loadMemberships(), session.loadMemberships()])

    expect(meCalls).toBe(1)
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
