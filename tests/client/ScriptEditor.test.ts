import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import type { PropType } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import type { VueWrapper } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import { formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import ScriptEditor from '@/components/ScriptEditor.vue'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor } from '../helpers/studio-outline'

// The Studio's wiring of the script pane: edits from the component run through the composable.
function mountEditor(doc: Outline, currentLineId: number | null = null) {
  let editor!: OutlineEditor
  const Harness = defineComponent({
    props: { current: { type: Number as PropType<number | null>, default: null } },
    setup(props) {
      editor = useOutlineEditor({ keyboard: true })
      editor.load(doc)
      return () =>
        editor.outline.value && editor.timing.value
          ? h(ScriptEditor, {
              outline: editor.outline.value,
              timing: editor.timing.value,
              currentLineId: props.current,
              canUndo: editor.canUndo.value,
              canRedo: editor.canRedo.value,
              error: editor.error.value,
              onEdit: editor.apply,
              onUndo: editor.undo,
              onRedo: editor.redo,
              onDismissError: editor.clearError,
            })
          : null
    },
  })
  const wrapper = mount(Harness, {
    props: { current: currentLineId },
    attachTo: document.body,
    global: { plugins: [[PrimeVue, { theme: 'none' }]] },
  })
  return { wrapper, editor: () => editor }
}

type Wrapper = VueWrapper
const lineEls = (w: Wrapper) => w.findAll('article.line')
const lineEl = (w: Wrapper, id: number) => w.find(`article[data-line="${id}"]`)
const total = (w: Wrapper) => w.find('[data-testid="script-total"]').text()
const button = (scope: ReturnType<Wrapper['find']>, text: string) => {
  const found = scope.findAll('button').find((b) => b.text() === text || b.text().startsWith(text))
  if (!found) throw new Error(`no button "${text}"`)
  return found
}
const nextFrame = () => new Promise<void>((resolve) => requestAnimationFrame(() => resolve()))
function pressKey(key: string, init: KeyboardEventInit = {}, target: EventTarget = window) {
  const event = new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true, ...init })
  target.dispatchEvent(event)
  return event
}

describe('ScriptEditor with useOutlineEditor', () => {
  let doc: Outline
  beforeEach(() => {
    document.body.innerHTML = ''
    doc = outlineFor('PE01')
  })
  afterEach(() => vi.restoreAllMocks())

  it('should show one editable line per outline line, with start times and the total', () => {
    const { wrapper } = mountEditor(doc)
    expect(lineEls(wrapper)).toHaveLength(doc.lines.length)
    const t = timeline(doc)
    expect(total(wrapper)).toBe(formatClock(t.totalMs))
    const second = doc.lines[1]
    const el = lineEl(wrapper, second.id)
    expect(el.find('.line__time').text()).toBe(formatClock(t.lines[1].startMs))
    expect((el.find('textarea').element as HTMLTextAreaElement).value).toBe(second.text)
    expect(el.find('label').text()).toMatch(/^Line 2 \(Step/)
    wrapper.unmount()
  })

  it('should mark the current line and scroll the script pane (not the page) to it', async () => {
    const { wrapper } = mountEditor(doc, doc.lines[0].id)
    expect(lineEl(wrapper, doc.lines[0].id).attributes('aria-current')).toBe('step')
    const pane = wrapper.find('.script__lines').element as HTMLElement
    const scrollTo = vi.fn()
    pane.scrollTo = scrollTo as typeof pane.scrollTo
    Object.defineProperty(pane, 'clientHeight', { value: 400 })
    const target = doc.lines[10]
    const el = lineEl(wrapper, target.id).element as HTMLElement
    Object.defineProperty(el, 'offsetTop', { value: 1200 })
    Object.defineProperty(el, 'offsetHeight', { value: 100 })

    await wrapper.setProps({ current: target.id })
    await nextFrame()
    expect(lineEl(wrapper, target.id).attributes('aria-current')).toBe('step')
    expect(lineEl(wrapper, doc.lines[0].id).attributes('aria-current')).toBeUndefined()
    // Brought up from below: its bottom edge lands a margin above the pane's bottom.
    expect(scrollTo).toHaveBeenCalledWith(expect.objectContaining({ top: 1200 + 100 - 400 + 48 }))

    // A line already in view doesn't move the script.
    scrollTo.mockClear()
    const near = lineEl(wrapper, doc.lines[11].id).element as HTMLElement
    Object.defineProperty(pane, 'scrollTop', { value: 1000, configurable: true })
    Object.defineProperty(near, 'offsetTop', { value: 1100 })
    Object.defineProperty(near, 'offsetHeight', { value: 100 })
    await wrapper.setProps({ current: doc.lines[11].id })
    await nextFrame()
    expect(scrollTo).not.toHaveBeenCalled()
    wrapper.unmount()
  })

  it('should update the words, the line time and the total when a line is edited, and never the steps', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[3]
    const before = total(wrapper)
    const area = lineEl(wrapper, line.id).find('textarea')
    const longer = `${line.text} Let's take a moment here and look at every cell in this box one more time before we move on.`
    await area.setValue(longer)
    await area.trigger('blur')
    await flushPromises()

    const edited = editor().outline.value!.lines.find((l) => l.id === line.id)!
    expect(edited.text).toBe(longer)
    expect(edited.edited).toBe(true)
    expect(edited.estMs).toBeGreaterThan(line.estMs)
    expect(total(wrapper)).not.toBe(before)
    expect(lineEl(wrapper, line.id).text()).toContain('edited')
    expect(editor().outline.value!.steps).toEqual(doc.steps)
    wrapper.unmount()
  })

  it('should hand words still waiting to be committed to the outline when the page is being left', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[3]
    const area = lineEl(wrapper, line.id).find('textarea')
    await area.setValue('Typed just before the reload.')
    expect(editor().outline.value!.lines[3].text).toBe(line.text)

    const leaving = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(leaving)
    expect(leaving.defaultPrevented).toBe(true)
    expect(editor().outline.value!.lines[3].text).toBe('Typed just before the reload.')

    // once committed, leaving the page is not held up by this line again
    const again = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(again)
    expect(again.defaultPrevented).toBe(false)
    wrapper.unmount()
  })

  it('should refuse an empty line and put the words back when leaving it', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[2]
    const area = lineEl(wrapper, line.id).find('textarea')
    await area.setValue('   ')
    expect(lineEl(wrapper, line.id).text()).toContain("A line can't be empty")
    await area.trigger('blur')
    expect((area.element as HTMLTextAreaElement).value).toBe(line.text)
    expect(editor().outline.value!.lines[2].text).toBe(line.text)
    wrapper.unmount()
  })

  it('should join a line with the next and split it back into its steps', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const chapterLines = new Set(doc.chapters.map((c) => c.lineId))
    const idx = doc.lines.findIndex((l, i) => l.kind === 'step' && doc.lines[i + 1]?.kind === 'step' && !chapterLines.has(doc.lines[i + 1].id))
    const first = doc.lines[idx]
    const second = doc.lines[idx + 1]

    await button(lineEl(wrapper, first.id), 'Join with next').trigger('click')
    let lines = editor().outline.value!.lines
    expect(lines).toHaveLength(doc.lines.length - 1)
    expect(lines[idx].steps).toEqual([...first.steps, ...second.steps])
    expect(lineEl(wrapper, second.id).exists()).toBe(false)

    const stepCount = first.steps.length + second.steps.length
    await button(lineEl(wrapper, first.id), `Split into ${stepCount} lines`).trigger('click')
    lines = editor().outline.value!.lines
    expect(lines).toHaveLength(doc.lines.length - 1 + stepCount - 1)
    expect(lines.slice(idx, idx + stepCount).map((l) => l.steps)).toEqual([...first.steps, ...second.steps].map((s) => [s]))
    expect(editor().outline.value!.steps).toEqual(doc.steps)
    wrapper.unmount()
  })

  it('should hide a line from the video (taking its time off the total) and show it again', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[4]
    const fullTotal = timeline(doc).totalMs

    await button(lineEl(wrapper, line.id), 'Hide from video').trigger('click')
    expect(editor().outline.value!.lines[4].hidden).toBe(true)
    expect(total(wrapper)).toBe(formatClock(fullTotal - line.estMs))
    expect(lineEl(wrapper, line.id).text()).toContain('hidden from the video')

    const show = button(lineEl(wrapper, line.id), 'Show in video')
    expect(show.attributes('aria-pressed')).toBe('true')
    await show.trigger('click')
    expect(editor().outline.value!.lines[4].hidden).toBe(false)
    expect(total(wrapper)).toBe(formatClock(fullTotal))
    wrapper.unmount()
  })

  it('should start, rename and remove a chapter', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const chapterLines = new Set(doc.chapters.map((c) => c.lineId))
    const line = doc.lines.find((l) => l.kind === 'step' && !chapterLines.has(l.id))!

    await button(lineEl(wrapper, line.id), 'Start chapter here').trigger('click')
    expect(editor().outline.value!.chapters).toHaveLength(doc.chapters.length + 1)
    const heading = () => wrapper.find(`[data-chapter="${line.id}"]`)
    expect(heading().exists()).toBe(true)

    await heading().find('button[aria-label^="Rename chapter"]').trigger('click')
    const input = heading().find('input')
    expect(document.activeElement).toBe(input.element)
    await input.setValue('The long thermometer')
    await input.trigger('keydown', { key: 'Enter' })
    await flushPromises()
    expect(heading().find('h3').text()).toBe('The long thermometer')
    expect(editor().outline.value!.chapters.find((c) => c.lineId === line.id)?.title).toBe('The long thermometer')

    await heading().find('button[aria-label^="Remove chapter"]').trigger('click')
    expect(heading().exists()).toBe(false)
    expect(editor().outline.value!.chapters).toEqual(doc.chapters)
    // The first chapter opens the video and can only be renamed.
    expect(wrapper.find(`[data-chapter="${doc.chapters[0].lineId}"] button[aria-label^="Remove chapter"]`).exists()).toBe(false)
    wrapper.unmount()
  })

  it('should undo and redo with the buttons and with Ctrl+Z / Ctrl+Shift+Z', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[5]
    const undo = () => wrapper.findAll('button').find((b) => b.text() === 'Undo')!
    const redo = () => wrapper.findAll('button').find((b) => b.text() === 'Redo')!
    expect(undo().attributes('disabled')).toBeDefined()

    await button(lineEl(wrapper, line.id), 'Hide from video').trigger('click')
    const area = lineEl(wrapper, line.id).find('textarea')
    await area.setValue('We can place a 4 here.')
    await area.trigger('blur')
    expect(editor().outline.value!.lines[5]).toMatchObject({ hidden: true, text: 'We can place a 4 here.' })

    await undo().trigger('click')
    expect(editor().outline.value!.lines[5]).toMatchObject({ hidden: true, text: line.text })
    expect((lineEl(wrapper, line.id).find('textarea').element as HTMLTextAreaElement).value).toBe(line.text)

    const undoKey = pressKey('z', { ctrlKey: true })
    await flushPromises()
    expect(undoKey.defaultPrevented).toBe(true)
    expect(editor().outline.value).toBe(doc)
    expect(undo().attributes('disabled')).toBeDefined()

    pressKey('Z', { ctrlKey: true, shiftKey: true })
    await flushPromises()
    expect(editor().outline.value!.lines[5]).toMatchObject({ hidden: true, text: line.text })

    await redo().trigger('click')
    expect(editor().outline.value!.lines[5].text).toBe('We can place a 4 here.')
    expect(redo().attributes('disabled')).toBeDefined()
    wrapper.unmount()
  })

  it('should count a burst of typing in one line as a single undo step', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const line = doc.lines[6]
    const area = lineEl(wrapper, line.id).find('textarea')
    for (const text of ['Here', 'Here we', 'Here we go']) {
      await area.setValue(text)
      await area.trigger('keydown', { key: 'Enter' })
    }
    expect(editor().outline.value!.lines[6].text).toBe('Here we go')
    // Ctrl+Z inside the line undoes the whole burst, not the last word.
    pressKey('z', { ctrlKey: true }, area.element)
    await flushPromises()
    expect(editor().outline.value!.lines[6].text).toBe(line.text)
    wrapper.unmount()
  })

  it('should re-time every line when the pace changes and re-word cells with the naming style', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const before = timeline(doc).totalMs

    // As if typed: the number field reads its own text when it loses focus.
    const pace = wrapper.find('#script-pace')
    ;(pace.element as HTMLInputElement).value = '200 wpm'
    await pace.trigger('blur')
    await flushPromises()
    expect(editor().outline.value!.pace).toBe(200)
    expect(timeline(editor().outline.value!).totalMs).toBeLessThan(before)
    expect(total(wrapper)).toBe(formatClock(timeline(editor().outline.value!).totalMs))

    const coords = wrapper.findAll('button').find((b) => b.text() === 'As r3c4')!
    await coords.trigger('click')
    const after = editor().outline.value!
    expect(after.names).toBe('coords')
    expect(after.lines.some((l) => /r\dc\d/.test(l.text))).toBe(true)
    expect(doc.lines.some((l) => /r\dc\d/.test(l.text))).toBe(false)
    wrapper.unmount()
  })

  it('should say why an edit was refused and leave the outline as it was', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const ok = editor().apply({ op: 'removeChapter', lineId: doc.chapters[0].lineId })
    await flushPromises()
    expect(ok).toBe(false)
    expect(editor().outline.value).toBe(doc)
    expect(wrapper.text()).toContain("can't be removed")
    wrapper.unmount()
  })
})
