import { beforeEach, describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import type { VueWrapper } from '@vue/test-utils'
import PrimeVue from 'primevue/config'
import { fitToTarget, formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import ScriptEditor from '@/components/ScriptEditor.vue'
import { parseLength } from '@/components/ScriptFitTarget.vue'
import { useOutlineEditor } from '@/composables/useOutlineEditor'
import type { OutlineEditor } from '@/composables/useOutlineEditor'
import { outlineFor } from '../helpers/studio-outline'

// The script pane wired as the Studio wires it: single edits and grouped edits both run through the editor.
function mountEditor(doc: Outline) {
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
  const wrapper = mount(Harness, { attachTo: document.body, global: { plugins: [[PrimeVue, { theme: 'none' }]] } })
  return { wrapper, editor: () => editor, selected }
}

async function ask(wrapper: VueWrapper, text: string): Promise<void> {
  await wrapper.find('input[placeholder="m:ss"]').setValue(text)
  await wrapper.find('form.fit__form').trigger('submit')
  await flushPromises()
}
const panel = (wrapper: VueWrapper) => wrapper.find('[data-testid="fit-panel"]')
const buttonNamed = (wrapper: VueWrapper, start: string) => {
  const found = wrapper.findAll('button').find((b) => b.text().startsWith(start))
  if (!found) throw new Error(`no button "${start}"`)
  return found
}
const total = (wrapper: VueWrapper) => wrapper.find('[data-testid="script-total"]').text()

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
    document.body.innerHTML = ''
    doc = outlineFor('GT07')
  })

  it('should show a form message for words that are not a length, and change nothing', async () => {
    const { wrapper, editor } = mountEditor(doc)
    await ask(wrapper, 'ten minutes')
    const input = wrapper.find('input[placeholder="m:ss"]')
    expect(input.attributes('aria-invalid')).toBe('true')
    const message = wrapper.find(`#${input.attributes('aria-describedby')}`)
    expect(message.text()).toContain('minutes and seconds')
    expect(panel(wrapper).exists()).toBe(false)
    expect(editor().outline.value).toBe(doc)
    expect(editor().canUndo.value).toBe(false)

    // Typing again clears the message.
    await input.setValue('10:00')
    expect(wrapper.find('input[placeholder="m:ss"]').attributes('aria-invalid')).toBeUndefined()
    wrapper.unmount()
  })

  it('should refuse a target shorter than the introduction, with a message', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const introMs = doc.lines.find((l) => l.kind === 'intro')!.estMs
    await ask(wrapper, '0:05')
    expect(introMs).toBeGreaterThan(5000)
    expect(wrapper.text()).toContain(`shorter than the introduction alone (${formatClock(introMs)})`)
    expect(panel(wrapper).exists()).toBe(false)
    expect(editor().outline.value).toBe(doc)
    wrapper.unmount()
  })

  it('should list what fitToTarget suggests, with the new total', async () => {
    const { wrapper, selected } = mountEditor(doc)
    const targetMs = Math.round((timeline(doc).totalMs * 0.7) / 1000) * 1000
    const expected = fitToTarget(doc, targetMs)
    expect(expected.suggestions.length).toBeGreaterThan(2)
    await ask(wrapper, formatClock(targetMs))

    const items = panel(wrapper).findAll('li')
    expect(items).toHaveLength(expected.suggestions.length)
    expect(items.filter((li) => li.text().startsWith('Join lines'))).toHaveLength(expected.suggestions.filter((s) => s.action === 'fold').length)
    expect(items.filter((li) => li.text().startsWith('Hide line'))).toHaveLength(expected.suggestions.filter((s) => s.action === 'hide').length)
    expect(items[0].text()).toContain(`−${formatClock(expected.suggestions[0].savesMs)}`)
    expect(panel(wrapper).text()).toContain(`down to ${formatClock(expected.newTotalMs)}`)
    expect(buttonNamed(wrapper, 'Apply').text()).toBe(`Apply ${expected.suggestions.length} changes`)

    // A suggestion's line can be looked at before deciding.
    await items[0].find('button').trigger('click')
    expect(selected).toEqual([expected.suggestions[0].lineIds[0]])
    wrapper.unmount()
  })

  it('should apply every suggestion and the target as one edit, which one undo takes back', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const before = total(wrapper)
    const targetMs = Math.round((timeline(doc).totalMs * 0.7) / 1000) * 1000
    const expected = fitToTarget(doc, targetMs)
    await ask(wrapper, formatClock(targetMs))
    await buttonNamed(wrapper, 'Apply').trigger('click')
    await flushPromises()

    const after = editor().outline.value!
    expect(after.targetMs).toBe(targetMs)
    expect(after.lines).toEqual(expected.outline.lines)
    expect(timeline(after).totalMs).toBe(expected.newTotalMs)
    expect(total(wrapper)).toBe(formatClock(expected.newTotalMs))
    expect(wrapper.findAll('article.line')).toHaveLength(expected.outline.lines.length)
    expect(panel(wrapper).exists()).toBe(false)

    await buttonNamed(wrapper, 'Undo').trigger('click')
    await flushPromises()
    expect(editor().outline.value).toBe(doc)
    expect(editor().canUndo.value).toBe(false)
    expect(total(wrapper)).toBe(before)
    wrapper.unmount()
  })

  it('should say when the script already fits, and offer to keep the target', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const targetMs = Math.ceil((timeline(doc).totalMs * 1.2) / 1000) * 1000
    await ask(wrapper, formatClock(targetMs))
    expect(panel(wrapper).text()).toContain('already fits')
    expect(panel(wrapper).findAll('li')).toHaveLength(0)
    await buttonNamed(wrapper, 'Keep').trigger('click')
    await flushPromises()
    expect(editor().outline.value!.targetMs).toBe(targetMs)
    expect(editor().outline.value!.lines).toBe(doc.lines)
    expect(wrapper.find('.script__target').text()).toContain(formatClock(targetMs))
    wrapper.unmount()
  })

  it('should keep the suggestions in step with edits made while they are shown', async () => {
    const { wrapper, editor } = mountEditor(doc)
    const targetMs = Math.round((timeline(doc).totalMs * 0.9) / 1000) * 1000
    await ask(wrapper, formatClock(targetMs))
    const shown = panel(wrapper).findAll('li').length
    // Halving the pace lengthens every line: more has to go.
    editor().apply({ op: 'setPace', pace: Math.round(doc.pace / 2) })
    await flushPromises()
    const expected = fitToTarget(editor().outline.value!, targetMs)
    expect(panel(wrapper).findAll('li')).toHaveLength(expected.suggestions.length)
    expect(expected.suggestions.length).toBeGreaterThan(shown)
    wrapper.unmount()
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
