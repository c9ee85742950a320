/** The account page and the mailed password link: a server's fresh token is kept as a sign-in's would be. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import App from '@/App.vue'
import { SESSION_STORAGE_KEY, useSessionStore } from '@/stores/session'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { saveSession, sessionFixture } from './support'

const fresh = sessionFixture({ token: 'token-after-change' })
const account = { ...sessionFixture().user, pendingEmail: null }
// the account page also holds the person's notification choices: none saved
const noChoices = http.get(apiPath('/notification-choices'), () => HttpResponse.json([]))

describe('account pages', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
  })

  it('should keep the fresh token a password change answers with, so this browser stays signed in', async () => {
    saveSession()
    const sent: unknown[] = []
    api.use(
      http.get(apiPath('/account'), () => HttpResponse.json(account)),
      noChoices,
      http.put(apiPath('/account/password'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(fresh)
      }),
    )
    await renderAt(App, '/account')
    const user = userEvent.setup()

    await user.type(await screen.findByLabelText('Current password'), 'old words here')
    await user.type(screen.getByLabelText('New password'), 'violet kettle under marble')
    await user.click(screen.getByRole('button', { name: 'Change password' }))

    await screen.findByText(/Your password is changed/)
    expect(sent).toEqual([{ currentPassword: 'old words here', newPassword: 'violet kettle under marble' }])
    expect(useSessionStore().token).toBe('token-after-change')
    expect(JSON.parse(localStorage.getItem(SESSION_STORAGE_KEY)!).token).toBe('token-after-change')
  })

  it("should show the server's refusal of a weak password under the form and keep the old session", async () => {
    saveSession()
    // the server's wording for a weak password (server/auth/password-strength.ts)
    const sentence = 'This password would be guessed too easily: it is close to common passwords, keyboard patterns, dates or your own name or address. A few unrelated words together make a strong one.'
    api.use(
      http.get(apiPath('/account'), () => HttpResponse.json(account)),
      noChoices,
      http.put(apiPath('/account/password'), () => HttpResponse.json({ code: 'weak-password', message: sentence }, { status: 400 })),
    )
    await renderAt(App, '/account')
    const user = userEvent.setup()

    await user.type(await screen.findByLabelText('Current password'), 'old words here')
    await user.type(screen.getByLabelText('New password'), 'password123')
    await user.click(screen.getByRole('button', { name: 'Change password' }))

    expect(await screen.findByText(sentence)).toBeInTheDocument()
    expect(useSessionStore().token).toBe('token-abc')
  })

  it('should set a new password from a reset link and sign this browser in', async () => {
    const sent: unknown[] = []
    api.use(
      http.get(apiPath('/auth/password-reset/r3set'), () => HttpResponse.json({ email: 'ada@example.test' })),
      http.post(apiPath('/auth/password-reset/r3set'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(fresh)
      }),
      http.get(apiPath('/channels'), () => HttpResponse.json([])),
    )
    const { router } = await renderAt(App, '/reset-password/r3set')
    const user = userEvent.setup()

    expect(await screen.findByText(/For ada@example.test/)).toBeInTheDocument()
    await user.type(screen.getByLabelText('New password'), 'violet kettle under marble')
    await user.click(screen.getByRole('button', { name: 'Save the new password' }))

    await screen.findByRole('heading', { level: 1, name: 'Your channels' })
    expect(router.currentRoute.value.path).toBe('/')
    expect(sent).toEqual([{ password: 'violet kettle under marble' }])
    expect(useSessionStore().token).toBe('token-after-change')
  })

  it("should say an expired reset link has run out, in the server's words", async () => {
    const sentence = 'This link to choose a new password has expired (links work for an hour). Ask for a new one.'
    api.use(http.get(apiPath('/auth/password-reset/old1'), () => HttpResponse.json({ code: 'reset-expired', message: sentence }, { status: 410 })))
    await renderAt(App, '/reset-password/old1')

    expect(await screen.findByText(sentence)).toBeInTheDocument()
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toBeInTheDocument()
  })
})
