import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { enableAutoUnmount, flushPromises } from '@vue/test-utils'
import App from '@/App.vue'
import { useSessionStore } from '@/stores/session'
import { jsonResponse, mockApi, mountAt, sessionFixture } from './support'

function field(wrapper: Awaited<ReturnType<typeof mountAt>>['wrapper'], label: string) {
  const id = wrapper.findAll('label').find((l) => l.text() === label)!.attributes('for')
  return wrapper.find(`#${id}`)
}

enableAutoUnmount(afterEach)

describe('SignInView', () => {
  beforeEach(() => {
    localStorage.clear()
  })
  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('should show a message under each empty field and not call the API', async () => {
    const fetchMock = mockApi({})
    const { wrapper } = await mountAt(App, '/sign-in')

    await wrapper.find('form').trigger('submit')

    expect(wrapper.text()).toContain('Enter your e-mail address')
    expect(wrapper.text()).toContain('Enter your password')
    expect(field(wrapper, 'E-mail').attributes('aria-invalid')).toBe('true')
    expect(fetchMock).not.toHaveBeenCalled()
  })

  it('should explain a malformed e-mail address and clear the message once it is fixed', async () => {
    mockApi({})
    const { wrapper } = await mountAt(App, '/sign-in')

    await field(wrapper, 'E-mail').setValue('ada-at-example')
    await field(wrapper, 'Password').setValue('pw')
    await wrapper.find('form').trigger('submit')
    expect(wrapper.text()).toContain('Enter a valid e-mail address')

    await field(wrapper, 'E-mail').setValue('ada@example.test')
    expect(wrapper.text()).not.toContain('Enter a valid e-mail address')
  })

  it('should sign in through the API and go back to the page that asked', async () => {
    const fetchMock = mockApi({
      'POST /api/auth/sign-in': jsonResponse(200, sessionFixture()),
      'GET /api/channels': jsonResponse(200, []),
    })
    const { wrapper, router } = await mountAt(App, '/sign-in?redirect=/no-such-page')

    await field(wrapper, 'E-mail').setValue('  ada@example.test ')
    await field(wrapper, 'Password').setValue('correct horse')
    await wrapper.find('form').trigger('submit')
    await flushPromises()

    const [url, init] = fetchMock.mock.calls[0]!
    expect(url).toBe('/api/auth/sign-in')
    expect(init?.method).toBe('POST')
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'ada@example.test', password: 'correct horse' })
    expect(useSessionStore().isSignedIn).toBe(true)
    // The target view is lazy-loaded, so the navigation ends a little after the API answer.
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/no-such-page'))
  })

  it('should say "E-mail or password is wrong" when the API refuses the credentials', async () => {
    mockApi({
      'POST /api/auth/sign-in': jsonResponse(401, { code: 'bad-credentials', message: 'E-mail or password is wrong' }),
    })
    const { wrapper, router } = await mountAt(App, '/sign-in')

    await field(wrapper, 'E-mail').setValue('ada@example.test')
    await field(wrapper, 'Password').setValue('nope')
    await wrapper.find('form').trigger('submit')
    await flushPromises()

    expect(wrapper.find('[role="alert"]').text()).toContain('E-mail or password is wrong')
    expect(router.currentRoute.value.name).toBe('sign-in')
  })

  it('should put the server\'s field messages under the fields for invalid input', async () => {
    mockApi({
      'POST /api/auth/sign-in': jsonResponse(400, {
        code: 'invalid-input',
        message: 'Invalid input',
        details: [{ path: ['email'], message: 'This address cannot receive mail' }],
      }),
    })
    const { wrapper } = await mountAt(App, '/sign-in')

    await field(wrapper, 'E-mail').setValue('ada@example.test')
    await field(wrapper, 'Password').setValue('pw')
    await wrapper.find('form').trigger('submit')
    await flushPromises()

    expect(wrapper.text()).toContain('This address cannot receive mail')
  })

  it('should ask to wait after too many attempts', async () => {
    mockApi({ 'POST /api/auth/sign-in': jsonResponse(429, { code: 'too-many-attempts', message: 'Slow down' }) })
    const { wrapper } = await mountAt(App, '/sign-in')

    await field(wrapper, 'E-mail').setValue('ada@example.test')
    await field(wrapper, 'Password').setValue('pw')
    await wrapper.find('form').trigger('submit')
    await flushPromises()

    expect(wrapper.text()).toContain('Too many attempts')
  })
})
