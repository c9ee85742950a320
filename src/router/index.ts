import { createRouter } from 'vue-router'
import type { RouteLocationNormalized, RouteLocationRaw, RouteRecordRaw, RouterHistory } from 'vue-router'
import { roleCan } from '@shared/permissions'
import type { Action } from '@shared/permissions'
import { useSessionStore } from '@/stores/session'
import SignInView from '@/views/SignInView.vue'
import { safeRedirect } from './safe-redirect'

declare module 'vue-router' {
  interface RouteMeta {
    /** Only for signed-in users; others are sent to sign in and brought back. */
    requiresAuth?: boolean
    /**
     * What a member must be allowed to do (per the shared permission table) in the route's `:channelId` channel,
     * or, for a route without that param, in at least one of their channels.
     */
    access?: Action
    /** A workspace screen: uses the whole window width (and, on a large screen, its height) instead of the reading column. */
    wide?: boolean
  }
}

/** Every route is named, and only with one of these. */
type RouteName = 'sign-in' | 'home' | 'library' | 'channel-members' | 'puzzle' | 'studio' | 'align' | 'board' | 'schedule' | 'audit' | 'prompter' | 'not-found'
  | 'invitation' | 'reset-password' | 'reset-password-token' | 'account' | 'account-email'

/** Why the guard sent someone to the home page instead of where they asked to go. */
export type HomeNotice = 'forbidden' | 'access-unchecked'

export const routes: (RouteRecordRaw & { name: RouteName })[] = [
  { path: '/sign-in', name: 'sign-in', component: SignInView },
  { path: '/', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { requiresAuth: true } },
  {
    path: '/channels/:channelId(\\d+)',
    name: 'library',
    component: () => import('@/views/LibraryView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, access: 'channel.read' },
  },
  {
    path: '/channels/:channelId(\\d+)/members',
    name: 'channel-members',
    component: () => import('@/views/ChannelView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, access: 'channel.read' },
  },
  {
    path: '/channels/:channelId(\\d+)/puzzles/:puzzleId(\\d+|new)',
    name: 'puzzle',
    component: () => import('@/views/PuzzleView.vue'),
    props: (route) => ({
      channelId: Number(route.params.channelId),
      puzzleId: route.params.puzzleId === 'new' ? 'new' : Number(route.params.puzzleId),
    }),
    meta: { requiresAuth: true, access: 'puzzle.read' },
  },
  {
    path: '/channels/:channelId(\\d+)/outlines/:outlineId(\\d+)',
    name: 'studio',
    component: () => import('@/views/StudioView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId), outlineId: Number(route.params.outlineId) }),
    meta: { requiresAuth: true, access: 'outline.read', wide: true },
  },
  {
    path: '/channels/:channelId(\\d+)/outlines/:outlineId(\\d+)/align',
    name: 'align',
    component: () => import('@/views/AlignView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId), outlineId: Number(route.params.outlineId) }),
    meta: { requiresAuth: true, access: 'recording.edit', wide: true },
  },
  {
    path: '/channels/:channelId(\\d+)/outlines/:outlineId(\\d+)/prompter',
    name: 'prompter',
    component: () => import('@/views/PrompterView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId), outlineId: Number(route.params.outlineId) }),
    meta: { requiresAuth: true, access: 'rehearsal.run', wide: true },
  },
  {
    path: '/channels/:channelId(\\d+)/board',
    name: 'board',
    component: () => import('@/views/BoardView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, access: 'pipeline.read', wide: true },
  },
  {
    path: '/channels/:channelId(\\d+)/schedule',
    name: 'schedule',
    component: () => import('@/views/ScheduleView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, access: 'pipeline.read' },
  },
  {
    path: '/channels/:channelId(\\d+)/audit',
    name: 'audit',
    component: () => import('@/views/AuditView.vue'),
    props: (route) => ({ channelId: Number(route.params.channelId) }),
    meta: { requiresAuth: true, access: 'audit.read' },
  },
  // the pages mailed links open: the link's token is the access, so they are open to anyone
  { path: '/invitations/:token', name: 'invitation', component: () => import('@/views/InvitationView.vue'), props: true },
  { path: '/reset-password', name: 'reset-password', component: () => import('@/views/ResetRequestView.vue') },
  { path: '/reset-password/:token', name: 'reset-password-token', component: () => import('@/views/ResetPasswordView.vue'), props: true },
  { path: '/account/email/:token', name: 'account-email', component: () => import('@/views/EmailConfirmView.vue'), props: true },
  { path: '/account', name: 'account', component: () => import('@/views/AccountView.vue'), meta: { requiresAuth: true } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue') },
]

/** The one navigation guard: sign-in first, then the route's `access` action. */
async function sessionGuard(to: RouteLocationNormalized): Promise<true | RouteLocationRaw> {
  const session = useSessionStore()
  const signedIn = session.checkExpiry()

  if (to.name === 'sign-in') return signedIn ? safeRedirect(to.query.redirect) : true
  if (!to.meta.requiresAuth) return true
  if (!signedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }

  const action = to.meta.access
  if (!action) return true
  let memberships
  try {
    memberships = await session.loadMemberships()
  } catch {
    if (!session.isSignedIn) return { name: 'sign-in', query: { redirect: to.fullPath, reason: 'expired' } }
    return homeWith('access-unchecked')
  }
  const channelId = Number(to.params.channelId)
  const allowed = Number.isInteger(channelId)
    ? memberships.some((m) => m.channelId === channelId && roleCan(m.role, action))
    : memberships.some((m) => roleCan(m.role, action))
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
