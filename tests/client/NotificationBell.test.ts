/** The header's bell (unread count, the list, marking read) and the account page's notification choices. */
import { beforeEach, describe, expect, it } from 'vitest'
import { screen, waitFor, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { NotificationChoice, NotificationList } from '@shared/schemas/pipeline'
import NotificationBell from '@/components/NotificationBell.vue'
import NotificationChoices from '@/components/NotificationChoices.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { saveSession } from './support'

const list: NotificationList = {
  unread: 2,
  items: [
    { id: 9, kind: 'recording-uploaded', channelId: 1, text: 'Rosa Ilves uploaded a recording of "Morning climb" (First take).', link: '/channels/1/outlines/4/align', at: '2026-12-02T09:00:00.000Z', read: false },
    { id: 8, kind: 'take-ready', channelId: 1, text: '"Tall ladder" (First take) is recorded and ready for editing.', link: '/channels/1/outlines/5', at: '2026-12-01T09:00:00.000Z', read: false },
    { id: 7, kind: 'episode-published', channelId: 1, text: 'Dmitri Oyelaran published "Quiet bulb" (First take).', link: '/channels/1/outlines/6', at: '2026-11-30T09:00:00.000Z', read: true },
  ],
}

describe('NotificationBell', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it('should say how many are unread, list them, and mark them read', async () => {
    const marked: unknown[] = []
    api.use(
      http.get(apiPath('/notifications'), () => HttpResponse.json(marked.length === 0 ? list : { unread: 0, items: list.items.map((n) => ({ ...n, read: true })) })),
      http.post(apiPath('/notifications/read'), async ({ request }) => {
        marked.push(await request.json())
        return new HttpResponse(null, { status: 204 })
      }),
    )
    await renderAt(NotificationBell, '/')
    const user = userEvent.setup()
    await user.click(await screen.findByRole('button', { name: 'Notifications, 2 unread' }))
    const panel = await screen.findByRole('region', { name: 'Notifications' })
    const links = within(panel).getAllByRole('link')
    expect(links.map((l) => l.getAttribute('href'))).toEqual(['/channels/1/outlines/4/align', '/channels/1/outlines/5', '/channels/1/outlines/6'])
    expect(links[0]).toHaveTextContent(/^Unread: Rosa Ilves uploaded/)
    expect(links[2]).not.toHaveTextContent('Unread')

    await user.click(within(panel).getByRole('button', { name: 'Mark all read' }))
    await waitFor(() => expect(marked).toEqual([{ all: true }]))
    expect(await screen.findByRole('button', { name: 'Notifications, none unread' })).toBeInTheDocument()
  })
})

describe('NotificationChoices', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })

  it('should show each kind both ways and save what the person turned off', async () => {
    const choices: NotificationChoice[] = [
      { kind: 'take-ready', inApp: true, email: true },
      { kind: 'recording-uploaded', inApp: true, email: true },
      { kind: 'episode-published', inApp: true, email: false },
      { kind: 'episode-scheduled', inApp: true, email: true },
    ]
    const saved: unknown[] = []
    api.use(
      http.get(apiPath('/notification-choices'), () => HttpResponse.json(choices)),
      http.put(apiPath('/notification-choices'), async ({ request }) => {
        const body = (await request.json()) as NotificationChoice[]
        saved.push(body)
        return HttpResponse.json(body)
      }),
    )
    await renderAt(NotificationChoices, '/')
    const user = userEvent.setup()
    expect(await screen.findByRole('checkbox', { name: 'An episode was published: by e-mail' })).not.toBeChecked()
    await user.click(screen.getByRole('checkbox', { name: 'A recording was uploaded: by e-mail' }))
    await user.click(screen.getByRole('button', { name: 'Save notification choices' }))
    await waitFor(() => expect(saved).toHaveLength(1))
    expect(saved[0]).toContainEqual({ kind: 'recording-uploaded', inApp: true, email: false })
    expect(await screen.findByRole('status')).toHaveTextContent('Saved.')
  })
})
