/**
 * The board: a card per take in its stage's column, moved by its keyboard-reachable menu (the menu offers only
 * the stages the role may move into, as shared/schemas/pipeline.ts's STAGE_MOVERS says), filtered by person and
 * stage, and planned with the next free slot a cadence of 3 days (common practice) gives.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest'
import { fireEvent, screen, waitFor, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import type { Role } from '@shared/schemas/auth'
import type { Board, BoardTake } from '@shared/schemas/pipeline'
import App from '@/App.vue'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt } from './render'
import { membership, saveSession, sessionFixture } from './support'

const take = (overrides: Partial<BoardTake>): BoardTake => ({
  outlineId: 1,
  name: 'First take',
  puzzleId: 7,
  puzzleTitle: 'Morning climb',
  stage: 'planned',
  plannedOn: null,
  assignee: null,
  hasRecording: false,
  ...overrides,
})
const board: Board = {
  cadenceDays: 3,
  people: [
    { userId: 2, name: 'Rosa Ilves' },
    { userId: 3, name: 'Dmitri Oyelaran' },
  ],
  takes: [
    take({ outlineId: 1, plannedOn: '2026-12-04', assignee: { userId: 2, name: 'Rosa Ilves' } }),
    take({ outlineId: 2, puzzleTitle: 'Tall ladder', stage: 'recorded', hasRecording: true, plannedOn: '2026-12-01', assignee: { userId: 3, name: 'Dmitri Oyelaran' } }),
  ],
}

function answerAs(role: Role) {
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, role)] })),
    http.get(apiPath('/channels/1/board'), () => HttpResponse.json(board)),
  )
}

// PrimeVue's menu listens on the item's content, inside the element with the menuitem role
const chooseFrom = (menu: HTMLElement, name: string) => fireEvent.click(within(within(menu).getByRole('menuitem', { name })).getByText(name))

/** Chooses an option of a PrimeVue select (it takes the choice on the option's mousedown, so a real pointer's events). */
async function pick(combobox: string, option: string, scope: HTMLElement = document.body) {
  const user = userEvent.setup()
  await user.click(within(scope).getByRole('combobox', { name: combobox }))
  await user.click(await screen.findByRole('option', { name: option }))
}

const column = (name: string) => screen.getByRole('region', { name: new RegExp(`^${name}`) })

describe('BoardView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
    vi.useRealTimers()
  })

  it('should show each take in its stage column with its planned day and person', async () => {
    answerAs('presenter')
    await renderAt(App, '/channels/1/board')
    const planned = await screen.findByRole('region', { name: /^Planned/ })
    const card = within(planned).getByRole('article', { name: 'Morning climb, First take' })
    expect(card).toHaveTextContent('Fri 4 Dec 2026')
    expect(card).toHaveTextContent('Rosa Ilves')
    expect(within(column('Recorded')).getByRole('article', { name: 'Tall ladder, First take' })).toBeInTheDocument()
  })

  it("should move a take by its menu, offering only the stages the presenter's role may move into", async () => {
    answerAs('presenter')
    const sent: unknown[] = []
    api.use(
      http.put(apiPath('/channels/1/outlines/1/stage'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(take({ ...board.takes[0]!, stage: 'rehearsed' }))
      }),
    )
    await renderAt(App, '/channels/1/board')
    await fireEvent.click(await screen.findByRole('button', { name: 'Move Morning climb, First take to another stage' }))
    const menu = await screen.findByRole('menu')
    // STAGE_MOVERS: presenters may not mark a take aligned or published
    expect(within(menu).getByRole('menuitem', { name: 'Aligned' })).toHaveAttribute('aria-disabled', 'true')
    expect(within(menu).getByRole('menuitem', { name: 'Published' })).toHaveAttribute('aria-disabled', 'true')
    await chooseFrom(menu, 'Rehearsed')

    await waitFor(() => expect(within(column('Rehearsed')).getByRole('article', { name: 'Morning climb, First take' })).toBeInTheDocument())
    expect(sent).toEqual([{ stage: 'rehearsed' }])
    expect(within(column('Planned')).queryByRole('article')).not.toBeInTheDocument()
  })

  it('should move a take dropped on another column', async () => {
    answerAs('editor')
    const sent: unknown[] = []
    api.use(
      http.put(apiPath('/channels/1/outlines/2/stage'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json({ ...board.takes[1]!, stage: 'aligned' })
      }),
    )
    await renderAt(App, '/channels/1/board')
    const card = await screen.findByRole('article', { name: 'Tall ladder, First take' })
    // jsdom has no DataTransfer: a stand-in that keeps what the drag puts in it
    const kept = new Map<string, string>()
    const dataTransfer = { setData: (type: string, value: string) => kept.set(type, value), getData: (type: string) => kept.get(type) ?? '', effectAllowed: 'none' }
    await fireEvent.dragStart(card, { dataTransfer })
    await fireEvent.dragOver(column('Aligned'), { dataTransfer })
    await fireEvent.drop(column('Aligned'), { dataTransfer })
    await waitFor(() => expect(within(column('Aligned')).getByRole('article', { name: 'Tall ladder, First take' })).toBeInTheDocument())
    expect(sent).toEqual([{ stage: 'aligned' }])
  })

  it("should show the server's sentence when a move is refused, and leave the card where it was", async () => {
    answerAs('owner')
    api.use(
      http.put(apiPath('/channels/1/outlines/1/stage'), () =>
        HttpResponse.json({ code: 'impossible-move', message: 'Upload a recording of this take before moving it to Recorded.' }, { status: 409 }),
      ),
    )
    await renderAt(App, '/channels/1/board')
    await fireEvent.click(await screen.findByRole('button', { name: 'Move Morning climb, First take to another stage' }))
    await chooseFrom(await screen.findByRole('menu'), 'Recorded')
    expect(await screen.findByRole('alert')).toHaveTextContent('Upload a recording of this take before moving it to Recorded.')
    expect(within(column('Planned')).getByRole('article', { name: 'Morning climb, First take' })).toBeInTheDocument()
  })

  it('should filter by person and by stage', async () => {
    answerAs('editor')
    await renderAt(App, '/channels/1/board')
    await screen.findByRole('region', { name: /^Planned/ })
    await pick('Person', 'Dmitri Oyelaran')
    expect(screen.getAllByRole('article').map((a) => a.getAttribute('aria-label'))).toEqual(['Tall ladder, First take'])

    await pick('Person', 'Everyone')
    await pick('Stage', 'Planned')
    expect(screen.getAllByRole('region').map((r) => r.getAttribute('aria-labelledby'))).toEqual(['stage-planned'])
    // an editor may not plan takes (pipeline.plan: owners and presenters)
    expect(screen.queryByRole('button', { name: /^Plan / })).not.toBeInTheDocument()
  })

  it('should plan a take on the next free slot with a person on it', async () => {
    vi.useFakeTimers({ now: new Date('2026-12-02T09:00:00Z'), toFake: ['Date'] })
    answerAs('owner')
    const sent: unknown[] = []
    api.use(
      http.put(apiPath('/channels/1/outlines/1/plan'), async ({ request }) => {
        sent.push(await request.json())
        return HttpResponse.json(take({ ...board.takes[0]!, plannedOn: '2026-12-04', assignee: { userId: 3, name: 'Dmitri Oyelaran' } }))
      }),
    )
    await renderAt(App, '/channels/1/board')
    await fireEvent.click(await screen.findByRole('button', { name: 'Plan Morning climb, First take' }))
    const dialog = await screen.findByRole('dialog')
    // the other take is planned on 1 December: with one every 3 days, the 4th is the first day that keeps the cadence
    await fireEvent.click(within(dialog).getByRole('button', { name: 'Next free slot: Fri 4 Dec 2026' }))
    expect(within(dialog).getByLabelText('Planned publish day')).toHaveValue('2026-12-04')
    await pick('Who is on it', 'Dmitri Oyelaran', dialog)
    await fireEvent.click(within(dialog).getByRole('button', { name: 'Save plan' }))
    await waitFor(() => expect(sent).toEqual([{ plannedOn: '2026-12-04', assigneeId: 3 }]))
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument())
    expect(within(column('Planned')).getByRole('article', { name: 'Morning climb, First take' })).toHaveTextContent('Dmitri Oyelaran')
  })
})
