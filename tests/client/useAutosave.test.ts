import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { render, screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { flushPromises } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import type { Outline } from '@shared/script'
import { scriptOf, type OutlineScript } from '@shared/schemas/outline'
import type { OutlineRecord, OutlineSummary } from '@shared/schemas/studio'
import { saveOutline } from '@/api/outlines'
import StudioConflictDialog from '@/components/StudioConflictDialog.vue'
import StudioSaveStatus from '@/components/StudioSaveStatus.vue'
import { localCopyKey, useAutosave } from '@/composables/useAutosave'
import type { Autosave, AutosaveOptions, LocalCopy } from '@/composables/useAutosave'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor, recordFor } from '../helpers/studio-outline'
import { api, apiPath, http, HttpResponse } from './msw'
import './render'

const CHANNEL = 1
const OUTLINE_ID = 31
const OUTLINE_URL = apiPath(`/channels/${CHANNEL}/outlines/${OUTLINE_ID}`)
const USER_ID = 7
const KEY = localCopyKey(OUTLINE_ID, USER_ID)

interface SentSave {
  version: number
  script: OutlineScript
}

/** What the server answers a save: the summary of what it now holds, never the document. */
const savedSummary = (version: number): OutlineSummary => ({
  id: OUTLINE_ID,
  puzzleId: 4,
  name: 'First take',
  status: 'solved',
  stepCount: 10,
  totalMs: 0,
  version,
  puzzleVersion: 1,
  savedBy: { id: 7, name: 'Priya Castellanos' },
  updatedAt: '2025-03-01T10:05:00.000Z',
})

// The Studio's wiring of saving: the editor's outline, the real API module, the save status and the conflict dialog.
function renderAutosave(record: OutlineRecord, tuning: Pick<AutosaveOptions, 'retryMs' | 'maxRetryMs' | 'onSaved'> = {}) {
  let editor!: OutlineEditor
  let autosave!: Autosave
  const Harness = defineComponent({
    setup() {
      editor = useOutlineEditor()
      autosave = useAutosave({
        outlineId: OUTLINE_ID,
        userId: USER_ID,
        outline: editor.outline,
        save: (version, outline) => saveOutline(CHANNEL, OUTLINE_ID, { version, script: scriptOf(outline) }),
        replace: editor.replace,
        ...tuning,
      })
      editor.load(autosave.start(record))
      return () =>
        h('div', [
          h(StudioSaveStatus, {
            status: autosave.status.value,
            label: autosave.label.value,
            error: autosave.lastError.value,
            onSaveNow: () => void autosave.saveNow(),
          }),
          h(StudioConflictDialog, {
            visible: autosave.conflict.value !== null,
            mine: autosave.conflict.value?.mine ?? null,
            theirs: autosave.conflict.value?.theirs ?? null,
            merge: autosave.conflict.value?.merge ?? null,
            onSettle: autosave.settle,
            onKeepMine: () => void autosave.keepMine(),
            onTakeTheirs: autosave.takeTheirs,
          }),
        ])
    },
  })
  const view = render(Harness, { global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
  return { view, editor, autosave }
}

const status = () => screen.getByRole('status')
const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

function localCopy(): LocalCopy | null {
  const raw = localStorage.getItem(KEY)
  return raw === null ? null : (JSON.parse(raw) as LocalCopy)
}

function retext(doc: Outline, index: number, text: string): Outline {
  return { ...doc, lines: doc.lines.map((l, i) => (i === index ? { ...l, text, edited: true } : l)) }
}

/** The server takes every save and answers with the next version; the bodies sent are kept. */
function acceptSaves(): SentSave[] {
  const sent: SentSave[] = []
  api.use(
    http.patch(OUTLINE_URL, async ({ request }) => {
      const body = (await request.json()) as SentSave
      sent.push(body)
      return HttpResponse.json(savedSummary(body.version + 1))
    }),
  )
  return sent
}

/** Saves wait until the test answers the latest one; the bodies sent are kept. */
function holdSaves() {
  const sent: SentSave[] = []
  let answerLatest!: (response: Response) => void
  api.use(
    http.patch(OUTLINE_URL, async ({ request }) => {
      sent.push((await request.json()) as SentSave)
      return new Promise<Response>((resolve) => (answerLatest = resolve))
    }),
  )
  return { sent, answer: (response: Response) => answerLatest(response) }
}

/** Answers saves from a list, one each, in order; counts the requests. */
function answerSavesWith(answers: (() => Response)[]): { count: number } {
  const seen = { count: 0 }
  api.use(
    http.patch(OUTLINE_URL, () => {
      seen.count++
      return answers.shift()?.() ?? HttpResponse.json({ code: 'test', message: 'No answer left' }, { status: 418 })
    }),
  )
  return seen
}

describe('useAutosave', () => {
  let doc: Outline
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })
    localStorage.clear()
    doc = outlineFor('PE01')
  })
  afterEach(() => {
    vi.useRealTimers()
  })

  it('should hand on the record the server now holds: the summary it answered with the outline that was sent', async () => {
    acceptSaves()
    const onSaved = vi.fn()
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }), { onSaved })
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1100)
    await flushPromises()
    expect(onSaved).toHaveBeenCalledExactlyOnceWith({ ...savedSummary(4), outline: editor.outline.value })
    expect(onSaved.mock.calls[0][0].outline.lines[3].hidden).toBe(true)
  })

  it('should save about a second after the last edit, sending the version it read', async () => {
    const sent = acceptSaves()
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    expect(status()).toHaveTextContent(/^Saved$/)

    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(600)
    editor.apply({ op: 'editLineText', lineId: doc.lines[4].id, text: 'And that gives us the 9.' })
    await vi.advanceTimersByTimeAsync(900)
    expect(status()).toHaveTextContent(/^Unsaved changes/)
    expect(sent).toHaveLength(0)

    await vi.advanceTimersByTimeAsync(200)
    await flushPromises()
    expect(sent).toHaveLength(1)
    expect(sent[0].version).toBe(3)
    expect(sent[0].script.lines[3].hidden).toBe(true)
    expect(sent[0].script.lines[4].text).toBe('And that gives us the 9.')
    // only what a person edits travels: the engine's steps stay on the server
    expect(Object.keys(sent[0]).sort()).toEqual(['script', 'version'])
    expect(sent[0].script).not.toHaveProperty('steps')
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(autosave.version.value).toBe(4)

    // The next save is based on the version the server just handed back.
    editor.apply({ op: 'showLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1100)
    await flushPromises()
    expect(sent.map((b) => b.version)).toEqual([3, 4])
  })

  it('should save at once when "Save now" is pressed', async () => {
    const sent = acceptSaves()
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await flushPromises()

    await user().click(screen.getByRole('button', { name: 'Save now' }))
    await flushPromises()
    expect(sent).toHaveLength(1)
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(screen.queryByRole('button', { name: 'Save now' })).not.toBeInTheDocument()
  })

  it('should re-base the local copy on our own save when edits arrive while it is on its way', async () => {
    const { answer } = holdSaves()
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1000)
    editor.apply({ op: 'hideLine', lineId: doc.lines[4].id })
    await flushPromises()
    answer(HttpResponse.json(savedSummary(4)))
    await flushPromises()
    // a reload now must not take version 4 (our own save) for someone else's
    expect(localCopy()).toMatchObject({ baseVersion: 4 })
    expect(localCopy()!.outline.lines[4].hidden).toBe(true)
  })

  it('should retry a server error but not a refusal such as a deleted outline', async () => {
    const requests = answerSavesWith([
      () => HttpResponse.json({ code: 'engine-busy', message: 'Busy' }, { status: 503 }),
      () => HttpResponse.json({ code: 'not-found', message: 'Outline not found' }, { status: 404 }),
    ])
    const { view, editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(requests.count).toBe(1)
    await vi.advanceTimersByTimeAsync(10_000)
    await flushPromises()
    expect(requests.count).toBe(2)
    expect(status()).toHaveTextContent('Unsaved changes— Outline not found')
    await vi.advanceTimersByTimeAsync(60_000)
    await flushPromises()
    expect(requests.count).toBe(2)
    expect(localCopy()!.outline.lines[3].hidden).toBe(true)
    // leaving the screen still hands the edits over once, while the handlers are in place
    view.unmount()
    await flushPromises()
  })

  it('should keep a local copy until the server has the outline, showing "Saving…" meanwhile', async () => {
    const { answer } = holdSaves()
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'renameChapter', lineId: doc.chapters[0].lineId, title: 'How it works' })
    await flushPromises()
    expect(localCopy()).toMatchObject({ baseVersion: 3 })
    expect(localCopy()!.outline.chapters[0].title).toBe('How it works')

    await vi.advanceTimersByTimeAsync(1000)
    expect(status()).toHaveTextContent(/^Saving…$/)
    expect(localCopy()).not.toBeNull()

    answer(HttpResponse.json(savedSummary(4)))
    await flushPromises()
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(localCopy()).toBeNull()
  })

  it('should keep the local copy and try again after a server error, showing its message', async () => {
    let failing = true
    const sent: number[] = []
    api.use(
      http.patch(OUTLINE_URL, async ({ request }) => {
        const body = (await request.json()) as SentSave
        sent.push(body.version)
        return failing
          ? HttpResponse.json({ code: 'engine-busy', message: 'Try again soon.' }, { status: 503 })
          : HttpResponse.json(savedSummary(4))
      }),
    )
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'setPace', pace: 175 })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toHaveTextContent('Not saved — the server had a problem, kept in this browser; retrying…— Try again soon.')
    expect(localCopy()!.outline.pace).toBe(175)

    failing = false
    // the first new try comes within retryMs (2 s by default)
    await vi.advanceTimersByTimeAsync(2000)
    await flushPromises()
    expect(sent).toEqual([3, 3])
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(localCopy()).toBeNull()
  })

  describe('while the database is unavailable (503 database-unavailable)', () => {
    const NOT_STORED = "The database is unavailable; this change was not saved — it is kept in this browser and will be sent when it's back."
    const WAITING = 'Not saved — database unavailable, kept in this browser; retrying…'

    /** Saves answer 503 database-unavailable until `back()` (and again after `gone()`); every body sent is kept. */
    function databaseAway() {
      const sent: SentSave[] = []
      let away = true
      api.use(
        http.patch(OUTLINE_URL, async ({ request }) => {
          const body = (await request.json()) as SentSave
          sent.push(body)
          return away
            ? HttpResponse.json({ code: 'database-unavailable', message: NOT_STORED }, { status: 503 })
            : HttpResponse.json(savedSummary(body.version + 1))
        }),
      )
      return { sent, back: () => (away = false), gone: () => (away = true) }
    }

    /** Moves the fake clock by `ms` and lets the answers that come due arrive. */
    async function wait(ms: number) {
      await vi.advanceTimersByTimeAsync(ms)
      await flushPromises()
    }

    beforeEach(() => {
      // each wait is then exactly three quarters of its ceiling (the rest of the spread is random)
      vi.spyOn(Math, 'random').mockReturnValue(0.5)
    })
    afterEach(() => {
      vi.restoreAllMocks()
    })

    it('should say the change is kept in this browser, keep the local copy, and send it once the database is back', async () => {
      const { sent, back } = databaseAway()
      const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
      editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(1000)

      expect(sent).toHaveLength(1)
      expect(status()).toHaveTextContent(new RegExp(`^${WAITING}Try now$`))
      expect(localCopy()).toMatchObject({ baseVersion: 3 })
      expect(localCopy()!.outline.lines[3].hidden).toBe(true)

      await wait(1500)
      expect(sent).toHaveLength(2)
      expect(status()).toHaveTextContent(WAITING)

      back()
      await wait(3000)
      expect(sent.map((b) => b.version)).toEqual([3, 3, 3])
      expect(status()).toHaveTextContent(/^Saved$/)
      expect(localCopy()).toBeNull()
    })

    it('should wait longer after each failure, up to the longest wait, and start over once a save lands', async () => {
      const { sent, back, gone } = databaseAway()
      const { editor } = renderAutosave(recordFor(doc, { version: 3 }), { retryMs: 2000, maxRetryMs: 5000 })
      editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(1000)
      // ceilings 2 s, 4 s, then 5 s (the longest), each wait three quarters of it here
      for (const expected of [1500, 3000, 3750, 3750]) {
        const before = sent.length
        await wait(expected - 1)
        expect(sent).toHaveLength(before)
        await wait(1)
        expect(sent).toHaveLength(before + 1)
      }

      back()
      await wait(3750)
      expect(status()).toHaveTextContent(/^Saved$/)

      // the next outage starts again from the first, short wait
      gone()
      editor.apply({ op: 'showLine', lineId: doc.lines[3].id })
      await wait(1000)
      expect(status()).toHaveTextContent(WAITING)
      const failed = sent.length
      await wait(1499)
      expect(sent).toHaveLength(failed)
      await wait(1)
      expect(sent).toHaveLength(failed + 1)
    })

    it('should send the newest edits with the next try, without trying sooner because of them', async () => {
      const { sent, back } = databaseAway()
      const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
      editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(1000)
      expect(sent).toHaveLength(1)

      await wait(100)
      editor.apply({ op: 'editLineText', lineId: doc.lines[4].id, text: 'Typed while the database was away.' })
      await flushPromises()
      expect(localCopy()!.outline.lines[4].text).toBe('Typed while the database was away.')
      expect(status()).toHaveTextContent(WAITING)
      back()
      // an edit would save a second after it (1.1 s); the pending try is due at 1.5 s
      await wait(1399)
      expect(sent).toHaveLength(1)
      await wait(1)
      expect(sent).toHaveLength(2)
      expect(sent[1].script.lines[3].hidden).toBe(true)
      expect(sent[1].script.lines[4].text).toBe('Typed while the database was away.')
      expect(status()).toHaveTextContent(/^Saved$/)
    })

    it('should try at once when "Try now" is pressed', async () => {
      const { sent, back } = databaseAway()
      const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
      editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(1000)
      back()

      await user().click(screen.getByRole('button', { name: 'Try now' }))
      await flushPromises()
      expect(sent).toHaveLength(2)
      expect(status()).toHaveTextContent(/^Saved$/)
    })

    it('should recognise its own save when the answer was lost after the server stored it, instead of calling it a conflict', async () => {
      // the server stores the first save as version 4, but the answer never arrives (503 after COMMIT); the
      // retry, still on version 3, is then stale against a copy that is exactly what this browser sent
      const sent: SentSave[] = []
      let stored: OutlineRecord | null = null
      api.use(
        http.patch(OUTLINE_URL, async ({ request }) => {
          const body = (await request.json()) as SentSave
          sent.push(body)
          if (!stored) {
            stored = recordFor({ ...doc, ...body.script }, { version: 4 })
            return HttpResponse.json({ code: 'database-unavailable', message: NOT_STORED }, { status: 503 })
          }
          return HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details: { current: stored } }, { status: 409 })
        }),
      )
      const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
      editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(1000)
      expect(status()).toHaveTextContent(WAITING)

      await wait(1500)
      expect(sent.map((b) => b.version)).toEqual([3, 3])
      expect(screen.queryByRole('dialog')).toBeNull()
      expect(status()).toHaveTextContent(/^Saved$/)
      expect(autosave.version.value).toBe(4)
      expect(localCopy()).toBeNull()
    })

    it('should still call it a conflict when the newer copy changed the same line differently', async () => {
      const sent: SentSave[] = []
      api.use(
        http.patch(OUTLINE_URL, async ({ request }) => {
          sent.push((await request.json()) as SentSave)
          if (sent.length === 1) return HttpResponse.json({ code: 'database-unavailable', message: NOT_STORED }, { status: 503 })
          const theirs = recordFor(retext(doc, 3, 'The editor rewrote this line.'), { version: 4 })
          return HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details: { current: theirs } }, { status: 409 })
        }),
      )
      renderAutosave(recordFor(doc, { version: 3 }))
        .editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
      await wait(2500)
      expect(sent).toHaveLength(2)
      expect(status()).toHaveTextContent(/^Conflict$/)
    })
  })

  it("should retry while Gridcue can't be reached, saying so", async () => {
    let offline = true
    const sent: number[] = []
    api.use(
      http.patch(OUTLINE_URL, async ({ request }) => {
        const body = (await request.json()) as SentSave
        sent.push(body.version)
        return offline ? HttpResponse.error() : HttpResponse.json(savedSummary(4))
      }),
    )
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'setPace', pace: 175 })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toHaveTextContent(/^Not saved — can't reach Gridcue, kept in this browser; retrying…Try now$/)
    expect(localCopy()!.outline.pace).toBe(175)

    offline = false
    await vi.advanceTimersByTimeAsync(2000)
    await flushPromises()
    expect(sent).toEqual([3, 3])
    expect(status()).toHaveTextContent(/^Saved$/)
  })

  it('should ask before the tab closes while edits are not saved, and not once they are', async () => {
    const { answer } = holdSaves()
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    const closing = () => {
      const event = new Event('beforeunload', { cancelable: true })
      window.dispatchEvent(event)
      return event.defaultPrevented
    }
    expect(closing()).toBe(false)

    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await flushPromises()
    expect(closing()).toBe(true)
    await vi.advanceTimersByTimeAsync(1000)
    expect(closing()).toBe(true)

    answer(HttpResponse.json(savedSummary(4)))
    await flushPromises()
    expect(closing()).toBe(false)
  })

  it('should send a pending save when the screen goes away instead of dropping it', async () => {
    const sent = acceptSaves()
    const { view, editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await flushPromises()
    expect(sent).toHaveLength(0)

    view.unmount()
    await flushPromises()
    expect(sent).toHaveLength(1)
    expect(sent[0].script.lines[3].hidden).toBe(true)
    expect(localCopy()).toBeNull()
  })

  it('should put back a local copy newer than the server copy and offer to discard it', async () => {
    const sent = acceptSaves()
    const mine = retext(doc, 2, 'Words I typed before the browser closed.')
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: mine } satisfies LocalCopy))

    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    expect(editor.outline.value!.lines[2].text).toBe('Words I typed before the browser closed.')
    expect(autosave.restoredFrom.value).toBe('2025-03-01T10:05:00.000Z')
    expect(status()).toHaveTextContent(/^Unsaved changes/)

    autosave.discardRestored()
    await flushPromises()
    expect(editor.outline.value).toEqual(doc)
    expect(autosave.restoredFrom.value).toBeNull()
    expect(localCopy()).toBeNull()
    expect(status()).toHaveTextContent(/^Saved$/)
    await vi.advanceTimersByTimeAsync(1500)
    expect(sent).toHaveLength(0)
  })

  it('should drop a local copy that matches the server copy', () => {
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 3, savedAt: '2025-03-01T10:05:00.000Z', outline: doc } satisfies LocalCopy))
    const { autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    expect(autosave.restoredFrom.value).toBeNull()
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(localCopy()).toBeNull()
  })

  it('should open the conflict at once when the local copy is based on an older version', async () => {
    acceptSaves()
    const mine = retext(doc, 2, 'My words from last night.')
    localStorage.setItem(KEY, JSON.stringify({ baseVersion: 2, savedAt: '2025-03-01T09:00:00.000Z', outline: mine } satisfies LocalCopy))
    const theirs = retext(doc, 2, 'The editor changed this line.')
    renderAutosave(recordFor(theirs, { version: 5 }))
    await flushPromises()

    expect(status()).toHaveTextContent(/^Conflict$/)
    const dialog = screen.getByRole('dialog', { name: 'Someone else saved this outline' })
    const row = within(dialog).getByRole('row', { name: /^Line 3 / })
    const [mineCell, theirsCell, ...more] = within(row).getAllByRole('cell')
    expect(more).toHaveLength(0)
    expect(mineCell).toHaveTextContent('My words from last night.')
    expect(theirsCell).toHaveTextContent('The editor changed this line.')
  })

  it('should turn a stale save into a conflict that shows both versions, and save mine over the newer version', async () => {
    const theirs = recordFor(retext(doc, 5, 'The editor rewrote this line.'), { version: 4 })
    const sent: SentSave[] = []
    api.use(
      http.patch(OUTLINE_URL, async ({ request }) => {
        const body = (await request.json()) as SentSave
        sent.push(body)
        // the server's 409 carries its copy under details.current (StaleBody in shared/schemas/studio.ts)
        if (body.version === 3) return HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details: { current: theirs } }, { status: 409 })
        return HttpResponse.json(savedSummary(body.version + 1))
      }),
    )
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[5].id, text: 'My own take on this line.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()

    expect(status()).toHaveTextContent(/^Conflict$/)
    const dialog = screen.getByRole('dialog', { name: 'Someone else saved this outline' })
    expect(dialog).toHaveTextContent(/While you were editing, Priya Castellanos saved .+ \(version 4\)/)
    const row = within(dialog).getByRole('row', { name: /^Line 6 / })
    const [mineCell, theirsCell, ...more] = within(row).getAllByRole('cell')
    expect(more).toHaveLength(0)
    expect(mineCell).toHaveTextContent('My own take on this line.')
    expect(theirsCell).toHaveTextContent('The editor rewrote this line.')
    // Nothing is saved behind the person's back while the conflict is open.
    await vi.advanceTimersByTimeAsync(10_000)
    expect(sent).toHaveLength(1)

    await user().click(within(dialog).getByRole('button', { name: 'Keep my version' }))
    await flushPromises()
    expect(sent).toHaveLength(2)
    expect(sent[1].version).toBe(4)
    expect(sent[1].script.lines[5].text).toBe('My own take on this line.')
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(autosave.version.value).toBe(5)
    expect(localCopy()).toBeNull()
  })

  it('should merge a newer copy that changed other lines without asking, and save both sets of changes over it', async () => {
    const theirs = recordFor(retext(doc, 5, 'The editor rewrote this line.'), { version: 4 })
    const sent: SentSave[] = []
    api.use(
      http.patch(OUTLINE_URL, async ({ request }) => {
        const body = (await request.json()) as SentSave
        sent.push(body)
        if (body.version === 3) return HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details: { current: theirs } }, { status: 409 })
        return HttpResponse.json(savedSummary(body.version + 1))
      }),
    )
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[2].id, text: 'My words on another line.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument()
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()

    expect(sent.map((b) => b.version)).toEqual([3, 4])
    expect(sent[1].script.lines[2].text).toBe('My words on another line.')
    expect(sent[1].script.lines[5].text).toBe('The editor rewrote this line.')
    expect(editor.outline.value!.lines[5].text).toBe('The editor rewrote this line.')
    expect(autosave.version.value).toBe(5)
    expect(status()).toHaveTextContent(/^Saved$/)
  })

  it('should ask only about the line both changed, name who saved it, and save the choices with the rest merged', async () => {
    const twoMinutesAgo = new Date(Date.now() - 120_000).toISOString()
    const theirs = recordFor(retext(retext(doc, 5, 'The editor rewrote this line.'), 6, 'The editor also changed this one.'), { version: 4, updatedAt: twoMinutesAgo })
    const sent: SentSave[] = []
    api.use(
      http.patch(OUTLINE_URL, async ({ request }) => {
        const body = (await request.json()) as SentSave
        sent.push(body)
        if (body.version === 3) return HttpResponse.json({ code: 'stale', message: 'Someone saved first.', details: { current: theirs } }, { status: 409 })
        return HttpResponse.json(savedSummary(body.version + 1))
      }),
    )
    const { editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[5].id, text: 'My own take on this line.' })
    editor.apply({ op: 'editLineText', lineId: doc.lines[2].id, text: 'Only I touched this one.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()

    const dialog = screen.getByRole('dialog', { name: 'Someone else saved this outline' })
    expect(dialog).toHaveTextContent('Priya Castellanos saved 2 minutes ago (version 4)')
    const rows = within(dialog).getAllByRole('row').slice(1)
    expect(rows).toHaveLength(1)
    expect(rows[0]).toHaveAccessibleName(/^Line 6 /)
    await user().click(within(dialog).getByRole('radio', { name: 'Line 6: keep yours' }))
    await user().click(within(dialog).getByRole('button', { name: 'Save with these choices' }))
    await flushPromises()

    expect(sent).toHaveLength(2)
    expect(sent[1].version).toBe(4)
    expect(sent[1].script.lines.slice(2, 7).map((l) => l.text)).toEqual([
      'Only I touched this one.',
      doc.lines[3].text,
      doc.lines[4].text,
      'My own take on this line.',
      'The editor also changed this one.',
    ])
    expect(status()).toHaveTextContent(/^Saved$/)
  })

  it('should merge in a newer copy noticed while editing, keeping the edits being made', async () => {
    const sent = acceptSaves()
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[2].id, text: 'Typed just now.' })
    autosave.receive(recordFor(retext(doc, 5, 'Saved by the editor meanwhile.'), { version: 4 }))
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()

    expect(editor.outline.value!.lines[5].text).toBe('Saved by the editor meanwhile.')
    expect(editor.outline.value!.lines[2].text).toBe('Typed just now.')
    expect(sent.map((b) => b.version)).toEqual([4])
    expect(status()).toHaveTextContent(/^Saved$/)
  })

  it('should simply show a newer copy when nothing here is unsaved', async () => {
    const sent = acceptSaves()
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    autosave.receive(recordFor(retext(doc, 5, 'Saved by the editor meanwhile.'), { version: 4 }))
    await vi.advanceTimersByTimeAsync(2000)
    await flushPromises()
    expect(editor.outline.value!.lines[5].text).toBe('Saved by the editor meanwhile.')
    expect(autosave.version.value).toBe(4)
    expect(sent).toEqual([])
    expect(status()).toHaveTextContent(/^Saved$/)
  })

  it("should take the server's version when asked, dropping the local copy", async () => {
    const theirs = recordFor(retext(doc, 5, 'The editor rewrote this line.'), { version: 4 })
    api.use(
      // No copy in the body: the API layer fetches it.
      http.patch(OUTLINE_URL, () => HttpResponse.json({ code: 'stale', message: 'Someone saved first.' }, { status: 409 })),
      http.get(OUTLINE_URL, () => HttpResponse.json(theirs)),
    )
    const { editor, autosave } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'editLineText', lineId: doc.lines[5].id, text: 'My own take on this line.' })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toHaveTextContent(/^Conflict$/)

    await user().click(screen.getByRole('button', { name: 'Use the saved version' }))
    await flushPromises()
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument()
    expect(editor.outline.value!.lines[5].text).toBe('The editor rewrote this line.')
    expect(autosave.version.value).toBe(4)
    expect(status()).toHaveTextContent(/^Saved$/)
    expect(localCopy()).toBeNull()
  })

  it('should say so and keep the edits when the newer copy behind a stale save cannot be loaded', async () => {
    api.use(
      http.patch(OUTLINE_URL, () => HttpResponse.json({ code: 'stale', message: 'Someone saved first.' }, { status: 409 })),
      http.get(OUTLINE_URL, () => HttpResponse.error()),
    )
    const { view, editor } = renderAutosave(recordFor(doc, { version: 3 }))
    editor.apply({ op: 'hideLine', lineId: doc.lines[3].id })
    await vi.advanceTimersByTimeAsync(1000)
    await flushPromises()
    expect(status()).toHaveTextContent("Not saved — can't reach Gridcue, kept in this browser; retrying…")
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument()
    expect(localCopy()!.outline.lines[3].hidden).toBe(true)
    view.unmount()
    await flushPromises()
  })
})
