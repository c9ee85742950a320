/** The audit log for owners: a table of who did what and when, filtered by kind and person through the API's query. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen, waitFor, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { AuditEvent } from '@shared/schemas/pipeline'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const events: AuditEvent[] = [
  { id: 3, kind: 'stage-moved', actor: null, subject: '"Morning climb" (First take)', details: { outlineId: 4, from: 'recorded', to: 'aligned', automatic: 'alignment' }, at: '2026-12-02T10:00:00.000Z' },
  { id: 2, kind: 'take-planned', actor: { userId: 2, name: 'Rosa Ilves' }, subject: '"Morning climb" (First take)', details: { outlineId: 4, plannedOn: '2026-12-04' }, at: '2026-12-02T09:30:00.000Z' },
  { id: 1, kind: 'stage-moved', actor: { userId: 3, name: 'Dmitri Oyelaran' }, subject: '"Tall ladder" (First take)', details: { outlineId: 5, from: 'planned', to: 'scripted' }, at: '2026-12-01T09:00:00.000Z' },
]
const members = [
  { userId: 2, name: 'Rosa Ilves', email: 'rosa@lantern.example', role: 'owner' },
  { userId: 3, name: 'Dmitri Oyelaran', email: 'dmitri@lantern.example', role: 'presenter' },
]

describe('AuditView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it('should list the rows in words and ask the server again for a person filter', async () => {
    const asked: string[] = []
    api.use(
      http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, 'owner')] })),
      http.get(apiPath('/channels/1/members'), () => HttpResponse.json(members)),
      http.get(apiPath('/channels/1/audit'), ({ request }) => {
        const actorId = new URL(request.url).searchParams.get('actorId')
        asked.push(actorId ?? 'everyone')
        return HttpResponse.json(actorId ? events.filter((e) => e.actor?.userId === Number(actorId)) : events)
      }),
    )
    await renderAt(App, '/channels/1/audit')
    const table = await screen.findByRole('table')
    await waitFor(() => expect(within(table).getAllByRole('row')).toHaveLength(4))
    const [, first, second] = within(table).getAllByRole('row')
    expect(first).toHaveTextContent('Gridcue')
    expect(first).toHaveTextContent('Recorded → Aligned (by the alignment)')
    expect(second).toHaveTextContent('Rosa Ilves')
    expect(second).toHaveTextContent('day: 2026-12-04')

    const user = userEvent.setup()
    await user.click(screen.getByRole('combobox', { name: 'Person' }))
    await user.click(await screen.findByRole('option', { name: 'Dmitri Oyelaran' }))
    await waitFor(() => expect(within(table).getAllByRole('row')).toHaveLength(2))
    expect(within(table).getAllByRole('row')[1]).toHaveTextContent('Planned → Scripted')
    expect(asked).toEqual(['everyone', '3'])
  })

  it('should keep a presenter out (audit.read is for owners)', async () => {
    api.use(
      http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, 'presenter')] })),
      // the home page it is sent to lists the channels
      http.get(apiPath('/channels'), () => HttpResponse.json([])),
    )
    const { router } = await renderAt(App, '/channels/1/audit')
    expect(router.currentRoute.value.name).toBe('home')
    expect(router.currentRoute.value.query.notice).toBe('forbidden')
  })
})
