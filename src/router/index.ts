import { createRouter } from 'vue-router'
import type { RouteLocationNormalized, RouteLocationRaw, RouteRecordRaw, RouterHistory } from 'vue-router'
import type { Role } from '@shared/schemas/auth'
import { useSessionStore } from '@/stores/session'
import SignInView from '@/views/SignInView.vue'

declare module 'vue-router' {
  interface RouteMeta {
    /** Only for signed-in users; others are sent to sign in and brought back. */
    requiresAuth?: boolean
    /** Roles allowed in the route's `:channelId` channel (or, without that param, in any channel). */
    roles?: Role[]
    /** A workspace screen: uses the whole window width (and, on a large screen, its height) instead of the reading column. */
    wide?: boolean
  }
}

export type RouteName = 'sign-in' | 'home' | 'library' | 'channel-members' | 'puzzle' | 'studio' | 'not-found'

/** Why the guard sent someone to the home page instead of where they asked to go. */
export type HomeNotice = 'forbidden' | 'access-unchecked'

const anyMember: Role[] = ['owner', 'presenter', 'editor', 'viewer']

export const routes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: SignInView },
  { path: '/', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { requiresAuth: true } },
  {
    path: '/channels/:channelId(\\d+)',
    name: 'library',
    component: () => import('@/views/LibraryView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, roles: anyMember },
  },
  {
    path: '/channels/:channelId(\\d+)/members',
    name: 'channel-members',
    component: () => import('@/views/ChannelView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, roles: anyMember },
  },
  {
    path: '/channels/:channelId(\\d+)/puzzles/:puzzleId(\\d+|new)',
    name: 'puzzle',
    component: () => import('@/views/PuzzleView.vue'),
    props: (route) => ({
      channelId: Number(route.params.channelId),
      puzzleId: route.params.puzzleId === 'new' ? 'new' : Number(route.params.puzzleId),
    }),
    meta: { requiresAuth: true, roles: ['owner', 'presenter', 'editor'] },
  },
  {
    path: '/channels/:channelId(\\d+)/outlines/:outlineId(\\d+)',
    name: 'studio',
    component: () => import('@/views/StudioView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId), outlineId: Number(route.params.outlineId) }),
    meta: { requiresAuth: true, roles: ['owner', 'presenter', 'editor'], wide: true },
  },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue') },
]

/** The one navigation guard: sign-in first, then the route's roles. */
export async function sessionGuard(to: RouteLocationNormalized): Promise<true | RouteLocationRaw> {
  const session = useSessionStore()
  const signedIn = session.checkExpiry()

  if (to.name === 'sign-in') return signedIn ? safeRedirect(to.query.redirect) : true
  if (!to.meta.requiresAuth) return true
  if (!signedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }

  const roles = to.meta.roles
  if (!roles) return true
  let memberships
  try {
    memberships = await session.loadMemberships()
  } catch {
    if (!session.isSignedIn) return { name: 'sign-in', query: { redirect: to.fullPath, reason: 'expired' } }
    return homeWith('access-unchecked')
  }
  const channelId = Number(to.params.channelId)
  const allowed = Number.isInteger(channelId)
    ? memberships.some((m) => m.channelId === channelId && roles.includes(m.role))
    : memberships.some((m) => roles.includes(m.role))
  return allowed || homeWith('forbidden')
}

export function createAppRouter(history: RouterHistory, routeList: RouteRecordRaw[] = routes) {
  const router = createRouter({
    history,
    routes: routeList,
    scrollBehavior: (_to, _from, saved) => saved ?? { top: 0 },
  })
  router.beforeEach(sessionGuard)
  return router
}

function homeWith(notice: HomeNotice): RouteLocationRaw {
  return { name: 'home', query: { notice } }
}

/** Only same-app paths: an absolute or protocol-relative URL in `redirect` would be an open redirect. */
export function safeRedirect(raw: unknown): string {
  if (typeof raw !== 'string' || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return '/'
  if (raw === '/sign-in' || raw.startsWith('/sign-in?')) return '/'
  return raw
}
