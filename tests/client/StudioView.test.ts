import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { TECHNIQUES } from '@shared/engine'
import type { Outline } from '@shared/script'
import App from '@/App.vue'
import { localCopyKey } from '@/composables/useAutosave'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { jsonResponse, membership, mockApi, mountAt, saveSession, sessionFixture } from './support'

const PATH = '/channels/12/outlines/31'

function serve(doc: Outline, role: 'presenter' | 'viewer' = 'presenter') {
  saveSession()
  return mockApi({
    'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships: [membership(12, role)] }),
    'GET /api/channels/12/outlines/31': jsonResponse(200, recordFor(doc)),
  })
}

describe('StudioView', { timeout: 20_000 }, () => {
  beforeEach(() => {
    localStorage.clear()
    document.body.innerHTML = ''
  })
  afterEach(() => vi.unstubAllGlobals())

  it('should replay the step in the URL with its kind of step in plain words, then the trade term', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    const { wrapper, router } = await mountAt(App, `${PATH}?step=5`)
    await flushPromises()
    expect(router.currentRoute.value.name).toBe('studio')
    const step = doc.steps[4]
    const head = wrapper.find('.step-head').text()
    expect(head).toContain(`Step 5 of ${doc.steps.length}`)
    expect(head).toContain(`${TECHNIQUES[step.technique].plainName} (${TECHNIQUES[step.technique].tradeTerm})`)
    expect(wrapper.find('[role="grid"]').attributes('aria-label')).toBe('Grid after step 5')
    // The line that says step 5 is the current one in the script, and on the ribbon.
    const line = doc.lines.find((l) => l.steps.includes(4))!
    expect(wrapper.find(`article[data-line="${line.id}"]`).attributes('aria-current')).toBe('step')
    expect(wrapper.find(`.ribbon button[data-line="${line.id}"]`).attributes('aria-current')).toBe('step')
    expect(wrapper.find('[data-testid="save-status"]').text()).toBe('Saved')
    wrapper.unmount()
  })

  it('should open the other outline when the address moves from one studio to another', async () => {
    const first = outlineFor('PE01')
    const second = outlineFor('PE02')
    saveSession()
    mockApi({
      'GET /api/auth/me': jsonResponse(200, { user: sessionFixture().user, memberships: [membership(12, 'presenter')] }),
      'GET /api/channels/12/outlines/31': jsonResponse(200, recordFor(first)),
      'GET /api/channels/12/outlines/32': jsonResponse(200, recordFor(second, { id: 32, name: 'Second take' })),
    })
    const { wrapper, router } = await mountAt(App, PATH)
    await flushPromises()
    const firstIntro = (wrapper.find('article.line textarea').element as HTMLTextAreaElement).value
    await router.push('/channels/12/outlines/32')
    await flushPromises()
    await vi.waitFor(() => expect(wrapper.text()).toContain('Second take'))
    expect((wrapper.find('article.line textarea').element as HTMLTextAreaElement).value).toBe(second.lines[0].text)
    expect(second.lines[0].text).not.toBe(firstIntro)
    wrapper.unmount()
  })

  it('should jump to a line’s first step when its ribbon block is clicked', async () => {
    const doc = outlineFor('PE01')
    serve(doc)
    const { wrapper } = await mountAt(App, PATH)
    await flushPromises()
    const target = doc.lines.find((l) => l.kind === 'step' && l.steps[0] > 10)!
    await wrapper.find(`.ribbon button[data-line="${target.id}"]`).trigger('click')
    expect(wrapper.find('.step-head').text()).toContain(`Step ${target.steps[0] + 1} of`)
    wrapper.unmount()
  })

  it('should say where a stuck path stops and show every empty cell’s candidates there', async () => {
    const doc = outlineFor('PE01', { stopAfter: 12 })
    serve(doc)
    const { wrapper } = await mountAt(App, PATH)
    await flushPromises()
    expect(wrapper.text()).toContain("The engine's path stops after step 12")

    const show = wrapper.findAll('button').find((b) => b.text() === 'Show where it stops')!
    await show.trigger('click')
    const head = wrapper.find('.step-head').text()
    expect(head).toContain('The path stops here.')
    const empty = wrapper.findAll('[role="gridcell"]').filter((c) => c.attributes('aria-label')?.includes('empty'))
    expect(empty.length).toBeGreaterThan(0)
    expect(empty.every((c) => c.attributes('aria-label')?.includes('candidates'))).toBe(true)
    wrapper.unmount()
  })

  it('should put back unsaved edits kept in this browser and offer to discard them', async () => {
    const doc = outlineFor('PE01')
    const mine = { ...doc, lines: doc.lines.map((l, i) => (i === 1 ? { ...l, text: 'Kept from before the reload.', edited: true } : l)) }
    localStorage.setItem(localCopyKey(31), JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: mine }))
    serve(doc)
    const { wrapper } = await mountAt(App, PATH)
    await flushPromises()
    const area = wrapper.find(`article[data-line="${doc.lines[1].id}"] textarea`).element as HTMLTextAreaElement
    expect(area.value).toBe('Kept from before the reload.')
    expect(wrapper.find('[data-testid="save-status"]').text()).toBe('Unsaved changes')

    await wrapper.findAll('button').find((b) => b.text() === 'Discard them')!.trigger('click')
    await flushPromises()
    expect(area.value).toBe(doc.lines[1].text)
    expect(wrapper.find('[data-testid="save-status"]').text()).toBe('Saved')
    wrapper.unmount()
  })

  it('should keep viewers out of the Studio', async () => {
    serve(outlineFor('PE01'), 'viewer')
    const { router, wrapper } = await mountAt(App, PATH)
    expect(router.currentRoute.value.name).toBe('home')
    wrapper.unmount()
  })
})
