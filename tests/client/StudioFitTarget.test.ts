import { beforeEach, describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import { render, screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import PrimeVue from 'primevue/config'
import { fitToTarget, formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import ScriptEditor from '@/components/ScriptEditor.vue'
import { parseLength } from '@/components/ScriptFitTarget.vue'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor } from '../helpers/studio-outline'
import { settle } from './render'

// The script pane wired as the Studio wires it: single edits and grouped edits both run through the editor.
function renderEditor(doc: Outline) {
  let editor!: OutlineEditor
  const selected: number[] = []
  const Harness = defineComponent({
    setup() {
      editor = useOutlineEditor()
      editor.load(doc)
      return () =>
        editor.outline.value && editor.timing.value
          ? h(ScriptEditor, {
              outline: editor.outline.value,
              timing: editor.timing.value,
              currentLineId: null,
              follow: false,
              canUndo: editor.canUndo.value,
              canRedo: editor.canRedo.value,
              error: editor.error.value,
              onEdit: editor.apply,
              onEdits: editor.applyAll,
              onUndo: editor.undo,
              onRedo: editor.redo,
              onSelectLine: (id: number) => selected.push(id),
            })
          : null
    },
  })
  render(Harness, { global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
  return { editor: () => editor, selected }
}

const user = () => userEvent.setup()
const lengthField = () => screen.getByRole('textbox', { name: 'Fit to' })
/** Types a length into "Fit to" and asks for suggestions, as a person would. */
async function ask(text: string): Promise<void> {
  await user().clear(lengthField())
  await user().type(lengthField(), text)
  await user().click(screen.getByRole('button', { name: 'Suggest cuts' }))
}
const panel = () => screen.getByRole('region', { name: /^Fitting to/ })
const noPanel = () => expect(screen.queryByRole('region', { name: /^Fitting to/ })).not.toBeInTheDocument()
const suggestions = () => within(panel()).queryAllByRole('listitem')
const script = () => screen.getByRole('region', { name: 'Script' })
// The bar reads "Total 3:00" (two elements, so no space between them in the text)
const showsTotal = (ms: number) => expect(script()).toHaveTextContent(new RegExp(`Total\\s*${formatClock(ms)}`))

describe('parseLength', () => {
  it('should read minutes and seconds, minutes alone, and hours', () => {
    expect(parseLength('12:30')).toBe(750_000)
    expect(parseLength(' 9:05 ')).toBe(545_000)
    expect(parseLength('12')).toBe(720_000)
    expect(parseLength('1:02:30')).toBe(3_750_000)
    expect(parseLength('0:45')).toBe(45_000)
  })

  it('should refuse anything that is not a length', () => {
    for (const bad of ['', 'soon', '12:60', '1:75:00', '-3', '12.5', '0', '0:00', '1:2:3:4', '12 min']) expect(parseLength(bad), bad).toBeNull()
  })
})

describe('Fit to a target length (script toolbar)', () => {
  let doc: Outline
  beforeEach(() => {
    doc = outlineFor('GT07')
  })

  it('should show a form message for words that are not a length, and change nothing', async () => {
    const { editor } = renderEditor(doc)
    await ask('ten minutes')
    expect(lengthField()).toBeInvalid()
    expect(lengthField()).toHaveAccessibleDescription(/minutes and seconds/)
    noPanel()
    expect(editor().outline.value).toBe(doc)
    expect(editor().canUndo.value).toBe(false)

    // Typing again clears the message.
    await user().type(lengthField(), '1')
    expect(lengthField()).not.toHaveAttribute('aria-invalid', 'true')
    expect(lengthField()).not.toHaveAccessibleDescription(/minutes and seconds/)
  })

  it('should refuse a target shorter than the introduction, with a message', async () => {
    const { editor } = renderEditor(doc)
    const introMs = doc.lines.find((l) => l.kind === 'intro')!.estMs
    await ask('0:05')
    expect(introMs).toBeGreaterThan(5000)
    expect(lengthField()).toHaveAccessibleDescription(`That's shorter than the introduction alone (${formatClock(introMs)}). Try a longer length.`)
    noPanel()
    expect(editor().outline.value).toBe(doc)
  })

  it('should list what fitToTarget suggests, with the new total', async () => {
    const { selected } = renderEditor(doc)
    const targetMs = Math.round((timeline(doc).totalMs * 0.7) / 1000) * 1000
    const expected = fitToTarget(doc, targetMs)
    expect(expected.suggestions.length).toBeGreaterThan(2)
    await ask(formatClock(targetMs))

    const items = suggestions()
    expect(items).toHaveLength(expected.suggestions.length)
    const actions = items.map((li) => within(li).getByRole('button').textContent!.trim())
    expect(actions.filter((a) => a.startsWith('Join lines'))).toHaveLength(expected.suggestions.filter((s) => s.action === 'fold').length)
    expect(actions.filter((a) => a.startsWith('Hide line'))).toHaveLength(expected.suggestions.filter((s) => s.action === 'hide').length)
    expect(items[0]).toHaveTextContent(`−${formatClock(expected.suggestions[0].savesMs)}`)
    expect(panel()).toHaveTextContent(`down to ${formatClock(expected.newTotalMs)}`)
    expect(within(panel()).getByRole('button', { name: `Apply ${expected.suggestions.length} changes` })).toBeInTheDocument()

    // A suggestion's line can be looked at before deciding.
    await user().click(within(items[0]).getByRole('button'))
    expect(selected).toEqual([expected.suggestions[0].lineIds[0]])
  })

  it('should apply every suggestion and the target as one edit, which one undo takes back', async () => {
    const { editor } = renderEditor(doc)
    const targetMs = Math.round((timeline(doc).totalMs * 0.7) / 1000) * 1000
    const expected = fitToTarget(doc, targetMs)
    await ask(formatClock(targetMs))
    await user().click(within(panel()).getByRole('button', { name: /^Apply/ }))

    const after = editor().outline.value!
    expect(after.targetMs).toBe(targetMs)
    expect(after.lines).toEqual(expected.outline.lines)
    expect(timeline(after).totalMs).toBe(expected.newTotalMs)
    showsTotal(expected.newTotalMs)
    expect(within(script()).getAllByRole('article')).toHaveLength(expected.outline.lines.length)
    noPanel()

    await user().click(screen.getByRole('button', { name: 'Undo' }))
    expect(editor().outline.value).toBe(doc)
    expect(editor().canUndo.value).toBe(false)
    showsTotal(timeline(doc).totalMs)
  })

  it('should say when the script already fits, and offer to keep the target', async () => {
    const { editor } = renderEditor(doc)
    const targetMs = Math.ceil((timeline(doc).totalMs * 1.2) / 1000) * 1000
    await ask(formatClock(targetMs))
    expect(panel()).toHaveTextContent('already fits')
    expect(suggestions()).toHaveLength(0)
    await user().click(within(panel()).getByRole('button', { name: `Keep ${formatClock(targetMs)} as the target` }))
    expect(editor().outline.value!.targetMs).toBe(targetMs)
    expect(editor().outline.value!.lines).toBe(doc.lines)
    expect(script()).toHaveTextContent(new RegExp(`target\\s*${formatClock(targetMs)}`))
  })

  it('should close the suggestions without changing anything', async () => {
    const { editor } = renderEditor(doc)
    await ask(formatClock(Math.round((timeline(doc).totalMs * 0.7) / 1000) * 1000))
    await user().click(within(panel()).getByRole('button', { name: 'Close' }))
    noPanel()
    expect(editor().outline.value).toBe(doc)
  })

  it('should keep the suggestions in step with edits made while they are shown', async () => {
    const { editor } = renderEditor(doc)
    const targetMs = Math.round((timeline(doc).totalMs * 0.9) / 1000) * 1000
    await ask(formatClock(targetMs))
    const shown = suggestions().length
    // Halving the pace lengthens every line: more has to go.
    editor().apply({ op: 'setPace', pace: Math.round(doc.pace / 2) })
    await settle()
    const expected = fitToTarget(editor().outline.value!, targetMs)
    expect(suggestions()).toHaveLength(expected.suggestions.length)
    expect(expected.suggestions.length).toBeGreaterThan(shown)
  })

  it('should leave the outline alone when the grouped edits are refused', () => {
    const editor = useOutlineEditor()
    editor.load(doc)
    const ok = editor.applyAll([
      { op: 'setTarget', targetMs: 600_000 },
      { op: 'hideLine', lineId: 9999 },
    ])
    expect(ok).toBe(false)
    expect(editor.outline.value).toBe(doc)
    expect(editor.error.value).toMatch(/9999/)
    expect(editor.canUndo.value).toBe(false)
  })
})
