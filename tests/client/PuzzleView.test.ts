import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { enableAutoUnmount, flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { RouterView } from 'vue-router'
import type { RouteRecordRaw } from 'vue-router'
import type { PuzzleRecord } from '@shared/schemas/studio'
import { routes } from '@/router'
import { createHarness, jsonResponse, membership, mockApi, mountAt, saveSession, sessionFixture } from './support'

enableAutoUnmount(afterEach)

const Shell = defineComponent({ render: () => h(RouterView) })
const Blank = defineComponent({ render: () => h('p', 'studio') })

// A stand-in for the Studio screen (tested on its own), so navigating there stays cheap.
const withStudio: RouteRecordRaw[] = routes.map((r): RouteRecordRaw => (r.name === 'studio' ? { path: r.path, name: r.name, component: Blank } : r))

const UNIQUE = '53..7....6..195....98....6.8...6...34..8.3..17...2...6.6....28....419..5....8..79'

function recordFixture(overrides: Partial<PuzzleRecord> = {}): PuzzleRecord {
  return {
    id: 42,
    channelId: 1,
    title: 'Morning climb',
    author: 'Rosa Ilves',
    check: 'unique',
    outlineCount: 0,
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

const me = jsonResponse(200, { user: sessionFixture().user, memberships: [membership(1, 'presenter')] })

async function open(path: string, api: Parameters<typeof mockApi>[0]) {
  const fetchMock = mockApi({ 'GET /api/auth/me': me, ...api })
  const mounted = await mountAt(Shell, path, createHarness(withStudio))
  await flushPromises()
  const { wrapper } = mounted
  const field = (label: string) => {
    const id = wrapper.findAll('label').find((l) => l.text() === label)!.attributes('for')
    return wrapper.find(`#${id}`)
  }
  const button = (name: string) => wrapper.findAll('button').find((b) => b.text() === name)!
  const grid = wrapper.find('[role="grid"]')
  const key = (k: string) => grid.trigger('keydown', { key: k })
  return { ...mounted, fetchMock, field, button, grid, key }
}

const settle = async () => {
  await new Promise((resolve) => setTimeout(resolve, 320))
  await flushPromises()
}

function lastCall(fetchMock: ReturnType<typeof mockApi>, method: string) {
  const call = fetchMock.mock.calls.filter(([, init]) => (init?.method ?? 'GET') === method).at(-1)!
  const raw = call[1]?.body
  return { url: String(call[0]), body: raw === undefined || raw === null ? undefined : JSON.parse(String(raw)) }
}

// The first test also pays for loading the screen's modules; the shared test machine can be slow.
describe('PuzzleView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    saveSession()
  })
  afterEach(() => {
    vi.unstubAllGlobals()
    vi.restoreAllMocks()
    document.body.innerHTML = ''
  })

  it('should show the fields, the permission reminder and "Several solutions" for an almost empty grid', async () => {
    const { wrapper, grid, key, button } = await open('/channels/1/puzzles/new', {})
    expect(wrapper.find('h1').text()).toBe('New puzzle')
    for (const label of ['Title', 'Setter', 'Link to the puzzle', 'First published', 'Notes']) {
      expect(wrapper.findAll('label').some((l) => l.text() === label)).toBe(true)
    }
    expect(wrapper.text()).toContain("only with its setter's permission")
    // an empty grid has many solutions, but nothing is marked as a problem before anything is entered
    expect(grid.findAll('[aria-label$=", problem"]')).toHaveLength(0)

    await grid.trigger('focus')
    await key('4')
    await settle()
    expect(wrapper.find('[role="status"]').text()).toContain('Several solutions')
    expect(wrapper.text()).toContain('The puzzle has more than one solution')
    expect(grid.findAll('[aria-label$=", problem"]')).toHaveLength(2)
    expect(button('Find the path').attributes('disabled')).toBeDefined()
  })

  it("should show the engine's message and mark the cells for a duplicate given", async () => {
    const { wrapper, grid, key } = await open('/channels/1/puzzles/new', {})
    await grid.trigger('focus')
    await key('5')
    await key('ArrowRight')
    await key('5')
    await settle()

    expect(wrapper.find('[role="status"]').text()).toContain('Needs fixing')
    expect(wrapper.text()).toContain('Row 1 has the given 5 more than once: r1c1, r1c2.')
    expect(wrapper.find('[data-cell="0"]').classes()).toContain('grid-board__cell--error')
    expect(wrapper.find('[data-cell="1"]').classes()).toContain('grid-board__cell--error')
  })

  it('should block saving a malformed grid with the message and not call the API', async () => {
    const { wrapper, field, button, grid, key, fetchMock } = await open('/channels/1/puzzles/new', {})
    await field('Title').setValue('Twin fives')
    await grid.trigger('focus')
    await key('5')
    await key('ArrowRight')
    await key('5')
    await button('Save').trigger('click')
    await flushPromises()

    expect(wrapper.text()).toContain('Fix the grid before saving: Row 1 has the given 5 more than once')
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(false)
  })

  it('should save a new draft that is not unique yet with the right body and move to its address', async () => {
    const saved = recordFixture({ check: 'multiple-solutions', givens: '7'.padEnd(81, '.'), thermometers: [['r2c2', 'r2c3', 'r3c4']], version: 1 })
    const { wrapper, field, button, grid, key, fetchMock, router } = await open('/channels/1/puzzles/new', {
      'POST /api/channels/1/puzzles': jsonResponse(201, saved),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
    })
    await field('Title').setValue('  Morning climb ')
    await field('Setter').setValue('Rosa Ilves')
    await field('Link to the puzzle').setValue('https://example.test/puzzles/morning-climb')
    await field('First published').setValue('2025-04-28')
    await grid.trigger('focus')
    await key('7')
    // Draw a thermometer r2c2 → r2c3 → r3c4 by dragging.
    const cell = (c: number) => wrapper.find(`[data-cell="${c}"]`)
    await cell(10).trigger('pointerdown', { button: 0, pointerId: 1 })
    await cell(11).trigger('pointermove', { pointerId: 1 })
    await cell(21).trigger('pointermove', { pointerId: 1 })
    await cell(21).trigger('pointerup', { pointerId: 1 })

    await button('Save').trigger('click')
    await flushPromises()

    const { url, body } = lastCall(fetchMock, 'POST')
    expect(url).toBe('/api/channels/1/puzzles')
    expect(body).toEqual({
      title: 'Morning climb',
      author: 'Rosa Ilves',
      givens: '7'.padEnd(81, '.'),
      thermometers: [['r2c2', 'r2c3', 'r3c4']],
      link: 'https://example.test/puzzles/morning-climb',
      publishedOn: '2025-04-28',
      notes: '',
    })
    expect(router.currentRoute.value.fullPath).toBe('/channels/1/puzzles/42')
    expect(wrapper.text()).toContain('Saved as a draft')
    expect(wrapper.text()).toContain('All changes saved · version 1')
  })

  it('should send the version it read when saving an existing puzzle', async () => {
    const { field, button, fetchMock } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture()),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
      'PUT /api/channels/1/puzzles/42': (_url, init) => jsonResponse(200, { ...recordFixture(), ...JSON.parse(String(init.body)), version: 4 }),
    })
    expect((field('Title').element as HTMLInputElement).value).toBe('Morning climb')

    await field('Title').setValue('Morning climb (revised)')
    await button('Save').trigger('click')
    await flushPromises()

    const { url, body } = lastCall(fetchMock, 'PUT')
    expect(url).toBe('/api/channels/1/puzzles/42')
    expect(body).toMatchObject({ title: 'Morning climb (revised)', givens: UNIQUE, version: 3 })
  })

  it('should show both versions on a 409 and save over the newer one when the user keeps theirs', async () => {
    const theirs = recordFixture({ title: 'Morning climb — final', version: 5, updatedAt: '2025-05-02T09:30:00.000Z' })
    let puts = 0
    const { wrapper, field, button, fetchMock } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': () => jsonResponse(200, puts ? theirs : recordFixture()),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
      'PUT /api/channels/1/puzzles/42': (_url, init) => {
        puts++
        const body = JSON.parse(String(init.body))
        return body.version === 5
          ? jsonResponse(200, { ...theirs, ...body, version: 6 })
          : jsonResponse(409, { code: 'stale', message: 'Someone else saved this puzzle first.', details: { current: theirs } })
      },
    })
    await field('Title').setValue('Morning climb (mine)')
    await button('Save').trigger('click')
    await flushPromises()

    const dialog = document.body.querySelector('[role="dialog"]')!
    expect(dialog).not.toBeNull()
    expect(dialog.textContent).toContain('Someone else saved this puzzle')
    expect(dialog.textContent).toContain('Morning climb (mine)')
    expect(dialog.textContent).toContain('Morning climb — final')
    expect(dialog.querySelectorAll('[role="grid"]')).toHaveLength(2)
    // Still what the user typed, whatever they choose next.
    expect((field('Title').element as HTMLInputElement).value).toBe('Morning climb (mine)')

    const keep = [...dialog.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Keep mine and save')!
    keep.click()
    await flushPromises()

    const { body } = lastCall(fetchMock, 'PUT')
    expect(body).toMatchObject({ title: 'Morning climb (mine)', version: 5 })
    expect(wrapper.text()).toContain('version 6')
  })

  it('should load the saved version on request and keep the typed edits to bring back', async () => {
    const theirs = recordFixture({ title: 'Morning climb — final', version: 5 })
    const { wrapper, field, button } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture()),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
      'PUT /api/channels/1/puzzles/42': jsonResponse(409, { code: 'stale', message: 'Stale', details: { current: theirs } }),
    })
    await field('Title').setValue('Morning climb (mine)')
    await button('Save').trigger('click')
    await flushPromises()

    const dialog = document.body.querySelector('[role="dialog"]')!
    const take = [...dialog.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Use the saved version')!
    take.click()
    await flushPromises()
    expect((field('Title').element as HTMLInputElement).value).toBe('Morning climb — final')

    await wrapper.findAll('button').find((b) => b.text() === 'Bring back my edits')!.trigger('click')
    expect((field('Title').element as HTMLInputElement).value).toBe('Morning climb (mine)')
    expect(wrapper.text()).toContain('Unsaved changes')
  })

  it('should find the path for a unique puzzle and open the new outline in the Studio', async () => {
    const outline = { id: 9, puzzleId: 42, name: 'Take 1' }
    const { button, fetchMock, router } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture()),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
      'POST /api/channels/1/puzzles/42/outlines': () => jsonResponse(201, outlineRecordStub(outline)),
    })
    const find = button('Find the path')
    expect(find.attributes('disabled')).toBeUndefined()
    await find.trigger('click')
    await flushPromises()

    expect(lastCall(fetchMock, 'POST').url).toBe('/api/channels/1/puzzles/42/outlines')
    expect(router.currentRoute.value.name).toBe('studio')
    expect(router.currentRoute.value.params).toMatchObject({ channelId: '1', outlineId: '9' })
  })

  it("should list the puzzle's outlines with open links and duplicate one", async () => {
    const summary = { id: 9, puzzleId: 42, name: 'Take 1', status: 'solved', stepCount: 61, totalMs: 754_000, version: 2, updatedAt: '2025-05-01T10:00:00.000Z' }
    const { wrapper, fetchMock } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture({ outlineCount: 1 })),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, [summary]),
      'POST /api/channels/1/outlines/9/duplicate': () => jsonResponse(201, outlineRecordStub({ id: 10, puzzleId: 42, name: 'Take 1 (copy)' })),
    })
    const link = wrapper.findAll('a').find((a) => a.text() === 'Take 1')!
    expect(link.attributes('href')).toBe('/channels/1/outlines/9')
    expect(wrapper.text()).toContain('12:34')

    await wrapper.find('button[aria-label="Duplicate Take 1"]').trigger('click')
    await flushPromises()
    expect(lastCall(fetchMock, 'POST').url).toBe('/api/channels/1/outlines/9/duplicate')
  })

  it('should delete the puzzle only after the second confirmation, then go back to the Library', async () => {
    const { wrapper, fetchMock, button, router } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture()),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, []),
      'DELETE /api/channels/1/puzzles/42': () => new Response(null, { status: 204 }),
      'GET /api/channels/1/puzzles': jsonResponse(200, []),
      'GET /api/channels/1': jsonResponse(200, { id: 1, name: 'Marigold Logic', slug: 'marigold-logic', description: '', role: 'presenter', memberCount: 4 }),
    })
    const deletes = () => fetchMock.mock.calls.filter(([, init]) => init?.method === 'DELETE')
    await button('Delete…').trigger('click')
    expect(wrapper.text()).toContain('Delete this puzzle and all its outlines?')
    expect(deletes()).toHaveLength(0)
    await button('Delete for good').trigger('click')
    await flushPromises()
    expect(deletes().map(([url]) => String(url))).toEqual(['/api/channels/1/puzzles/42'])
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('library'))
  })

  it('should ask once more before deleting a take, and send the delete only when confirmed', async () => {
    const summary = { id: 9, puzzleId: 42, name: 'Take 1', status: 'solved', stepCount: 61, totalMs: 754_000, version: 2, updatedAt: '2025-05-01T10:00:00.000Z' }
    const { wrapper, fetchMock } = await open('/channels/1/puzzles/42', {
      'GET /api/channels/1/puzzles/42': jsonResponse(200, recordFixture({ outlineCount: 1 })),
      'GET /api/channels/1/puzzles/42/outlines': jsonResponse(200, [summary]),
      'DELETE /api/channels/1/outlines/9': () => new Response(null, { status: 204 }),
    })
    const deletes = () => fetchMock.mock.calls.filter(([, init]) => init?.method === 'DELETE')

    await wrapper.find('button[aria-label="Delete Take 1…"]').trigger('click')
    expect(wrapper.text()).toContain('Delete “Take 1” and its edits?')
    await wrapper.findAll('button').find((b) => b.text() === 'Keep')!.trigger('click')
    expect(deletes()).toHaveLength(0)

    await wrapper.find('button[aria-label="Delete Take 1…"]').trigger('click')
    await wrapper.find('button[aria-label="Delete Take 1 for good"]').trigger('click')
    await flushPromises()
    expect(deletes().map(([url]) => String(url))).toEqual(['/api/channels/1/outlines/9'])
  })
})

/** The smallest outline record the shared schema accepts. */
function outlineRecordStub(o: { id: number; puzzleId: number; name: string }) {
  const step = {
    technique: 'naked-single',
    placements: [{ cell: 2, digit: 4 }],
    eliminations: [],
    focus: [2],
    reason: { houses: [], thermometers: [], cells: [] },
    facts: { kind: 'single-cell', cell: 2, digit: 4, seen: { row: [5, 3, 7], column: [8], box: [6, 9, 1, 2], thermometer: [] } },
    difficulty: 1,
    marks: [],
    text: 'r1c3 can only be 4',
  }
  return {
    ...o,
    status: 'solved',
    stepCount: 1,
    totalMs: 3000,
    version: 1,
    updatedAt: '2025-05-01T10:00:00.000Z',
    outline: {
      version: 1,
      title: 'Morning climb',
      pace: 170,
      names: 'words',
      status: 'solved',
      puzzle: { givens: UNIQUE, thermometers: [] },
      steps: [step],
      lines: [{ id: 1, kind: 'step', steps: [0], text: 'This cell can only be a 4.', edited: false, hidden: false, phrasing: 0, estMs: 3000 }],
      chapters: [{ lineId: 1, title: 'Break-in', edited: false }],
    },
  }
}
