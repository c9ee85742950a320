/** Asking for a password reset: the page never tells whether an address has an account. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { RESET_REQUESTED_MESSAGE } from '@shared/schemas/team'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'

describe('ResetRequestView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
  })

  // Answering alike for known and unknown addresses is the usual defence against account enumeration
  // (OWASP Authentication Cheat Sheet, "Authentication and Error Messages"; from memory).
  it.each(['ada@example.test', 'nobody-here@example.test'])('should show the one confirmation sentence for %s', async (email) => {
    const sent: unknown[] = []
    api.use(
      http.post(apiPath('/auth/password-reset'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json({ message: RESET_REQUESTED_MESSAGE }, { status: 202 })
      }),
    )
    await renderAt(App, '/reset-password')
    const user = userEvent.setup()

    await user.type(screen.getByLabelText('E-mail'), email)
    await user.click(screen.getByRole('button', { name: 'Send the link' }))

    expect(await screen.findByRole('status')).toHaveTextContent(RESET_REQUESTED_MESSAGE)
    expect(sent).toEqual([{ email }])
  })

  it('should be reachable from the sign-in page', async () => {
    const { router } = await renderAt(App, '/sign-in')
    await userEvent.setup().click(screen.getByRole('link', { name: 'Forgot your password?' }))
    expect(await screen.findByRole('heading', { level: 1, name: 'Forgot your password?' })).toBeInTheDocument()
    expect(router.currentRoute.value.path).toBe('/reset-password')
  })
})
