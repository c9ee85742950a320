/** The members page: owners invite, see who is still to join, change roles and remove people; anyone may leave, except the last owner. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { ChannelMember, ChannelSummary } from '@shared/schemas/channel'
import type { PendingInvitation } from '@shared/schemas/team'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

// an invented channel and team
const channel: ChannelSummary = { id: 3, name: 'Lantern Logic', slug: 'lantern-logic', description: '', role: 'owner', memberCount: 2 }
const members: ChannelMember[] = [
  { userId: 7, name: 'Ada Lane', email: 'ada@example.test', role: 'owner' },
  { userId: 9, name: 'Timo Rask', email: 'timo@example.test', role: 'editor' },
]

function serveChannel(invitations: PendingInvitation[] = []) {
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(3, 'owner')] })),
    http.get(apiPath('/channels/3'), () => HttpResponse.json(channel)),
    http.get(apiPath('/channels/3/members'), () => HttpResponse.json(members)),
    http.get(apiPath('/channels/3/invitations'), () => HttpResponse.json(invitations)),
  )
}

describe('ChannelView (members page)', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it('should send the address and chosen role from the invite dialog and then list the invitation as pending', async () => {
    const invitations: PendingInvitation[] = []
    serveChannel(invitations)
    const sent: unknown[] = []
    api.use(
      http.post(apiPath('/channels/3/invitations'), async ({ request }) => {
        const body = (await request.json()) as { email: string; role: PendingInvitation['role'] }
        sent.push(body)
        const created = { id: 41, email: body.email, role: body.role, invitedBy: 'Ada Lane', expiresAt: '2026-12-09T12:00:00.000Z', expired: false }
        invitations.push(created)
        return HttpResponse.json(created, { status: 201 })
      }),
    )
    await renderAt(App, '/channels/3/members')
    const user = userEvent.setup()

    await user.click(await screen.findByRole('button', { name: 'Invite someone' }))
    const dialog = await screen.findByRole('dialog', { name: 'Invite someone' })
    await user.type(within(dialog).getByLabelText('E-mail address'), ' noor@example.test ')
    await user.click(within(dialog).getByRole('combobox', { name: 'Role' }))
    await user.click(await screen.findByRole('option', { name: /^Presenter/ }))
    await user.click(within(dialog).getByRole('button', { name: 'Send invitation' }))

    // the body is the contract of POST /channels/:id/invitations (shared/schemas/team.ts invitationInputSchema)
    const pending = await screen.findByRole('list', { name: 'Pending invitations' })
    expect(sent).toEqual([{ email: 'noor@example.test', role: 'presenter' }])
    expect(within(pending).getByText('noor@example.test')).toBeInTheDocument()
    expect(within(pending).getByText('Presenter')).toBeInTheDocument()
    expect(screen.queryByRole('dialog', { name: 'Invite someone' })).not.toBeInTheDocument()
  })

  it('should refuse to send an address that is not one, without asking the server', async () => {
    serveChannel()
    await renderAt(App, '/channels/3/members')
    const user = userEvent.setup()

    await user.click(await screen.findByRole('button', { name: 'Invite someone' }))
    const dialog = await screen.findByRole('dialog', { name: 'Invite someone' })
    await user.type(within(dialog).getByLabelText('E-mail address'), 'noor-at-example')
    await user.click(within(dialog).getByRole('button', { name: 'Send invitation' }))

    // an unhandled POST would fail the test (msw.ts): none is declared here
    expect(within(dialog).getByLabelText('E-mail address')).toHaveAccessibleDescription('Enter a valid e-mail address')
  })

  it("should show the server's sentence when the last owner tries to leave", async () => {
    serveChannel()
    // the server's wording for its 409 (server/services/channels.ts, lastOwner)
    const sentence = "A channel needs at least one owner, so the last one can't leave. Make someone else an owner first."
    api.use(http.delete(apiPath('/channels/3/membership'), () => HttpResponse.json({ code: 'last-owner', message: sentence }, { status: 409 })))
    const { router } = await renderAt(App, '/channels/3/members')
    const user = userEvent.setup()

    await user.click(await screen.findByRole('button', { name: 'Leave channel' }))
    const dialog = await screen.findByRole('dialog', { name: 'Are you sure?' })
    await user.click(within(dialog).getByRole('button', { name: 'Leave channel' }))

    expect(await within(dialog).findByText(sentence)).toBeInTheDocument()
    expect(router.currentRoute.value.path).toBe('/channels/3/members')
  })

  it("should show the server's sentence when a role change would leave no owner, and keep the role shown", async () => {
    serveChannel()
    const sentence = "A channel needs at least one owner, so the last one can't be made something else. Make someone else an owner first."
    api.use(http.patch(apiPath('/channels/3/members/7'), () => HttpResponse.json({ code: 'last-owner', message: sentence }, { status: 409 })))
    await renderAt(App, '/channels/3/members')
    const user = userEvent.setup()

    await user.click(await screen.findByRole('combobox', { name: 'Role of Ada Lane' }))
    await user.click(await screen.findByRole('option', { name: /^Viewer/ }))

    expect(await screen.findByText(sentence)).toBeInTheDocument()
    expect(screen.getByRole('combobox', { name: 'Role of Ada Lane' })).toHaveTextContent(/^Owner/)
  })
})
