import { afterEach, beforeEach, describe, expect, it, onTestFinished, vi } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { defineComponent, h } from 'vue'
import { RouterView } from 'vue-router'
import type { RouteRecordRaw } from 'vue-router'
import type { Membership } from '@shared/schemas/auth'
import type { OutlineSummary, PuzzleRecord } from '@shared/schemas/studio'
import { routes } from '@/router'
import classic from '../fixtures/classic-puzzles.json'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import { renderAt, settle } from './render'
import { createHarness, membership, saveSession, sessionFixture, spokenCell } from './support'

const Shell = defineComponent({ render: () => h(RouterView) })
const StandIn = defineComponent({ render: () => h('p', 'another screen') })

// Stand-ins for the screens this one leads to (each tested on its own): no lazy loading or requests of theirs.
const withStandIns: RouteRecordRaw[] = routes.map((r): RouteRecordRaw => (r.name === 'studio' || r.name === 'library' ? { path: r.path, name: r.name, component: StandIn } : r))

// Project Euler problem 96, grid 01 (source named in tests/fixtures/classic-puzzles.json): one solution.
const UNIQUE = classic.puzzles.find((p) => p.id === 'PE01')!.givens
/** The live check waits this long after the last edit (usePuzzleCheck's default). */
const CHECK_DELAY = 250

function recordFixture(overrides: Partial<PuzzleRecord> = {}): PuzzleRecord {
  return {
    id: 42,
    channelId: 1,
    title: 'Morning climb',
    author: 'Rosa Ilves',
    check: 'unique',
    outlineCount: 0,
    staleOutlineCount: 0,
    version: 3,
    updatedAt: '2025-05-01T10:00:00.000Z',
    givens: UNIQUE,
    thermometers: [],
    link: 'https://example.test/puzzles/morning-climb',
    publishedOn: '2025-04-28',
    notes: '',
    problems: [],
    ...overrides,
  }
}

const takeOne: OutlineSummary = { id: 9, puzzleId: 42, name: 'Take 1', status: 'solved', stepCount: 61, totalMs: 754_000, version: 2, puzzleVersion: 1, puzzleChanges: null, savedBy: null, updatedAt: '2025-05-01T10:00:00.000Z' }

/** The signed-in user's answer from the API, with a role in channel 1. */
function signedInAs(role: Membership['role']) {
  return http.get(apiPath('/auth/me'), () => HttpResponse.json({ user: sessionFixture().user, memberships: [membership(1, role)] }))
}

/** An existing puzzle and its takes, as the API answers them. */
function existingPuzzle(record = recordFixture(), outlines: OutlineSummary[] = []) {
  return [
    http.get(apiPath(`/channels/1/puzzles/${record.id}`), () => HttpResponse.json(record)),
    http.get(apiPath(`/channels/1/puzzles/${record.id}/outlines`), () => HttpResponse.json(outlines)),
  ]
}

/** Stands in for the browser's confirm(): answers in turn with `answers` (then yes), and records the questions. */
function answerConfirm(...answers: boolean[]) {
  const confirm = vi.fn((_question?: string) => answers.shift() ?? true)
  vi.stubGlobal('confirm', confirm)
  return confirm
}

/** Every request the screen sends from now on, as "METHOD /path". */
function requestLog(): string[] {
  const log: string[] = []
  const listener = ({ request }: { request: Request }) => void log.push(`${request.method} ${new URL(request.url).pathname}`)
  api.events.on('request:start', listener)
  onTestFinished(() => api.events.removeListener('request:start', listener))
  return log
}

/** The saved puzzle 42, with every PUT body kept (in order) and answered by `answer`. */
function savesOfExistingPuzzle(answer: (body: Record<string, unknown>) => Response): Record<string, unknown>[] {
  const bodies: Record<string, unknown>[] = []
  api.use(
    ...existingPuzzle(),
    http.put(apiPath('/channels/1/puzzles/42'), async ({ request }) => {
      const body = (await request.json()) as Record<string, unknown>
      bodies.push(body)
      return answer(body)
    }),
  )
  return bodies
}

async function open(path: string, role: Membership['role'] = 'presenter') {
  api.use(signedInAs(role))
  const user = userEvent.setup({ advanceTimers: vi.advanceTimersByTime })
  const rendered = await renderAt(Shell, path, { harness: createHarness(withStandIns) })
  const grid = () => screen.getByRole('grid', { name: /^Puzzle grid/ })
  const cell = (name: string) => within(grid()).getByRole('gridcell', { name: new RegExp(`^${spokenCell(name)},`) })
  const problemCells = () => within(grid()).queryAllByRole('gridcell', { name: /, problem$/ }).map((c) => c.getAttribute('aria-label')!.replace(/^row (\d), column (\d),.*$/, 'r$1c$2'))
  const button = (name: string | RegExp) => screen.getByRole('button', { name })
  /** Clicks a cell and types on the grid, as a presenter enters givens. */
  async function typeAt(name: string, keys: string) {
    await user.click(cell(name))
    await user.keyboard(keys)
  }
  return { ...rendered, user, grid, cell, problemCells, button, typeAt }
}

describe('PuzzleView', () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
    vi.useFakeTimers()
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.restoreAllMocks()
    vi.unstubAllGlobals()
  })

  it('should show the fields and the permission reminder, and point at no cell before anything is entered', async () => {
    const { problemCells, grid } = await open('/channels/1/puzzles/new')

    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('New puzzle')
    for (const label of ['Title', 'Setter', 'Link to the puzzle', 'First published', 'Notes', 'Givens as text']) {
      expect(screen.getByLabelText(label)).toBeEnabled()
    }
    expect(screen.getByText(/only with its setter's permission/)).toBeVisible()
    // an empty grid has many solutions, but nothing is pointed at before anything is entered
    expect(problemCells()).toEqual([])
    // the keyboard help is read with the grid, since the grid is where the keys work
    expect(grid()).toHaveAccessibleDescription(/^Arrows move, 1 – 9 set a given/)
  })

  it('should check the grid a quarter second after the last edit and then say "Several solutions"', async () => {
    const { typeAt, problemCells, button } = await open('/channels/1/puzzles/new')
    const check = within(screen.getByRole('region', { name: 'Check' }))

    await typeAt('r1c1', '4')
    expect(button('Find the path')).toHaveAccessibleDescription('Checking the grid…')
    await vi.advanceTimersByTimeAsync(CHECK_DELAY - 1)
    expect(check.getByRole('status')).toHaveTextContent('checking…')

    await vi.advanceTimersByTimeAsync(1)
    expect(check.getByRole('status')).toHaveTextContent('Several solutions')
    expect(check.getByRole('listitem')).toHaveTextContent('The puzzle has more than one solution')
    expect(problemCells()).toHaveLength(2)
    expect(button('Find the path')).toBeDisabled()
    expect(button('Find the path')).toHaveAccessibleDescription('Gridcue finds the path once the puzzle has exactly one solution.')
  })

  it("should show the engine's message and point at both cells of a duplicate given", async () => {
    const { typeAt, problemCells } = await open('/channels/1/puzzles/new')
    await typeAt('r1c1', '5{ArrowRight}5')
    await vi.advanceTimersByTimeAsync(CHECK_DELAY)

    const check = within(screen.getByRole('region', { name: 'Check' }))
    expect(check.getByRole('status')).toHaveTextContent('Needs fixing')
    expect(check.getByText('Row 1 has the given 5 more than once: r1c1, r1c2.')).toBeVisible()
    expect(problemCells()).toEqual(['r1c1', 'r1c2'])
  })

  it('should block saving a malformed grid with the message and send nothing', async () => {
    const { user, typeAt, button } = await open('/channels/1/puzzles/new')
    const sent = requestLog()
    await user.type(screen.getByLabelText('Title'), 'Twin fives')
    await typeAt('r1c1', '5{ArrowRight}5')
    await user.click(button('Save'))

    expect(screen.getByText(/^Fix the grid before saving: Row 1 has the given 5 more than once/)).toBeVisible()
    expect(sent).toEqual([])
  })

  it('should show what a field needs beside it and not save', async () => {
    const { user, button } = await open('/channels/1/puzzles/new')
    const sent = requestLog()
    await user.type(screen.getByLabelText('Title'), 'Morning climb')
    await user.type(screen.getByLabelText('Link to the puzzle'), 'javascript:alert(1)')
    await user.click(button('Save'))

    expect(screen.getByText('Some details need fixing before saving.')).toBeVisible()
    expect(screen.getByLabelText('Link to the puzzle')).toHaveAccessibleDescription('Link must be a web address (https://…)')
    expect(screen.getByLabelText('Link to the puzzle')).toBeInvalid()
    expect(sent).toEqual([])
  })

  it('should save a new draft with the right body, say it is a draft and move to its address', async () => {
    const saved = recordFixture({ check: 'multiple-solutions', givens: '7'.padEnd(81, '.'), thermometers: [['r2c2', 'r2c3', 'r3c4']], version: 1 })
    const bodies: unknown[] = []
    api.use(
      http.post(apiPath('/channels/1/puzzles'), async ({ request }) => {
        bodies.push(await request.json())
        return HttpResponse.json(saved, { status: 201 })
      }),
      ...existingPuzzle(saved),
    )
    const { user, typeAt, cell, button, router } = await open('/channels/1/puzzles/new')
    await user.type(screen.getByLabelText('Title'), '  Morning climb ')
    await user.type(screen.getByLabelText('Setter'), 'Rosa Ilves')
    await user.type(screen.getByLabelText('Link to the puzzle'), 'https://example.test/puzzles/morning-climb')
    await user.type(screen.getByLabelText('First published'), '2025-04-28')
    await typeAt('r1c1', '7')
    // A thermometer dragged from its bulb r2c2 through r2c3 to r3c4.
    await user.pointer([{ keys: '[MouseLeft>]', target: cell('r2c2') }, { target: cell('r2c3') }, { target: cell('r3c4') }, { keys: '[/MouseLeft]', target: cell('r3c4') }])
    expect(screen.getByRole('button', { name: /r2c2 → r2c3 → r3c4/ })).toBeVisible()

    await user.click(button('Save'))
    await settle()

    expect(bodies).toEqual([
      {
        title: 'Morning climb',
        author: 'Rosa Ilves',
        givens: '7'.padEnd(81, '.'),
        thermometers: [['r2c2', 'r2c3', 'r3c4']],
        link: 'https://example.test/puzzles/morning-climb',
        publishedOn: '2025-04-28',
        notes: '',
      },
    ])
    expect(router.currentRoute.value.fullPath).toBe('/channels/1/puzzles/42')
    expect(screen.getByText(/^Saved as a draft/)).toBeVisible()
    expect(screen.getByText('All changes saved · version 1')).toBeVisible()
  })

  it('should send the version it read when saving an existing puzzle', async () => {
    const bodies = savesOfExistingPuzzle((body) => HttpResponse.json({ ...recordFixture(), ...body, version: 4 }))
    const { user, button } = await open('/channels/1/puzzles/42')
    const title = screen.getByLabelText('Title')
    expect(title).toHaveValue('Morning climb')

    await user.clear(title)
    await user.type(title, 'Morning climb (revised)')
    expect(screen.getByText('Unsaved changes')).toBeVisible()
    await user.click(button('Save'))
    await settle()

    expect(bodies).toHaveLength(1)
    expect(bodies[0]).toMatchObject({ title: 'Morning climb (revised)', givens: UNIQUE, version: 3 })
    expect(screen.getByText('Saved.')).toBeVisible()
    expect(screen.getByText('All changes saved · version 4')).toBeVisible()
  })

  it('should show the server\'s message when the database is unavailable, keep the edits and save them once it is back', async () => {
    const notStored = "The database is unavailable; this change was not saved — it is kept in this browser and will be sent when it's back."
    let away = true
    const bodies = savesOfExistingPuzzle((body) =>
      away
        ? HttpResponse.json({ code: 'database-unavailable', message: notStored }, { status: 503 })
        : HttpResponse.json({ ...recordFixture(), ...body, version: 4 }),
    )
    const { user, button } = await open('/channels/1/puzzles/42')
    const title = screen.getByLabelText('Title')
    await user.clear(title)
    await user.type(title, 'Morning climb (revised)')
    await user.click(button('Save'))
    await settle()

    expect(screen.getByText(notStored)).toBeVisible()
    expect(title).toHaveValue('Morning climb (revised)')
    expect(screen.getByText('Unsaved changes')).toBeVisible()

    away = false
    // the first new try comes within two seconds
    await vi.advanceTimersByTimeAsync(2000)
    await settle()
    expect(bodies.map((b) => [b.title, b.version])).toEqual([
      ['Morning climb (revised)', 3],
      ['Morning climb (revised)', 3],
    ])
    expect(screen.queryByText(notStored)).toBeNull()
    expect(screen.getByText('Saved.')).toBeVisible()
    expect(screen.getByText('All changes saved · version 4')).toBeVisible()
  })

  describe('when someone else saved first (409)', () => {
    const theirs = recordFixture({ title: 'Morning climb — final', version: 5, updatedAt: '2025-05-02T09:30:00.000Z' })

    /** PUT answers 409 with their copy unless the save is over their version. */
    function staleUntilOverTheirs() {
      return savesOfExistingPuzzle((body) =>
        body.version === theirs.version
          ? HttpResponse.json({ ...theirs, ...body, version: 6 })
          : HttpResponse.json({ code: 'stale', message: 'Someone else saved this puzzle first.', details: { current: theirs } }, { status: 409 }),
      )
    }

    async function saveOverTheirs() {
      const screenParts = await open('/channels/1/puzzles/42')
      const title = screen.getByLabelText('Title')
      await screenParts.user.clear(title)
      await screenParts.user.type(title, 'Morning climb (mine)')
      await screenParts.user.click(screenParts.button('Save'))
      await settle()
      return { ...screenParts, title, dialog: screen.getByRole('dialog', { name: 'Someone else saved this puzzle' }) }
    }

    it('should show both versions side by side and save over the newer one when the user keeps theirs', async () => {
      const bodies = staleUntilOverTheirs()
      const { user, title, dialog } = await saveOverTheirs()

      const titles = within(within(dialog).getByRole('row', { name: /^Title/ })).getAllByRole('cell')
      expect(titles.map((c) => c.textContent)).toEqual(['Morning climb (mine)', 'Morning climb — final'])
      expect(within(dialog).getByRole('grid', { name: 'Your grid' })).toBeVisible()
      expect(within(dialog).getByRole('grid', { name: 'Saved grid' })).toBeVisible()
      // Still what the user typed, whatever they choose next.
      expect(title).toHaveValue('Morning climb (mine)')

      await user.click(within(dialog).getByRole('button', { name: 'Keep mine and save' }))
      await settle()

      expect(bodies.map((b) => [b.title, b.version])).toEqual([
        ['Morning climb (mine)', 3],
        ['Morning climb (mine)', 5],
      ])
      expect(screen.getByText('All changes saved · version 6')).toBeVisible()
    })

    it('should load the saved version on request and keep the typed edits to bring back', async () => {
      const bodies = staleUntilOverTheirs()
      const { user, title, dialog } = await saveOverTheirs()

      await user.click(within(dialog).getByRole('button', { name: 'Use the saved version' }))
      expect(title).toHaveValue('Morning climb — final')
      expect(screen.getByText('All changes saved · version 5')).toBeVisible()

      await user.click(screen.getByRole('button', { name: 'Bring back my edits' }))
      expect(title).toHaveValue('Morning climb (mine)')
      expect(screen.getByText('Unsaved changes')).toBeVisible()
      expect(bodies).toHaveLength(1)
    })
  })

  it('should find the path for a unique puzzle and open the new take in the Studio', async () => {
    api.use(
      ...existingPuzzle(),
      http.post(apiPath('/channels/1/puzzles/42/outlines'), () => HttpResponse.json(recordFor(outlineFor('PE01'), { id: 9, puzzleId: 42, name: 'Take 1' }), { status: 201 })),
    )
    const { user, button, router } = await open('/channels/1/puzzles/42')
    const sent = requestLog()
    expect(button('Find the path')).toBeEnabled()

    await user.click(button('Find the path'))
    await settle()

    expect(sent.filter((r) => r.startsWith('POST'))).toEqual(['POST /api/channels/1/puzzles/42/outlines'])
    expect(router.currentRoute.value.name).toBe('studio')
    expect(router.currentRoute.value.params).toMatchObject({ channelId: '1', outlineId: '9' })
  })

  it("should list the puzzle's takes with links to open them, and duplicate one", async () => {
    api.use(
      ...existingPuzzle(recordFixture({ outlineCount: 1 }), [takeOne]),
      http.post(apiPath('/channels/1/outlines/9/duplicate'), () => HttpResponse.json(recordFor(outlineFor('PE01'), { id: 10, puzzleId: 42, name: 'Take 1 (copy)' }), { status: 201 })),
    )
    const { user } = await open('/channels/1/puzzles/42')
    const sent = requestLog()

    expect(screen.getByRole('link', { name: 'Take 1' })).toHaveAttribute('href', '/channels/1/outlines/9')
    expect(screen.getByLabelText('about 12:34 long')).toBeVisible()

    await user.click(screen.getByRole('button', { name: 'Duplicate Take 1' }))
    await settle()
    expect(sent[0]).toBe('POST /api/channels/1/outlines/9/duplicate')
  })

  it('should flag a take made before the grid changed, say what changed, and find its path again keeping edited lines', async () => {
    const staleTake: OutlineSummary = { ...takeOne, puzzleVersion: 2, puzzleChanges: { givens: { added: 1, removed: 0, changed: 0 }, thermometers: { added: 0, removed: 1 } } }
    const bodies: unknown[] = []
    api.use(
      ...existingPuzzle(recordFixture({ outlineCount: 1, staleOutlineCount: 1 }), [staleTake]),
      http.post(apiPath('/channels/1/outlines/9/refresh'), async ({ request }) => {
        bodies.push(await request.json())
        const take = recordFor(outlineFor('PE01'), { id: 9, puzzleId: 42, version: 3, puzzleVersion: 3 })
        return HttpResponse.json({ take, kept: 2, lost: ['This one is a given now.'] })
      }),
    )
    const { user } = await open('/channels/1/puzzles/42')

    expect(screen.getByText('Puzzle changed')).toBeVisible()
    expect(screen.getByText(/Made before 1 given added and 1 thermometer removed\./)).toBeVisible()
    await user.click(screen.getByRole('button', { name: 'Find the path again for Take 1' }))
    await settle()

    // the version the list read, so a save it didn't see is never overwritten
    expect(bodies).toEqual([{ version: takeOne.version }])
    expect(screen.getByText(/^Path found again/)).toHaveTextContent('Path found again: 2 edited lines kept, 1 no longer fit a step: “This one is a given now.”.')
  })

  it('should not offer to find the path again to an editor, who cannot make takes', async () => {
    const staleTake: OutlineSummary = { ...takeOne, puzzleChanges: { givens: { added: 0, removed: 0, changed: 1 }, thermometers: { added: 0, removed: 0 } } }
    api.use(...existingPuzzle(recordFixture({ outlineCount: 1, staleOutlineCount: 1 }), [staleTake]))
    await open('/channels/1/puzzles/42', 'editor')

    expect(screen.getByText(/Made before 1 given changed\./)).toBeVisible()
    expect(screen.queryByRole('button', { name: /Find the path again/ })).toBeNull()
  })

  it('should ask once more before deleting a take, and send the delete only when confirmed', async () => {
    api.use(
      ...existingPuzzle(recordFixture({ outlineCount: 1 }), [takeOne]),
      http.delete(apiPath('/channels/1/outlines/9'), () => new HttpResponse(null, { status: 204 })),
    )
    const { user } = await open('/channels/1/puzzles/42')
    const sent = requestLog()

    await user.click(screen.getByRole('button', { name: 'Delete Take 1…' }))
    expect(screen.getByText('Delete “Take 1” and its edits?')).toBeVisible()
    await user.click(screen.getByRole('button', { name: 'Keep' }))
    expect(sent).toEqual([])

    await user.click(screen.getByRole('button', { name: 'Delete Take 1…' }))
    await user.keyboard('{Escape}')
    expect(screen.queryByText('Delete “Take 1” and its edits?')).toBeNull()
    expect(sent).toEqual([])

    await user.click(screen.getByRole('button', { name: 'Delete Take 1…' }))
    await user.click(screen.getByRole('button', { name: 'Delete Take 1 for good' }))
    await settle()
    expect(sent.filter((r) => r.startsWith('DELETE'))).toEqual(['DELETE /api/channels/1/outlines/9'])
  })

  it('should delete the puzzle only after the second confirmation, then go back to the Library without asking about edits', async () => {
    api.use(
      ...existingPuzzle(),
      http.delete(apiPath('/channels/1/puzzles/42'), () => new HttpResponse(null, { status: 204 })),
    )
    const confirm = answerConfirm()
    const { user, button, router } = await open('/channels/1/puzzles/42')
    const sent = requestLog()
    await user.type(screen.getByLabelText('Notes'), 'About to go')

    await user.click(button('Delete…'))
    expect(screen.getByRole('group', { name: 'Confirm delete' })).toHaveTextContent('Delete this puzzle and all its outlines?')
    expect(sent).toEqual([])
    await user.click(button('Delete for good'))
    await settle()

    expect(sent.filter((r) => r.startsWith('DELETE'))).toEqual(['DELETE /api/channels/1/puzzles/42'])
    expect(router.currentRoute.value.name).toBe('library')
    expect(confirm).not.toHaveBeenCalled()
  })

  it('should keep the puzzle when the second confirmation is declined', async () => {
    api.use(...existingPuzzle())
    const { user, button } = await open('/channels/1/puzzles/42')
    const sent = requestLog()

    await user.click(button('Delete…'))
    await user.click(button('Keep it'))

    expect(screen.queryByRole('group', { name: 'Confirm delete' })).toBeNull()
    expect(button('Delete…')).toBeVisible()
    expect(sent).toEqual([])
  })

  describe('leaving with unsaved edits', () => {
    it('should ask before leaving for another screen, and stay when the answer is no', async () => {
      api.use(...existingPuzzle())
      const confirm = answerConfirm(false, true)
      const { user, router } = await open('/channels/1/puzzles/42')
      await user.type(screen.getByLabelText('Setter'), ' and friends')

      await user.click(screen.getByRole('link', { name: 'Library' }))
      await settle()
      expect(confirm).toHaveBeenLastCalledWith('This puzzle has changes that are not saved. Leave anyway?')
      expect(router.currentRoute.value.name).toBe('puzzle')

      await user.click(screen.getByRole('link', { name: 'Library' }))
      await settle()
      expect(confirm).toHaveBeenCalledTimes(2)
      expect(router.currentRoute.value.name).toBe('library')
    })

    it("should have the browser ask before the tab closes only while there are edits", async () => {
      api.use(...existingPuzzle())
      const { user } = await open('/channels/1/puzzles/42')
      const closeTab = () => {
        const event = new Event('beforeunload', { cancelable: true })
        window.dispatchEvent(event)
        return event.defaultPrevented
      }
      expect(closeTab()).toBe(false)

      await user.type(screen.getByLabelText('Title'), '!')
      expect(closeTab()).toBe(true)
    })

    it('should leave without asking when nothing changed', async () => {
      api.use(...existingPuzzle())
      const confirm = answerConfirm()
      const { user, router } = await open('/channels/1/puzzles/42')

      await user.click(screen.getByRole('link', { name: 'Library' }))
      await settle()
      expect(confirm).not.toHaveBeenCalled()
      expect(router.currentRoute.value.name).toBe('library')
    })
  })

  describe('puzzle files', () => {
    /** The file chooser opens from the "Open a file…" button; the browser hands the choice to its hidden input. */
    async function chooseFile(user: ReturnType<typeof userEvent.setup>, container: Element, name: string, text: string) {
      await user.click(screen.getByRole('button', { name: 'Open a file…' }))
      await user.upload(container.querySelector<HTMLInputElement>('input[type="file"]')!, new File([text], name, { type: 'application/json' }))
      await settle()
    }

    it('should fill the title, setter and grid from a chosen file and leave it unsaved', async () => {
      const { user, container, cell } = await open('/channels/1/puzzles/new')
      const file = { title: 'Lantern Steps', author: 'Oona Fairweather', givens: UNIQUE, thermometers: [['r1c1', 'r2c2']] }
      await chooseFile(user, container, 'lantern.puzzle.json', JSON.stringify(file))

      expect(screen.getByText('Loaded “Lantern Steps” from lantern.puzzle.json. Save to keep it.')).toBeVisible()
      expect(screen.getByLabelText('Title')).toHaveValue('Lantern Steps')
      expect(screen.getByLabelText('Setter')).toHaveValue('Oona Fairweather')
      expect(screen.getByLabelText('Givens as text')).toHaveValue(UNIQUE)
      expect(cell('r1c3')).toHaveAccessibleName('row 1, column 3, 3, given')
      expect(screen.getByRole('button', { name: /r1c1 → r2c2/ })).toBeVisible()
      expect(screen.getByText('Unsaved changes')).toBeVisible()
    })

    it('should say what is wrong with a file that is not a puzzle, and change nothing', async () => {
      const { user, container } = await open('/channels/1/puzzles/new')
      await user.type(screen.getByLabelText('Title'), 'Mine')
      await chooseFile(user, container, 'notes.txt', 'shopping list')

      expect(screen.getByText("notes.txt is not a Gridcue puzzle file (it isn't JSON).")).toBeVisible()
      expect(screen.getByLabelText('Title')).toHaveValue('Mine')
      expect(screen.getByLabelText('Givens as text')).toHaveValue('.'.repeat(81))
    })

    it('should download the puzzle as a file named after its title', async () => {
      api.use(...existingPuzzle(recordFixture({ thermometers: [['r1c1', 'r2c2']] })))
      const blobs: Blob[] = []
      vi.spyOn(URL, 'createObjectURL').mockImplementation((blob) => {
        blobs.push(blob as Blob)
        return 'blob:puzzle'
      })
      vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {})
      const names: string[] = []
      vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
        names.push(this.download)
      })
      const { user } = await open('/channels/1/puzzles/42')

      await user.click(screen.getByRole('button', { name: 'Download' }))

      expect(names).toEqual(['morning-climb.puzzle.json'])
      expect(JSON.parse(await blobs[0]!.text())).toEqual({ title: 'Morning climb', author: 'Rosa Ilves', givens: UNIQUE, thermometers: [['r1c1', 'r2c2']] })
    })
  })

  it('should show the puzzle read-only to an editor: no saving, no file to open, no path to find', async () => {
    api.use(...existingPuzzle(recordFixture(), [takeOne]))
    const { user } = await open('/channels/1/puzzles/42', 'editor')

    expect(screen.getByText('Read only: owners and presenters edit puzzles.')).toBeVisible()
    for (const label of ['Title', 'Setter', 'Link to the puzzle', 'First published', 'Notes', 'Givens as text']) {
      expect(screen.getByLabelText(label)).toBeDisabled()
    }
    expect(screen.getByRole('grid', { name: 'Puzzle grid' })).toHaveAttribute('aria-readonly', 'true')
    for (const name of ['Save', 'Undo', 'Delete…', 'Open a file…', 'Duplicate Take 1']) {
      expect(screen.queryByRole('button', { name })).toBeNull()
    }
    expect(screen.getByRole('button', { name: 'Find the path' })).toHaveAccessibleDescription('Owners and presenters can find the path.')
    expect(screen.getByRole('button', { name: 'Download' })).toBeEnabled()

    // Keys on the grid change nothing.
    await user.click(within(screen.getByRole('grid', { name: 'Puzzle grid' })).getByRole('gridcell', { name: /^row 1, column 1,/ }))
    await user.keyboard('9')
    expect(screen.getByLabelText('Givens as text')).toHaveValue(UNIQUE)
  })

  it('should say so when the puzzle is not in this channel', async () => {
    const notFound = () => HttpResponse.json({ code: 'not-found', message: 'Not found' }, { status: 404 })
    api.use(http.get(apiPath('/channels/1/puzzles/77'), notFound), http.get(apiPath('/channels/1/puzzles/77/outlines'), notFound))
    await open('/channels/1/puzzles/77')

    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Puzzle not available')
    expect(screen.getByText("This puzzle doesn't exist in this channel, or you can't open it.")).toBeVisible()
  })

  it('should leave a missing puzzle for the Library without asking about unsaved changes', async () => {
    const notFound = () => HttpResponse.json({ code: 'not-found', message: 'Not found' }, { status: 404 })
    api.use(http.get(apiPath('/channels/1/puzzles/999'), notFound), http.get(apiPath('/channels/1/puzzles/999/outlines'), notFound))
    const confirm = answerConfirm(false)
    const { router } = await open('/channels/1/puzzles/999')
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Puzzle not available')

    const leaving = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(leaving)
    expect(leaving.defaultPrevented).toBe(false)
    await router.push({ name: 'library', params: { channelId: 1 } })
    await settle()
    expect(confirm).not.toHaveBeenCalled()
    expect(router.currentRoute.value.name).toBe('library')
  })
})
