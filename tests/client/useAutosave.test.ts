import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import type { Outline } from '@shared/script'
import type { OutlineRecord } from '@shared/schemas/studio'
import { getOutline, saveOutline } from '@/api/outlines'
import StudioConflictDialog from '@/components/StudioConflictDialog.vue'
import { localCopyKey, useAutosave } from '@/composables/useAutosave'
import type { Autosave, LocalCopy } from '@/composables/useAutosave'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { jsonResponse, mockApi } from './support'

const CHANNEL = 1
const OUTLINE_ID = 31
const URL = `/api/channels/${CHANNEL}/outlines/${OUTLINE_ID}`
const KEY = localCopyKey(OUTLINE_ID)

// The Studio's wiring of saving: the editor's outline, the real API module, and the conflict dialog.
function mountAutosave(record: OutlineRecord) {
  let editor!: OutlineEditor
  let autosave!: Autosave
  const Harness = defineComponent({
    setup() {
      editor = useOutlineEditor()
      autosave = useAutosave({
        outlineId: OUTLINE_ID,
        outline: editor.outline,
        save: (version, outline) => saveOutline(CHANNEL, OUTLINE_ID, { version, outline }),
        fetchCurrent: () => getOutline(CHANNEL, OUTLINE_ID),
        replace: editor.replace,
      })
      editor.load(autosave.start(record))
      return () =>
        h('div', [
          h('p', { 'data-testid': 'status' }, autosave.label.value),
          h(StudioConflictDialog, {
            visible: autosave.conflict.value !== null,
            mine: autosave.conflict.value?.mine ?? null,
            theirs: autosave.conflict.value?.theirs.outline ?? null,
            theirsLabel: `version ${autosave.conflict.value?.theirs.version}`,
            onKeepMine: () => void autosave.keepMine(),
            onTakeTheirs: autosave.takeTheirs,
          }),
        ])
    },
  })
  const wrapper = mount(Harness, { attachTo: document.body, global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
  return { wrapper, editor, autosave, status: () => wrapper.find('[data-testid="status"]').text() }
}

function localCopy(): LocalCopy | null {
  const raw = localStorage.getItem(KEY)
  return raw === null ? null : (JSON.parse(raw) as LocalCopy)
}

function retext(doc: Outline, index: number, text: string): Outline {
  return { ...doc, lines: doc.lines.map((l, i) => (i === index ? { ...l, text, edited: true } : l)) }
}

/** PATCH answers with the saved outline at the next version; the bodies sent are kept. */
function acceptSaves(startVersion = 3) {
  const sent: { version: number; outline: Outline }[] = []
  let version = startVersion
  const fetchMock = mockApi({
    [`PATCH ${URL}`]: (_url, init) => {
      const body = JSON.parse(String(init.body)) as { version: number; outline: Outline }
      sent.push(body)
      version = body.version + 1
      return jsonResponse(200, recordFor(body.outline, { version }))
    },
  })
  return { sent, fetchMock }
}

/** PATCH requests wait until the test answers the latest one; the bodies sent are kept. */
function holdSaves() {
  const sent: { version: number; outline: Outline }[] = []
  let resolveLatest!: (r: Response) => void
  mockApi({
    [`PATCH ${URL}`]: (_url, init) => {
      sent.push(JSON.parse(String(init.body)))
      return new Promise<Response>((resolve) => (resolveLatest = resolve))
    },
  })
  return { sent, answer: (response: Response) => resolveLatest(response) }
}

describe('useAutosave', () => {
  let doc: Outline
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
    localStorage.clear()
    document.body.innerHTML = ''
    doc = outlineFor('PE01')
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.unstubAllGlobals()
  })

  it('should save about a second after the last edit, sending the version it read', async () => {
    const { sent } = acceptSaves()
    const { editor, autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    expect(status()).toBe('Saved')

    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(600)
    editor.apply({ op: 'editLineText', lineId: doc.lines[4].id, text: 'And that gives us the 9.' })
    await vi.advanceTimersByTimeAsync(900)
    expect(status()).toBe('Unsaved changes')
    expect(sent).toHaveLength(0)

    await vi.advanceTimersByTimeAsync(200)
    await flushPromises()
    expect(sent).toHaveLength(1)
    expect(sent[0].version).toBe(3)
    expect(sent[0].outline.lines[3].hidden).toBe(true)
    expect(sent[0].outline.lines[4].text).toBe('And that gives us the 9.')
    expect(status()).toBe('Saved')
    expect(autosave.version.value).toBe(4)

    // The next save is based on the version the server just handed back.
    editor.apply({ op: 'showLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1100)
    await flushPromises()
    expect(sent.map((b) => b.version)).toEqual([3, 4])
    wrapper.unmount()
  })

  it('should re-base the local copy on our own save when edits arrive while it is on its way', async () => {
    const { sent, answer } = holdSaves()
    const { editor, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1000)
    editor.apply({ op: 'hideLine', lineId: doc.lines[4].id })
    await flushPromises()
    answer(jsonResponse(200, recordFor(sent[0].outline, { version: 4 })))
    await flushPromises()
    // a reload now must not take version 4 (our own save) for someone else's
    expect(localCopy()).toMatchObject({ baseVersion: 4 })
    expect(localCopy()!.outline.lines[4].hidden).toBe(true)
    wrapper.unmount()
  })

  it('should retry a server error but not a refusal such as a deleted outline', async () => {
    let answers = [jsonResponse(503, { code: 'engine-busy', message: 'Busy' }), jsonResponse(404, { code: 'not-found', message: 'Outline not found' })]
    const fetchMock = mockApi({ [`PATCH ${URL}`]: () => answers.shift()! })
    const { editor, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(fetchMock).toHaveBeenCalledTimes(1)
    await vi.advanceTimersByTimeAsync(10_000)
    await flushPromises()
    expect(fetchMock).toHaveBeenCalledTimes(2)
    expect(status()).toBe('Unsaved changes')
    answers = []
    await vi.advanceTimersByTimeAsync(60_000)
    await flushPromises()
    expect(fetchMock).toHaveBeenCalledTimes(2)
    expect(localCopy()!.outline.lines[3].hidden).toBe(true)
    wrapper.unmount()
  })

  it('should keep a local copy until the server has the outline, showing "Saving…" meanwhile', async () => {
    const { sent, answer } = holdSaves()
    const { editor, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'renameChapter', lineId: doc.chapters[0].lineId, title: 'How it works' })
    await flushPromises()
    expect(localCopy()).toMatchObject({ baseVersion: 3 })
    expect(localCopy()!.outline.chapters[0].title).toBe('How it works')

    await vi.advanceTimersByTimeAsync(1000)
    expect(status()).toBe('Saving…')
    expect(localCopy()).not.toBeNull()

    answer(jsonResponse(200, recordFor(sent[0].outline, { version: 4 })))
    await flushPromises()
    expect(status()).toBe('Saved')
    expect(localCopy()).toBeNull()
    wrapper.unmount()
  })

  it('should keep the local copy and try again when a save fails', async () => {
    let failing = true
    const sent: number[] = []
    mockApi({
      [`PATCH ${URL}`]: (_url, init) => {
        const body = JSON.parse(String(init.body)) as { version: number; outline: Outline }
        sent.push(body.version)
        return failing ? jsonResponse(503, { code: 'unavailable', message: 'Try again soon.' }) : jsonResponse(200, recordFor(body.outline, { version: 4 }))
      },
    })
    const { editor, autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'setPace', pace: 175 })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toBe('Unsaved changes')
    expect(autosave.lastError.value).toBe('Try again soon.')
    expect(localCopy()!.outline.pace).toBe(175)

    failing = false
    await vi.advanceTimersByTimeAsync(5000)
    await flushPromises()
    expect(sent).toEqual([3, 3])
    expect(status()).toBe('Saved')
    expect(localCopy()).toBeNull()
    wrapper.unmount()
  })

  it('should put back a local copy newer than the server copy and offer to discard it', async () => {
    const { sent } = acceptSaves()
    const mine = retext(doc, 2, 'Words I typed before the browser closed.')
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: mine } satisfies LocalCopy))

    const { editor, autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    expect(editor.outline.value!.lines[2].text).toBe('Words I typed before the browser closed.')
    expect(autosave.restoredFrom.value).toBe('2025-03-01T10:05:00.000Z')
    expect(status()).toBe('Unsaved changes')

    autosave.discardRestored()
    await flushPromises()
    expect(editor.outline.value).toEqual(doc)
    expect(autosave.restoredFrom.value).toBeNull()
    expect(localCopy()).toBeNull()
    expect(status()).toBe('Saved')
    await vi.advanceTimersByTimeAsync(1500)
    expect(sent).toHaveLength(0)
    wrapper.unmount()
  })

  it('should drop a local copy that matches the server copy', () => {
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: doc } satisfies LocalCopy))
    const { autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    expect(autosave.restoredFrom.value).toBeNull()
    expect(status()).toBe('Saved')
    expect(localCopy()).toBeNull()
    wrapper.unmount()
  })

  it('should open the conflict at once when the local copy is based on an older version', async () => {
    acceptSaves(5)
    const mine = retext(doc, 2, 'My words from last night.')
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 2, savedAt: '2025-03-01T09:00:00.000Z', outline: mine } satisfies LocalCopy))
    const theirs = retext(doc, 2, 'The editor changed this line.')
    const { autosave, status, wrapper } = mountAutosave(recordFor(theirs, { version: 5 }))
    await flushPromises()
    expect(status()).toBe('Conflict')
    expect(autosave.conflict.value?.mine.lines[2].text).toBe('My words from last night.')
    expect(document.body.textContent).toContain('The editor changed this line.')
    wrapper.unmount()
  })

  it('should turn a 409 into a conflict that shows both versions, and save mine over the newer version', async () => {
    const theirsDoc = retext(doc, 5, 'The editor rewrote this line.')
    const theirs = recordFor(theirsDoc, { version: 4 })
    const sent: { version: number; outline: Outline }[] = []
    mockApi({
      [`PATCH ${URL}`]: (_url, init) => {
        const body = JSON.parse(String(init.body)) as { version: number; outline: Outline }
        sent.push(body)
        if (body.version === 3) return jsonResponse(409, { code: 'stale', message: 'Someone saved first.', details: { current: theirs } })
        return jsonResponse(200, recordFor(body.outline, { version: body.version + 1 }))
      },
      [`GET ${URL}`]: jsonResponse(200, theirs),
    })
    const { editor, autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[5].id, text: 'My own take on this line.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()

    expect(status()).toBe('Conflict')
    const dialog = document.body.querySelector('[role="dialog"]')!
    expect(dialog.textContent).toContain('Someone else saved this outline')
    const row = Array.from(dialog.querySelectorAll('tbody tr')).find((tr) => tr.textContent?.includes('Line 6'))!
    const cells = Array.from(row.querySelectorAll('td')).map((td) => td.textContent)
    expect(cells).toHaveLength(2)
    expect(cells[0]).toContain('My own take on this line.')
    expect(cells[1]).toContain('The editor rewrote this line.')
    // Nothing is saved behind the person's back while the conflict is open.
    await vi.advanceTimersByTimeAsync(10_000)
    expect(sent).toHaveLength(1)

    const keep = Array.from(dialog.querySelectorAll('button')).find((b) => b.textContent?.includes('Keep my version'))!
    keep.click()
    await flushPromises()
    expect(sent).toHaveLength(2)
    expect(sent[1].version).toBe(4)
    expect(sent[1].outline.lines[5].text).toBe('My own take on this line.')
    expect(status()).toBe('Saved')
    expect(autosave.version.value).toBe(5)
    expect(localCopy()).toBeNull()
    wrapper.unmount()
  })

  it("should take the server's version when asked, dropping the local copy", async () => {
    const theirsDoc = retext(doc, 5, 'The editor rewrote this line.')
    const theirs = recordFor(theirsDoc, { version: 4 })
    mockApi({
      // No copy in the body: the client fetches it.
      [`PATCH ${URL}`]: jsonResponse(409, { code: 'stale', message: 'Someone saved first.' }),
      [`GET ${URL}`]: jsonResponse(200, theirs),
    })
    const { editor, autosave, status, wrapper } = mountAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[5].id, text: 'My own take on this line.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toBe('Conflict')

    const dialog = document.body.querySelector('[role="dialog"]')!
    const take = Array.from(dialog.querySelectorAll('button')).find((b) => b.textContent?.includes('Use the saved version'))!
    take.click()
    await flushPromises()
    expect(editor.outline.value!.lines[5].text).toBe('The editor rewrote this line.')
    expect(autosave.version.value).toBe(4)
    expect(status()).toBe('Saved')
    expect(localCopy()).toBeNull()
    wrapper.unmount()
  })
})
