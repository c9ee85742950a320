import { beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { applyEdit, formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import TimelineRibbon from '@/components/TimelineRibbon.vue'
import { outlineFor } from '../helpers/studio-outline'

function mountRibbon(doc: Outline, currentLineId: number | null = null) {
  return mount(TimelineRibbon, {
    props: { timing: timeline(doc), lines: doc.lines, currentLineId },
    attachTo: document.body,
  })
}

const percent = (style: string | undefined, prop: 'left' | 'width') => Number(new RegExp(`${prop}: ([\\d.]+)%`).exec(style ?? '')?.[1])

describe('TimelineRibbon', () => {
  let doc: Outline
  beforeEach(() => {
    document.body.innerHTML = ''
    doc = outlineFor('GT07')
  })

  it('should draw one block per visible line, its width in proportion to its duration', () => {
    const t = timeline(doc)
    const wrapper = mountRibbon(doc)
    const blocks = wrapper.findAll('button[data-line]')
    expect(blocks).toHaveLength(doc.lines.length)

    const widths = blocks.map((b) => percent(b.attributes('style'), 'width'))
    expect(widths.reduce((a, b) => a + b, 0)).toBeCloseTo(100, 2)
    t.lines.forEach((line, i) => expect(widths[i]).toBeCloseTo((line.durationMs / t.totalMs) * 100, 3))
    const lefts = blocks.map((b) => percent(b.attributes('style'), 'left'))
    expect(lefts[0]).toBe(0)
    expect(lefts[5]).toBeCloseTo((t.lines[5].startMs / t.totalMs) * 100, 3)
    expect(blocks[1].attributes('aria-label')).toBe(`Line 2, at ${formatClock(t.lines[1].startMs)}, ${Math.round(t.lines[1].durationMs / 1000)} seconds`)
    expect(wrapper.find('.ribbon__scale').text()).toContain(formatClock(t.totalMs))
  })

  it('should leave hidden lines out and widen the rest', () => {
    const hiddenId = doc.lines[3].id
    const edited = applyEdit(doc, { op: 'hideLine', lineId: hiddenId })
    const wrapper = mountRibbon(edited)
    const blocks = wrapper.findAll('button[data-line]')
    expect(blocks).toHaveLength(doc.lines.length - 1)
    expect(wrapper.find(`button[data-line="${hiddenId}"]`).exists()).toBe(false)
    const widths = blocks.map((b) => percent(b.attributes('style'), 'width'))
    expect(widths.reduce((a, b) => a + b, 0)).toBeCloseTo(100, 2)
  })

  it('should show chapters as labelled bands with their start times', () => {
    const t = timeline(doc)
    const wrapper = mountRibbon(doc)
    const bands = wrapper.findAll('.ribbon__band')
    expect(bands).toHaveLength(doc.chapters.length)
    bands.forEach((band, i) => {
      expect(band.text()).toBe(`${formatClock(t.chapters[i].startMs)} ${t.chapters[i].title}`)
      expect(percent(band.attributes('style'), 'width')).toBeCloseTo(((t.chapters[i].endMs - t.chapters[i].startMs) / t.totalMs) * 100, 3)
    })
  })

  it('should mark the current line and make it the ribbon’s one tab stop', async () => {
    const current = doc.lines[8].id
    const wrapper = mountRibbon(doc, current)
    const marked = wrapper.findAll('[aria-current="step"]')
    expect(marked).toHaveLength(1)
    expect(marked[0].attributes('data-line')).toBe(String(current))
    expect(wrapper.findAll('button[tabindex="0"]').map((b) => b.attributes('data-line'))).toEqual([String(current)])

    await wrapper.setProps({ currentLineId: doc.lines[9].id })
    expect(wrapper.find('[aria-current="step"]').attributes('data-line')).toBe(String(doc.lines[9].id))
  })

  it('should ask to jump to a line when its block is clicked', async () => {
    const wrapper = mountRibbon(doc)
    await wrapper.find(`button[data-line="${doc.lines[12].id}"]`).trigger('click')
    expect(wrapper.emitted('jump-line')).toEqual([[doc.lines[12].id]])
  })

  it('should move between blocks with the arrow keys without moving the replay', async () => {
    const wrapper = mountRibbon(doc, doc.lines[4].id)
    const start = wrapper.find(`button[data-line="${doc.lines[4].id}"]`)
    ;(start.element as HTMLButtonElement).focus()
    const event = new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true, cancelable: true })
    start.element.dispatchEvent(event)
    await flushPromises()
    expect(event.defaultPrevented).toBe(true)
    expect(document.activeElement?.getAttribute('data-line')).toBe(String(doc.lines[5].id))

    document.activeElement!.dispatchEvent(new KeyboardEvent('keydown', { key: 'End', bubbles: true, cancelable: true }))
    await flushPromises()
    expect(document.activeElement?.getAttribute('data-line')).toBe(String(doc.lines[doc.lines.length - 1].id))
    expect(wrapper.emitted('jump-line')).toBeUndefined()
  })
})
