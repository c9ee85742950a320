import { beforeEach, describe, expect, it, vi } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import App from '@/App.vue'
import { useSessionStore } from '@/stores/session'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { sessionFixture } from './support'

/** Answers every sign-in with `status` and `body`, keeping what was sent. */
function answerSignIn(status: number, body: Record<string, unknown>) {
  const sent: unknown[] = []
  api.use(
    http.post(apiPath('/auth/sign-in'), async ({ request }) => {
      sent.push(await request.json())
      return HttpResponse.json(body, { status })
    }),
  )
  return sent
}

async function signInWith(email: string, password: string) {
  const user = userEvent.setup()
  if (email) await user.type(screen.getByLabelText('E-mail'), email)
  if (password) await user.type(screen.getByLabelText('Password'), password)
  await user.click(screen.getByRole('button', { name: 'Sign in' }))
}

describe('SignInView', () => {
  beforeEach(() => {
    localStorage.clear()
  })

  it('should show a message under each empty field and not call the API', async () => {
    const sent = answerSignIn(200, sessionFixture())
    await renderAt(App, '/sign-in')

    await signInWith('', '')

    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription('Enter your e-mail address')
    expect(screen.getByLabelText('E-mail')).toBeInvalid()
    expect(screen.getByLabelText('Password')).toHaveAccessibleDescription('Enter your password')
    expect(sent).toEqual([])
  })

  it('should explain a malformed e-mail address and clear the message once it is fixed', async () => {
    await renderAt(App, '/sign-in')

    await signInWith('ada-at-example', 'pw')
    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription('Enter a valid e-mail address')

    const email = screen.getByLabelText('E-mail')
    await userEvent.clear(email)
    await userEvent.type(email, 'ada@example.test')
    expect(email).not.toHaveAccessibleDescription()
    expect(screen.queryByText('Enter a valid e-mail address')).not.toBeInTheDocument()
  })

  it('should sign in through the API and go back to the page that asked', async () => {
    const sent = answerSignIn(200, sessionFixture())
    const { router } = await renderAt(App, '/sign-in?redirect=/no-such-page')

    await signInWith('  ada@example.test ', 'correct horse')

    // The target view is lazy-loaded, so the navigation ends a little after the API answer.
    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeInTheDocument()
    expect(router.currentRoute.value.fullPath).toBe('/no-such-page')
    expect(sent).toEqual([{ email: 'ada@example.test', password: 'correct horse' }])
    expect(useSessionStore().isSignedIn).toBe(true)
  })

  it('should load a members-only episode page in full after signing in: it is the server\'s page, not a route of the app', async () => {
    answerSignIn(200, sessionFixture())
    const assign = vi.spyOn(window.location, 'assign').mockImplementation(() => {})
    try {
      const { router } = await renderAt(App, '/sign-in?redirect=/episodes/marigold-logic/four-fevers%3Ft%3D90')
      await signInWith('ada@example.test', 'correct horse')
      await vi.waitFor(() => expect(assign).toHaveBeenCalledWith('/episodes/marigold-logic/four-fevers?t=90'))
      expect(router.currentRoute.value.path).toBe('/sign-in')
      expect(useSessionStore().isSignedIn).toBe(true)
    } finally {
      assign.mockRestore()
    }
  })

  it('should say "E-mail or password is wrong" when the API refuses the credentials', async () => {
    answerSignIn(401, { code: 'bad-credentials', message: 'E-mail or password is wrong' })
    const { router } = await renderAt(App, '/sign-in')

    await signInWith('ada@example.test', 'nope')

    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong')
    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(useSessionStore().isSignedIn).toBe(false)
  })

  it("should put the server's field messages under the fields for invalid input", async () => {
    answerSignIn(400, {
      code: 'invalid-input',
      message: 'Invalid input',
      details: [{ path: ['email'], message: 'This address cannot receive mail' }],
    })
    await renderAt(App, '/sign-in')

    await signInWith('ada@example.test', 'pw')

    await screen.findByText('Check the highlighted fields.')
    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription('This address cannot receive mail')
    expect(screen.getByLabelText('Password')).not.toHaveAccessibleDescription()
  })

  it('should ask to wait after too many attempts', async () => {
    answerSignIn(429, { code: 'too-many-attempts', message: 'Slow down' })
    await renderAt(App, '/sign-in')

    await signInWith('ada@example.test', 'pw')

    expect(await screen.findByText('Too many attempts', { exact: false })).toBeInTheDocument()
  })
  it('should show the password on request and hide it again', async () => {
    await renderAt(App, '/sign-in')
    const password = screen.getByLabelText('Password')
    await userEvent.type(password, 'correct horse')
    expect(password).toHaveAttribute('type', 'password')

    await userEvent.click(screen.getByRole('button', { name: 'Show password', pressed: false }))
    expect(password).toHaveAttribute('type', 'text')
    expect(password).toHaveValue('correct horse')

    await userEvent.click(screen.getByRole('button', { name: 'Show password', pressed: true }))
    expect(password).toHaveAttribute('type', 'password')
  })
})
