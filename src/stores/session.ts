import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { useEventListener } from '@vueuse/core'
import { signInResponseSchema } from '@shared/schemas/auth'
import type { Membership, Role, SignInInput, SignInResponse, User } from '@shared/schemas/auth'
import { getMe, signIn as postSignIn, signOut as postSignOut } from '@/api/auth'
import { setHttpAuth } from '@/api/http'
import { roleCan, type Action } from '@shared/permissions'

export const SESSION_STORAGE_KEY = 'gridcue.session'

/** Why the last session ended: the user asked, or the token ran out / was refused. */
export type SessionEnd = 'signed-out' | 'expired'

// setTimeout keeps its delay in a signed 32-bit int; anything longer would fire at once.
const MAX_TIMER_MS = 2 ** 31 - 1

export const useSessionStore = defineStore('session', () => {
  const saved = readSaved()
  const token = ref<string | null>(saved?.token ?? null)
  const expiresAt = ref<string | null>(saved?.expiresAt ?? null)
  const user = ref<User | null>(saved?.user ?? null)
  /** Null until /auth/me has answered for this session; roles can change, so they are not persisted. */
  const memberships = ref<Membership[] | null>(null)
  const endReason = ref<SessionEnd | null>(null)

  const isSignedIn = computed(() => token.value !== null)

  let expiryTimer: ReturnType<typeof setTimeout> | undefined
  let membershipsRequest: Promise<Membership[]> | null = null

  function start(session: SignInResponse): void {
    token.value = session.token
    expiresAt.value = session.expiresAt
    user.value = session.user
    memberships.value = null
    endReason.value = null
    persist()
    scheduleExpiry()
  }

  function end(reason: SessionEnd): void {
    clearTimeout(expiryTimer)
    if (token.value === null) return
    token.value = null
    expiresAt.value = null
    user.value = null
    memberships.value = null
    endReason.value = reason
    localStorage.removeItem(SESSION_STORAGE_KEY)
  }

  async function signIn(input: SignInInput): Promise<void> {
    start(await postSignIn(input))
  }

  /**
   * Signs out here at once, and on the server so that copies of the token die too. The server's part is
   * best effort: offline, or with a token it has already refused, the session still ends here.
   */
  async function signOut(): Promise<void> {
    // the request reads the token as it starts, before the session below forgets it
    const serverSignOut = token.value === null ? Promise.resolve() : postSignOut()
    end('signed-out')
    await serverSignOut.catch(() => {})
  }

  function expire(): void {
    end('expired')
  }

  /** Ends the session if its token has run out; returns whether someone is still signed in. */
  function checkExpiry(): boolean {
    if (token.value !== null && isPast(expiresAt.value)) expire()
    return token.value !== null
  }

  function scheduleExpiry(): void {
    clearTimeout(expiryTimer)
    if (token.value === null || expiresAt.value === null) return
    const ms = Date.parse(expiresAt.value) - Date.now()
    expiryTimer = setTimeout(() => {
      if (checkExpiry()) scheduleExpiry()
    }, Math.min(Math.max(ms, 0), MAX_TIMER_MS))
  }

  /** Loads the user's channels and roles once per session (shared by concurrent callers). */
  function loadMemberships(): Promise<Membership[]> {
    if (memberships.value) return Promise.resolve(memberships.value)
    if (membershipsRequest) return membershipsRequest
    const askedWith = token.value
    membershipsRequest = getMe()
      .then((me) => {
        // A sign-out or another sign-in while waiting makes this answer stale.
        if (token.value === askedWith) {
          user.value = me.user
          memberships.value = me.memberships
          persist()
        }
        return me.memberships
      })
      .finally(() => {
        membershipsRequest = null
      })
    return membershipsRequest
  }

  /** Asks again after the person's channels changed (a channel made, joined or left). */
  function reloadMemberships(): Promise<Membership[]> {
    memberships.value = null
    membershipsRequest = null
    return loadMemberships()
  }

  function roleIn(channelId: number): Role | null {
    return memberships.value?.find((m) => m.channelId === channelId)?.role ?? null
  }

  function can(channelId: number, action: Action): boolean {
    return roleCan(roleIn(channelId), action)
  }

  function persist(): void {
    if (token.value === null || expiresAt.value === null || user.value === null) return
    const value: SignInResponse = { token: token.value, expiresAt: expiresAt.value, user: user.value }
    localStorage.setItem(SESSION_STORAGE_KEY, JSON.stringify(value))
  }

  // Other tabs: signing out (or in as someone else) there applies here too. Bound to the store's scope, so a
  // disposed or hot-replaced store stops listening.
  useEventListener(window, 'storage', (event) => {
    if (event.key !== SESSION_STORAGE_KEY && event.key !== null) return
    const next = readSaved()
    if (!next) end('signed-out')
    else if (next.token !== token.value) start(next)
  })

  // The store owns the token, so it hands the HTTP client a getter rather than the client importing the store.
  setHttpAuth({ getToken: () => (checkExpiry() ? token.value : null), onUnauthorized: expire })
  scheduleExpiry()

  return {
    token, expiresAt, user, memberships, endReason,
    isSignedIn,
    // start: a fresh token the server handed out elsewhere (sign-up, reset, password change) is kept like a sign-in's
    start, signIn, signOut, expire, checkExpiry, loadMemberships, reloadMemberships, roleIn, can,
  }
})

function isPast(iso: string | null): boolean {
  const ms = iso === null ? Number.NaN : Date.parse(iso)
  // An unreadable expiry counts as expired: better one extra sign-in than a token kept forever.
  return Number.isNaN(ms) || ms <= Date.now()
}

function readSaved(): SignInResponse | null {
  const raw = localStorage.getItem(SESSION_STORAGE_KEY)
  if (raw === null) return null
  let parsed: SignInResponse | null = null
  try {
    const result = signInResponseSchema.safeParse(JSON.parse(raw))
    if (result.success) parsed = result.data
  } catch {
    // Not JSON: fall through and drop it.
  }
  if (parsed === null || isPast(parsed.expiresAt)) {
    localStorage.removeItem(SESSION_STORAGE_KEY)
    return null
  }
  return parsed
}

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useSessionStore, import.meta.hot))
