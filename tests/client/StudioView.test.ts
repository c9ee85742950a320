import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { TECHNIQUES } from '@shared/engine'
import type { Outline } from '@shared/script'
import type { OutlineRecord } from '@shared/schemas/studio'
import App from '@/App.vue'
import { localCopyKey, unownedCopyKey } from '@/composables/useAutosave'
import { STUDIO_PREFS_KEY } from '@/stores/studio'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt, settle } from './render'
import { membership, saveSession, sessionFixture } from './support'

const PATH = '/channels/12/outlines/31'

/** Signs in as a member of channel 12 with `role`, and serves each record at its own outline address. */
function serve(role: 'presenter' | 'viewer', ...records: OutlineRecord[]) {
  saveSession()
  api.use(
    http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, role)] })),
    ...records.map((record) => http.get(apiPath(`/channels/12/outlines/${record.id}`), () => HttpResponse.json(record))),
  )
}

async function openStudio(path: string) {
  const rendered = await renderAt(App, path)
  await screen.findByRole('region', { name: 'Replay' })
  return rendered
}

const replay = () => screen.getByRole('region', { name: 'Replay' })
const ribbon = () => screen.getByRole('group', { name: 'Lines on the timeline' })
const saveStatus = () => screen.getByRole('status')
/** The script line marked current, named by its text field ("Line 4 (Step 3)"). */
const currentScriptLine = () => within(screen.getByRole('article', { current: 'step' })).getByRole('textbox')
const scriptLine = (number: number) => screen.getByRole('textbox', { name: new RegExp(`^Line ${number} \\(`) })
const lineNumber = (doc: Outline, lineId: number) => doc.lines.findIndex((l) => l.id === lineId) + 1
const ribbonBlock = (doc: Outline, lineId: number) => within(ribbon()).getByRole('button', { name: new RegExp(`^Line ${lineNumber(doc, lineId)},`) })
/** The panel a tab controls (a hidden panel has no accessible name to find it by). */
const panelOf = (tab: HTMLElement) => document.getElementById(tab.getAttribute('aria-controls')!)
const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

describe('StudioView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    vi.useFakeTimers({ shouldAdvanceTime: true })
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('should replay the step in the URL with its kind of step in plain words, then the trade term', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    const { router } = await openStudio(`${PATH}?step=5`)
    expect(router.currentRoute.value.name).toBe('studio')

    const step = TECHNIQUES[doc.steps[4].technique]
    expect(replay()).toHaveTextContent(`Step 5 of ${doc.steps.length}`)
    expect(replay()).toHaveTextContent(`${step.plainName} (${step.tradeTerm})`)
    expect(within(replay()).getByRole('grid', { name: 'Grid after step 5' })).toBeInTheDocument()
    // The line that says step 5 is the current one in the script, and on the ribbon.
    const line = doc.lines.find((l) => l.steps.includes(4))!
    expect(currentScriptLine()).toBe(scriptLine(lineNumber(doc, line.id)))
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(ribbonBlock(doc, line.id))
    expect(saveStatus()).toHaveTextContent(/^Saved$/)
    expect(document.title).toContain(`Studio · ${doc.title}`)
  })

  it('should open the other outline when the address moves from one studio to another', async () => {
    const first = outlineFor('PE01')
    const second = outlineFor('PE02')
    serve('presenter', recordFor(first), recordFor(second, { id: 32, name: 'Second take' }))
    const { router } = await openStudio(PATH)
    expect(scriptLine(1)).toHaveValue(first.lines[0].text)
    expect(second.lines[0].text).not.toBe(first.lines[0].text)

    await router.push('/channels/12/outlines/32')
    expect(await screen.findByText('Second take', { exact: false })).toBeInTheDocument()
    expect(scriptLine(1)).toHaveValue(second.lines[0].text)
  })

  it('should step with the keyboard, keep the step in the address and announce it once it settles', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    const { router } = await openStudio(PATH)
    expect(replay()).toHaveTextContent('The givens, before any step')
    // From here on the clock moves only when the test moves it, so "not yet announced" can't race real time.
    vi.useFakeTimers()

    await user().keyboard('{ArrowRight}{ArrowRight}')
    expect(replay()).toHaveTextContent(`Step 2 of ${doc.steps.length}`)
    expect(within(replay()).getByRole('grid', { name: 'Grid after step 2' })).toBeInTheDocument()
    const second = TECHNIQUES[doc.steps[1].technique]
    const spoken = `Step 2: ${second.plainName}. ${doc.steps[1].text}`
    expect(screen.queryByText(spoken)).not.toBeInTheDocument()

    await vi.advanceTimersByTimeAsync(499)
    expect(screen.queryByText(spoken)).not.toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(1)
    expect(screen.getByText(spoken)).toBeInTheDocument()
    expect(router.currentRoute.value.query.step).toBe('2')
  })

  it('should jump to a line’s first step when its ribbon block is clicked', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    const target = doc.lines.find((l) => l.kind === 'step' && l.steps[0] > 10)!

    await user().click(ribbonBlock(doc, target.id))
    expect(replay()).toHaveTextContent(`Step ${target.steps[0] + 1} of ${doc.steps.length}`)
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(ribbonBlock(doc, target.id))
    expect(currentScriptLine()).toBe(scriptLine(lineNumber(doc, target.id)))
  })

  it('should keep the closing line current after a jump to it, though it shares the last step with the line before', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    const closing = doc.lines[doc.lines.length - 1]
    const lastStepLine = doc.lines.find((l) => l.steps.includes(doc.steps.length - 1))!
    expect(closing.kind).toBe('outro')

    await user().keyboard('{End}')
    expect(replay()).toHaveTextContent(`Step ${doc.steps.length} of ${doc.steps.length}`)
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(ribbonBlock(doc, lastStepLine.id))

    await user().click(ribbonBlock(doc, closing.id))
    expect(replay()).toHaveTextContent(`Step ${doc.steps.length} of ${doc.steps.length}`)
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(ribbonBlock(doc, closing.id))
    expect(currentScriptLine()).toBe(scriptLine(doc.lines.length))
  })

  it('should move the replay to a script line clicked into, but not back when it is already the current line', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    const target = doc.lines.find((l) => l.kind === 'step' && l.steps.length > 1 && l.steps[0] > 5)!
    const field = scriptLine(lineNumber(doc, target.id))

    await user().click(field)
    expect(replay()).toHaveTextContent(`Step ${target.steps[0] + 1} of ${doc.steps.length}`)
    // one step on, still within the line's steps
    await user().click(within(replay()).getByRole('button', { name: 'Next' }))
    expect(replay()).toHaveTextContent(`Step ${target.steps[0] + 2} of ${doc.steps.length}`)

    await user().click(field)
    expect(replay()).toHaveTextContent(`Step ${target.steps[0] + 2} of ${doc.steps.length}`)
  })

  it('should say where a stuck path stops and show every empty cell’s candidates there', async () => {
    const doc = outlineFor('PE01', { stopAfter: 12 })
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    expect(screen.getByText("The engine's path stops after step 12", { exact: false })).toBeInTheDocument()

    await user().click(screen.getByRole('button', { name: 'Show where it stops' }))
    expect(replay()).toHaveTextContent('The path stops here.')
    expect(screen.queryByRole('button', { name: 'Show where it stops' })).not.toBeInTheDocument()
    const empty = within(replay()).getAllByRole('gridcell', { name: /, empty/ })
    expect(empty.length).toBeGreaterThan(0)
    expect(replay()).toHaveTextContent(`${empty.length} cells are still empty`)
    for (const cell of empty) expect(cell).toHaveAccessibleName(/, candidates /)
  })

  it('should put back unsaved edits kept in this browser and offer to discard them', async () => {
    const doc = outlineFor('PE01')
    const mine = { ...doc, lines: doc.lines.map((l, i) => (i === 1 ? { ...l, text: 'Kept from before the reload.', edited: true } : l)) }
    localStorage.setItem(localCopyKey(31, sessionFixture().user.id), JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: mine }))
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    expect(scriptLine(2)).toHaveValue('Kept from before the reload.')
    expect(saveStatus()).toHaveTextContent('Unsaved changes')
    expect(screen.getByText('were kept in this browser and have been put back', { exact: false })).toBeInTheDocument()

    await user().click(screen.getByRole('button', { name: 'Discard them' }))
    expect(scriptLine(2)).toHaveValue(doc.lines[1].text)
    expect(saveStatus()).toHaveTextContent(/^Saved$/)
    expect(screen.queryByRole('button', { name: 'Discard them' })).not.toBeInTheDocument()
  })

  it('should say lines nobody edited in the current wording when a take opens, and save that', async () => {
    const doc = outlineFor('PE01')
    const stored = { ...doc, lines: doc.lines.map((l, i) => (i === 1 ? { ...l, text: 'Words from an older Gridcue.' } : l)) }
    const saves: unknown[] = []
    serve('presenter', recordFor(stored))
    api.use(
      http.patch(apiPath('/channels/12/outlines/31'), async ({ request }) => {
        const body = (await request.json()) as { version: number }
        saves.push(body)
        const { outline: _sent, ...summary } = recordFor(stored)
        return HttpResponse.json({ ...summary, version: body.version + 1 })
      }),
    )
    vi.useFakeTimers({ shouldAdvanceTime: true })
    await openStudio(PATH)
    expect(scriptLine(2)).toHaveValue(doc.lines[1].text)
    await vi.advanceTimersByTimeAsync(2000)
    await vi.waitFor(() => expect(saves).toHaveLength(1))
    vi.useRealTimers()
  })

  it('should put back edits this browser kept before copies were kept per person', async () => {
    const doc = outlineFor('PE01')
    const mine = { ...doc, lines: doc.lines.map((l, i) => (i === 1 ? { ...l, text: 'Kept before the update.', edited: true } : l)) }
    localStorage.setItem(unownedCopyKey(31), JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: mine }))
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    expect(scriptLine(2)).toHaveValue('Kept before the update.')
    expect(localStorage.getItem(unownedCopyKey(31))).toBeNull()
    expect(localStorage.getItem(localCopyKey(31, sessionFixture().user.id))).not.toBeNull()
  })

  it("should never put back another person's unsaved edits from this browser", async () => {
    const doc = outlineFor('PE01')
    const theirs = { ...doc, lines: doc.lines.map((l, i) => (i === 1 ? { ...l, text: 'Left here by someone else.', edited: true } : l)) }
    const someoneElse = sessionFixture().user.id + 1
    localStorage.setItem(localCopyKey(31, someoneElse), JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: theirs }))
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    expect(scriptLine(2)).toHaveValue(doc.lines[1].text)
    expect(saveStatus()).toHaveTextContent(/^Saved$/)
    expect(screen.queryByText('were kept in this browser and have been put back', { exact: false })).not.toBeInTheDocument()
  })

  it('should switch between the script and the step list with tabs, by pointer and by arrow keys, and remember the choice', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    const tabs = screen.getByRole('tablist', { name: 'Right pane' })
    expect(within(tabs).getByRole('tab', { name: 'Script' })).toHaveAttribute('aria-selected', 'true')
    expect(screen.queryByRole('table', { name: 'Steps' })).not.toBeInTheDocument()

    await user().click(within(tabs).getByRole('tab', { name: 'Step list' }))
    // the step list is a chunk of its own, loaded the first time it is opened
    await vi.waitFor(() => expect(screen.getByRole('tabpanel', { name: 'Step list' }).innerHTML).toContain('table'), { timeout: 10_000 })
    const list = await screen.findByRole('table', { name: 'Steps' })
    expect(screen.getByRole('tabpanel', { name: 'Step list' })).toContainElement(list)
    expect(panelOf(within(tabs).getByRole('tab', { name: 'Script' }))).not.toBeVisible()
    expect(JSON.parse(localStorage.getItem(STUDIO_PREFS_KEY)!)).toMatchObject({ pane: 'steps' })

    // A row of the list moves the replay to its step.
    const [, ...rows] = within(list).getAllByRole('row')
    expect(rows).toHaveLength(doc.steps.length)
    await user().click(within(rows[6]).getAllByRole('cell')[0])
    expect(replay()).toHaveTextContent(`Step 7 of ${doc.steps.length}`)

    // ← on the focused tab goes back to the script, and the replay stays where it was.
    within(tabs).getByRole('tab', { name: 'Step list' }).focus()
    await user().keyboard('{ArrowLeft}')
    expect(within(tabs).getByRole('tab', { name: 'Script' })).toHaveFocus()
    expect(within(tabs).getByRole('tab', { name: 'Script' })).toHaveAttribute('aria-selected', 'true')
    expect(screen.getByRole('tabpanel', { name: 'Script' })).toBeVisible()
    expect(replay()).toHaveTextContent(`Step 7 of ${doc.steps.length}`)
  })

  it('should remember whether the script follows the step', async () => {
    const doc = outlineFor('PE01')
    serve('presenter', recordFor(doc))
    await openStudio(PATH)
    const follow = screen.getByRole('checkbox', { name: 'Follow the step' })
    expect(follow).toBeChecked()
    await user().click(follow)
    expect(follow).not.toBeChecked()
    await settle()
    expect(JSON.parse(localStorage.getItem(STUDIO_PREFS_KEY)!)).toMatchObject({ followStep: false })
  })

  it('should say so when the outline cannot be opened', async () => {
    saveSession()
    api.use(
      http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(12, 'presenter')] })),
      http.get(apiPath('/channels/12/outlines/31'), () => HttpResponse.json({ code: 'not-found', message: 'Outline not found' }, { status: 404 })),
    )
    await renderAt(App, PATH)
    expect(await screen.findByRole('heading', { level: 1, name: 'Outline not available' })).toBeInTheDocument()
    expect(screen.getByText("This outline doesn't exist, or you can't open it.")).toBeInTheDocument()
    expect(screen.getByRole('link', { name: 'Library' })).toHaveAttribute('href', '/channels/12')
  })

  it('should keep viewers out of the Studio', async () => {
    serve('viewer', recordFor(outlineFor('PE01')))
    api.use(http.get(apiPath('/channels'), () => HttpResponse.json([])))
    const { router } = await renderAt(App, PATH)
    expect(router.currentRoute.value.name).toBe('home')
    expect(screen.queryByRole('region', { name: 'Replay' })).not.toBeInTheDocument()
  })
})
