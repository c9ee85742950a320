/**
 * The schedule: planned days on a month calendar (December 2026 begins on a Tuesday: GNU date(1)), clashes and
 * gaps against a cadence of one episode every 3 days (common practice), the next free slot, and the cadence
 * form for owners only (channel.manage).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen, waitFor, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Role } from '@shared/schemas/auth'
import type { Board, BoardTake } from '@shared/schemas/pipeline'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const take = (outlineId: number, puzzleTitle: string, plannedOn: string | null): BoardTake => ({
  outlineId,
  name: 'First take',
  puzzleId: outlineId,
  puzzleTitle,
  stage: 'scripted',
  plannedOn,
  assignee: null,
  hasRecording: false,
})
// the 1st and 2nd are a day apart (a clash at every 3 days); after the 2nd, nothing until the 10th (a gap from the 5th)
const board: Board = {
  cadenceDays: 3,
  people: [],
  takes: [take(1, 'Morning climb', '2026-12-01'), take(2, 'Tall ladder', '2026-12-02'), take(3, 'Quiet bulb', '2026-12-10'), take(4, 'Loose ends', null)],
}

function answerAs(role: Role) {
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, role)] })),
    http.get(apiPath('/channels/1/board'), () => HttpResponse.json(board)),
  )
}

/** The calendar's cell for a day, found by the date it reads out. */
const dayCell = (label: string) => screen.getAllByRole('cell').find((cell) => within(cell).queryByText(label, { exact: true }))!

describe('ScheduleView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
    vi.useFakeTimers({ now: new Date('2026-12-02T09:00:00Z'), toFake: ['Date'] })
  })
  afterEach(() => vi.useRealTimers())

  it('should put each planned take on its day of the month and mark the clash and the gap', async () => {
    answerAs('presenter')
    await renderAt(App, '/channels/1/schedule')
    expect(await screen.findByRole('heading', { name: 'December 2026' })).toBeInTheDocument()
    // Monday first: the grid opens on Monday 30 November
    expect(screen.getAllByRole('cell')[0]).toHaveTextContent('Mon 30 Nov 2026')

    expect(within(dayCell('Tue 1 Dec 2026')).getByRole('link', { name: /Morning climb/ })).toBeInTheDocument()
    expect(dayCell('Tue 1 Dec 2026')).toHaveTextContent('Clash')
    expect(dayCell('Wed 2 Dec 2026')).toHaveTextContent('Clash')
    expect(within(dayCell('Thu 10 Dec 2026')).getByRole('link', { name: /Quiet bulb/ })).toBeInTheDocument()
    // due by the cadence on the 5th, then every day up to the 9th
    for (const day of ['Sat 5 Dec 2026', 'Wed 9 Dec 2026']) expect(dayCell(day)).toHaveTextContent(/Gap: an episode was due/)
    expect(dayCell('Fri 4 Dec 2026')).not.toHaveTextContent(/Gap|Clash/)
    expect(dayCell('Thu 10 Dec 2026')).not.toHaveTextContent(/Gap|Clash/)
    expect(screen.getByRole('status')).toHaveTextContent('1 clash, 5 days of gaps')

    expect(screen.getByTestId('next-free-slot')).toHaveTextContent('Sat 5 Dec 2026')
    expect(screen.getByRole('region', { name: 'Not planned yet' })).toHaveTextContent('Loose ends')
    // a presenter reads the cadence; only owners change it
    expect(screen.getByText('One episode every 3 days.')).toBeInTheDocument()
    expect(screen.queryByRole('spinbutton')).not.toBeInTheDocument()
  })

  it('should let an owner change the cadence, and show the marks it gives', async () => {
    answerAs('owner')
    const sent: unknown[] = []
    api.use(
      http.put(apiPath('/channels/1/cadence'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json({ cadenceDays: 1 })
      }),
    )
    await renderAt(App, '/channels/1/schedule')
    const user = userEvent.setup()
    const cadence = await screen.findByRole<HTMLInputElement>('spinbutton', { name: 'One episode every' })
    expect(cadence).toHaveValue('3 days')
    await user.type(cadence, '1', { initialSelectionStart: 0, initialSelectionEnd: cadence.value.length })
    await user.click(screen.getByRole('button', { name: 'Save cadence' }))
    await waitFor(() => expect(sent).toEqual([{ cadenceDays: 1 }]))
    // every day: the 1st and 2nd keep it, the 3rd to the 9th were due
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent('No clashes, 7 days of gaps'))
    expect(dayCell('Tue 1 Dec 2026')).not.toHaveTextContent('Clash')
  })

  it('should move to the next month', async () => {
    answerAs('editor')
    await renderAt(App, '/channels/1/schedule')
    await userEvent.setup().click(await screen.findByRole('button', { name: 'Next month' }))
    expect(screen.getByRole('heading', { name: 'January 2027' })).toBeInTheDocument()
  })
})
