import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import type { PropType } from 'vue'
import { render, screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import PrimeVue from 'primevue/config'
import { PACE_MIN } from '@shared/schemas/outline'
import { formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import ScriptEditor from '@/components/ScriptEditor.vue'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor } from '../helpers/studio-outline'
import { settle } from './render'

// The Studio's wiring of the script pane: edits from the component run through the composable.
function renderEditor(doc: Outline, currentLineId: number | null = null) {
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
  const view = render(Harness, { props: { current: currentLineId }, global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
  return { view, editor }
}

const script = () => screen.getByRole('region', { name: 'Script' })
/** A line of the script by its number ("Line 4 (Step 3)"): the article, or its text field. */
const line = (n: number) => screen.getByRole('article', { name: new RegExp(`^Line ${n} \\(`) })
const words = (n: number) => within(line(n)).getByRole('textbox')
const lineAction = (n: number, name: string | RegExp) => within(line(n)).getByRole('button', { name })
// The bar reads "Total 3:00" (two elements, so no space between them in the text)
const showsTotal = (ms: number) => expect(script()).toHaveTextContent(new RegExp(`Total\\s*${formatClock(ms)}`))
const nextFrame = () => new Promise<void>((resolve) => requestAnimationFrame(() => resolve()))
const user = () => userEvent.setup({ advanceTimers: vi.advanceTimersByTime })

describe('ScriptEditor with useOutlineEditor', () => {
  let doc: Outline
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'Date'] })
    doc = outlineFor('PE01')
  })
  afterEach(() => {
    vi.useRealTimers()
    vi.restoreAllMocks()
  })

  it('should show one editable line per outline line, with start times and the total', () => {
    renderEditor(doc)
    const t = timeline(doc)
    expect(within(script()).getAllByRole('article')).toHaveLength(doc.lines.length)
    showsTotal(t.totalMs)
    expect(line(2)).toHaveTextContent(formatClock(t.lines[1].startMs))
    expect(words(2)).toHaveValue(doc.lines[1].text)
    expect(words(2)).toHaveAccessibleName(/^Line 2 \(Step/)
  })

  it('should mark the current line and scroll the script pane (not the page) to it', async () => {
    const { view } = renderEditor(doc, doc.lines[0].id)
    expect(within(script()).getByRole('article', { current: 'step' })).toBe(line(1))
    const pane = screen.getByRole('group', { name: 'Script lines' })
    const scrollTo = vi.fn()
    pane.scrollTo = scrollTo as typeof pane.scrollTo
    Object.defineProperty(pane, 'clientHeight', { value: 400 })
    Object.defineProperty(line(11), 'offsetTop', { value: 1200 })
    Object.defineProperty(line(11), 'offsetHeight', { value: 100 })

    await view.rerender({ current: doc.lines[10].id })
    await nextFrame()
    expect(within(script()).getByRole('article', { current: 'step' })).toBe(line(11))
    expect(line(1)).not.toHaveAttribute('aria-current')
    // Brought up from below: its bottom edge lands a margin above the pane's bottom.
    expect(scrollTo).toHaveBeenCalledWith(expect.objectContaining({ top: 1200 + 100 - 400 + 48 }))

    // A line already in view doesn't move the script.
    scrollTo.mockClear()
    Object.defineProperty(pane, 'scrollTop', { value: 1000, configurable: true })
    Object.defineProperty(line(12), 'offsetTop', { value: 1100 })
    Object.defineProperty(line(12), 'offsetHeight', { value: 100 })
    await view.rerender({ current: doc.lines[11].id })
    await nextFrame()
    expect(scrollTo).not.toHaveBeenCalled()
  })

  it('should update the words, the line time and the total when a line is edited, and never the steps', async () => {
    const { editor } = renderEditor(doc)
    const before = doc.lines[3]
    const longer = `${before.text} Let's take a moment here and look at every cell in this box one more time before we move on.`
    await user().clear(words(4))
    await user().type(words(4), longer)
    await user().tab()

    const edited = editor.outline.value!.lines[3]
    expect(edited.text).toBe(longer)
    expect(edited.edited).toBe(true)
    expect(edited.estMs).toBeGreaterThan(before.estMs)
    showsTotal(timeline(editor.outline.value!).totalMs)
    expect(timeline(editor.outline.value!).totalMs).toBeGreaterThan(timeline(doc).totalMs)
    expect(line(4)).toHaveTextContent('edited')
    expect(editor.outline.value!.steps).toEqual(doc.steps)
  })

  it('should hand the outline the words typed so far once typing pauses, so the total follows', async () => {
    const { editor } = renderEditor(doc)
    await user().type(words(4), ' And one more thing.')
    expect(editor.outline.value!.lines[3].text).toBe(doc.lines[3].text)
    await vi.advanceTimersByTimeAsync(350)
    expect(editor.outline.value!.lines[3].text).toBe(`${doc.lines[3].text} And one more thing.`)
  })

  it('should hand words still waiting to be committed to the outline when the page is being left', async () => {
    const { editor } = renderEditor(doc)
    await user().clear(words(4))
    await user().type(words(4), 'Typed just before the reload.')
    expect(editor.outline.value!.lines[3].text).toBe(doc.lines[3].text)

    const leaving = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(leaving)
    expect(leaving.defaultPrevented).toBe(true)
    expect(editor.outline.value!.lines[3].text).toBe('Typed just before the reload.')

    // once committed, leaving the page is not held up by this line again
    const again = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(again)
    expect(again.defaultPrevented).toBe(false)
  })

  it('should refuse an empty line and put the words back when leaving it', async () => {
    const { editor } = renderEditor(doc)
    await user().clear(words(3))
    expect(words(3)).toBeInvalid()
    expect(words(3)).toHaveAccessibleDescription("A line can't be empty. Hide it instead if it shouldn't be said.")
    await user().tab()
    expect(words(3)).toHaveValue(doc.lines[2].text)
    expect(words(3)).toBeValid()
    expect(editor.outline.value!.lines[2].text).toBe(doc.lines[2].text)
  })

  it('should put back the words on Escape without changing the outline', async () => {
    const { editor } = renderEditor(doc)
    await user().type(words(5), ' Not this after all.')
    await user().keyboard('{Escape}')
    await vi.advanceTimersByTimeAsync(1000)
    expect(words(5)).toHaveValue(doc.lines[4].text)
    expect(editor.outline.value).toBe(doc)
  })

  it('should join a line with the next and split it back into its steps', async () => {
    const { editor } = renderEditor(doc)
    const chapterLines = new Set(doc.chapters.map((c) => c.lineId))
    const idx = doc.lines.findIndex((l, i) => l.kind === 'step' && doc.lines[i + 1]?.kind === 'step' && !chapterLines.has(doc.lines[i + 1].id))
    const [first, second] = [doc.lines[idx], doc.lines[idx + 1]]

    await user().click(lineAction(idx + 1, 'Join with next'))
    let lines = editor.outline.value!.lines
    expect(lines).toHaveLength(doc.lines.length - 1)
    expect(lines[idx].steps).toEqual([...first.steps, ...second.steps])
    expect(within(script()).getAllByRole('article')).toHaveLength(doc.lines.length - 1)

    const stepCount = first.steps.length + second.steps.length
    await user().click(lineAction(idx + 1, `Split into ${stepCount} lines`))
    lines = editor.outline.value!.lines
    expect(lines).toHaveLength(doc.lines.length - 1 + stepCount - 1)
    expect(lines.slice(idx, idx + stepCount).map((l) => l.steps)).toEqual([...first.steps, ...second.steps].map((s) => [s]))
    expect(editor.outline.value!.steps).toEqual(doc.steps)
  })

  it('should hide a line from the video (taking its time off the total) and show it again', async () => {
    const { editor } = renderEditor(doc)
    const hidden = doc.lines[4]
    const fullTotal = timeline(doc).totalMs

    await user().click(lineAction(5, 'Hide from video'))
    expect(editor.outline.value!.lines[4].hidden).toBe(true)
    showsTotal(fullTotal - hidden.estMs)
    expect(line(5)).toHaveTextContent('hidden from the video')
    expect(script()).toHaveTextContent(`${doc.lines.length} lines, 1 hidden`)

    const show = lineAction(5, 'Show in video')
    expect(show).toHaveAttribute('aria-pressed', 'true')
    await user().click(show)
    expect(editor.outline.value!.lines[4].hidden).toBe(false)
    showsTotal(fullTotal)
  })

  it('should start, rename and remove a chapter', async () => {
    const { editor } = renderEditor(doc)
    const chapterLines = new Set(doc.chapters.map((c) => c.lineId))
    const n = doc.lines.findIndex((l) => l.kind === 'step' && !chapterLines.has(l.id)) + 1
    const headings = () => within(script()).getAllByRole('heading', { level: 3 })
    expect(headings()).toHaveLength(doc.chapters.length)

    await user().click(lineAction(n, 'Start chapter here'))
    expect(editor.outline.value!.chapters).toHaveLength(doc.chapters.length + 1)
    expect(headings()).toHaveLength(doc.chapters.length + 1)
    const started = editor.outline.value!.chapters.find((c) => c.lineId === doc.lines[n - 1].id)!
    expect(within(script()).getByRole('heading', { level: 3, name: started.title })).toBeInTheDocument()

    await user().click(screen.getByRole('button', { name: `Rename chapter ${started.title}` }))
    const title = screen.getByRole('textbox', { name: 'Chapter title' })
    expect(title).toHaveFocus()
    await user().clear(title)
    await user().type(title, 'The long thermometer{Enter}')
    expect(within(script()).getByRole('heading', { level: 3, name: 'The long thermometer' })).toBeInTheDocument()
    expect(screen.getByRole('button', { name: 'Rename chapter The long thermometer' })).toHaveFocus()
    expect(editor.outline.value!.chapters.find((c) => c.lineId === started.lineId)?.title).toBe('The long thermometer')

    await user().click(screen.getByRole('button', { name: 'Remove chapter The long thermometer' }))
    expect(within(script()).queryByRole('heading', { level: 3, name: 'The long thermometer' })).not.toBeInTheDocument()
    expect(editor.outline.value!.chapters).toEqual(doc.chapters)
    // The first chapter opens the video and can only be renamed.
    expect(screen.getByRole('button', { name: `Rename chapter ${doc.chapters[0].title}` })).toBeInTheDocument()
    expect(screen.queryByRole('button', { name: `Remove chapter ${doc.chapters[0].title}` })).not.toBeInTheDocument()
  })

  it('should undo and redo with the buttons and with Ctrl+Z / Ctrl+Shift+Z', async () => {
    const { editor } = renderEditor(doc)
    const original = doc.lines[5]
    const undo = () => screen.getByRole('button', { name: 'Undo' })
    const redo = () => screen.getByRole('button', { name: 'Redo' })
    expect(undo()).toBeDisabled()

    await user().click(lineAction(6, 'Hide from video'))
    await user().clear(words(6))
    await user().type(words(6), 'We can place a 4 here.')
    await user().tab()
    expect(editor.outline.value!.lines[5]).toMatchObject({ hidden: true, text: 'We can place a 4 here.' })

    await user().click(undo())
    expect(editor.outline.value!.lines[5]).toMatchObject({ hidden: true, text: original.text })
    expect(words(6)).toHaveValue(original.text)

    await user().keyboard('{Control>}z{/Control}')
    expect(editor.outline.value).toBe(doc)
    expect(undo()).toBeDisabled()

    await user().keyboard('{Control>}{Shift>}Z{/Shift}{/Control}')
    expect(editor.outline.value!.lines[5]).toMatchObject({ hidden: true, text: original.text })

    await user().click(redo())
    expect(editor.outline.value!.lines[5].text).toBe('We can place a 4 here.')
    expect(redo()).toBeDisabled()
  })

  it('should count a burst of typing in one line as a single undo step', async () => {
    const { editor } = renderEditor(doc)
    await user().clear(words(7))
    for (const part of ['Here', ' we', ' go']) await user().type(words(7), `${part}{Enter}`)
    expect(editor.outline.value!.lines[6].text).toBe('Here we go')
    // Ctrl+Z inside the line undoes the whole burst, not the last word.
    await user().keyboard('{Control>}z{/Control}')
    expect(editor.outline.value!.lines[6].text).toBe(doc.lines[6].text)
  })

  it('should re-time every line when the pace changes and re-word cells with the naming style', async () => {
    const { editor } = renderEditor(doc)
    const before = timeline(doc).totalMs

    const pace = screen.getByRole('spinbutton', { name: 'Pace' })
    await user().tripleClick(pace)
    await user().keyboard('200')
    await user().tab()
    await settle()
    expect(editor.outline.value!.pace).toBe(200)
    expect(timeline(editor.outline.value!).totalMs).toBeLessThan(before)
    showsTotal(timeline(editor.outline.value!).totalMs)

    await user().click(screen.getByRole('button', { name: 'As r3c4' }))
    const after = editor.outline.value!
    expect(after.names).toBe('coords')
    expect(after.lines.some((l) => /r\dc\d/.test(l.text))).toBe(true)
    expect(doc.lines.some((l) => /r\dc\d/.test(l.text))).toBe(false)
    expect(words(2)).toHaveValue(after.lines[1].text)
  })

  it('should take a pace stepped with the arrow keys once the stepping pauses, as one edit', async () => {
    const { editor } = renderEditor(doc)
    const pace = screen.getByRole('spinbutton', { name: 'Pace' })
    await user().click(pace)
    await user().keyboard('{ArrowUp}{ArrowUp}{ArrowUp}')
    expect(editor.outline.value!.pace).toBe(doc.pace)
    await vi.advanceTimersByTimeAsync(800)
    expect(editor.outline.value!.pace).toBe(doc.pace + 3)
    await user().click(screen.getByRole('button', { name: 'Undo' }))
    expect(editor.outline.value).toBe(doc)
  })

  it('should take a typed pace below the slowest as the slowest', async () => {
    const { editor } = renderEditor(doc)
    const pace = screen.getByRole('spinbutton', { name: 'Pace' })
    await user().tripleClick(pace)
    await user().keyboard('5')
    await user().tab()
    await settle()
    expect(editor.outline.value!.pace).toBe(PACE_MIN)
    expect(pace).toHaveValue(`${PACE_MIN} wpm`)
  })

  it('should say why an edit was refused and leave the outline as it was', async () => {
    const { editor } = renderEditor(doc)
    const ok = editor.apply({ op: 'removeChapter', lineId: doc.chapters[0].lineId })
    await settle()
    expect(ok).toBe(false)
    expect(editor.outline.value).toBe(doc)
    expect(screen.getByText("can't be removed", { exact: false })).toBeInTheDocument()
  })
})
