import { beforeEach, describe, expect, it } from 'vitest'
import { createMemoryHistory } from 'vue-router'
import type { RouteRecordRaw } from 'vue-router'
import { PERMISSIONS } from '@shared/permissions'
import type { Action } from '@shared/permissions'
import { roleSchema } from '@shared/schemas/auth'
import type { Membership, Role } from '@shared/schemas/auth'
import { createAppRouter, routes } from '@/router'
import { safeRedirect } from '@/router/safe-redirect'
import { api, apiPath, http, HttpResponse } from './msw'
import { freshPinia, membership, saveSession, sessionFixture } from './support'

const Blank = { render: () => null }
const roles = roleSchema.options
const actions = Object.keys(PERMISSIONS) as Action[]

// The guard only reads route records, so every screen is swapped for a blank one: navigations stay cheap.
const appRoutes: RouteRecordRaw[] = routes.map((route) => ({ ...route, component: Blank }) as RouteRecordRaw)

/** The app's routes plus one blank screen at `path` that asks for `action`. */
function routesWith(path: string, action: Action): RouteRecordRaw[] {
  return [{ path, name: 'stand-in', component: Blank, meta: { requiresAuth: true, access: action } }, ...appRoutes]
}

function answerMe(...memberships: Membership[]) {
  api.use(http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships })))
}

function allowedByTable(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role)
}

/** Where the guard sends a signed-in member with these memberships who asks for `path`. */
async function landing(path: string, routeList: RouteRecordRaw[], ...memberships: Membership[]) {
  saveSession()
  answerMe(...memberships)
  const router = createAppRouter(createMemoryHistory(), routeList)
  await router.push(path)
  return router.currentRoute.value
}

const channelRoutes = routes.filter((route) => route.meta?.requiresAuth && route.path.includes(':channelId'))
const routesWithAccess = routes.flatMap((route) => {
  const action = route.meta?.access
  return action ? [{ name: String(route.name), path: route.path, action }] : []
})

/** A real address for a route: every param (channel, puzzle, outline) is 12. */
function addressOf(path: string): string {
  return path.replace(/:(\w+)(\([^)]*\))?/g, '12')
}

describe('router guard', () => {
  beforeEach(() => {
    localStorage.clear()
    freshPinia()
  })

  it('should redirect an anonymous user to sign-in with the requested path as redirect', async () => {
    const router = createAppRouter(createMemoryHistory(), appRoutes)

    await router.push('/channels/12?tab=people')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.redirect).toBe('/channels/12?tab=people')
  })

  it('should let anyone see the not-found page', async () => {
    const router = createAppRouter(createMemoryHistory(), appRoutes)

    await router.push('/no/such/page')

    expect(router.currentRoute.value.name).toBe('not-found')
  })

  it('should let a signed-in member into their channel', async () => {
    const to = await landing('/channels/12', appRoutes, membership(12, 'viewer'))

    expect(to.name).toBe('library')
    expect(to.path).toBe('/channels/12')
  })

  it('should keep a signed-in user out of a channel they are not in', async () => {
    const to = await landing('/channels/13', appRoutes, membership(12, 'owner'))

    expect(to.name).toBe('home')
    expect(to.query.notice).toBe('forbidden')
  })

  it.each(channelRoutes.map((route) => [String(route.name), route.meta?.access]))(
    'should name an action of the permission table on the channel route %s',
    (_name, action) => {
      expect(Object.keys(PERMISSIONS)).toContain(action)
    },
  )

  it.for(routesWithAccess.flatMap((route) => roles.map((role) => ({ ...route, role, allowed: allowedByTable(role, route.action) }))))(
    'should open $name ($action) for role $role exactly when the permission table allows it',
    async ({ name, path, role, allowed }) => {
      const to = await landing(addressOf(path), appRoutes, membership(12, role))

      expect(to.name).toBe(allowed ? name : 'home')
      if (!allowed) expect(to.query.notice).toBe('forbidden')
    },
  )

  it.for(actions.flatMap((action) => roles.map((role) => ({ action, role, allowed: allowedByTable(role, action) }))))(
    'should open a channel screen asking for $action for role $role exactly when the permission table allows it',
    async ({ action, role, allowed }) => {
      const to = await landing('/channels/12/stand-in', routesWith('/channels/:channelId(\\d+)/stand-in', action), membership(12, role))

      expect(to.name).toBe(allowed ? 'stand-in' : 'home')
      if (!allowed) expect(to.query.notice).toBe('forbidden')
    },
  )

  it('should let a member into a screen outside any channel when one of their channels allows its action', async () => {
    const standIn = routesWith('/publishing', 'episode.publish')

    expect((await landing('/publishing', standIn, membership(12, 'viewer'), membership(13, 'editor'))).name).toBe('stand-in')
    freshPinia()
    const refused = await landing('/publishing', standIn, membership(12, 'viewer'), membership(13, 'presenter'))
    expect(refused.name).toBe('home')
    expect(refused.query.notice).toBe('forbidden')
  })

  it('should send a user whose token is refused back to sign-in', async () => {
    saveSession()
    api.use(http.get(apiPath('/auth/me'), () => HttpResponse.json({ code: 'unauthorized', message: 'Sign in' }, { status: 401 })))
    const router = createAppRouter(createMemoryHistory(), appRoutes)

    await router.push('/channels/12')

    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query).toMatchObject({ redirect: '/channels/12', reason: 'expired' })
  })

  it('should go home with a notice when access cannot be checked', async () => {
    saveSession()
    api.use(http.get(apiPath('/auth/me'), () => HttpResponse.json({ code: 'internal', message: 'Oops' }, { status: 500 })))
    const router = createAppRouter(createMemoryHistory(), appRoutes)

    await router.push('/channels/12')

    expect(router.currentRoute.value.name).toBe('home')
    expect(router.currentRoute.value.query.notice).toBe('access-unchecked')
  })

  it('should send a signed-in user away from sign-in to the redirect target', async () => {
    saveSession()
    const router = createAppRouter(createMemoryHistory(), appRoutes)

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
