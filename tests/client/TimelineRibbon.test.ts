import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { render, screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { applyEdit, formatClock, timeline } from '@shared/script'
import type { Outline } from '@shared/script'
import TimelineRibbon from '@/components/TimelineRibbon.vue'
import { outlineFor } from '../helpers/studio-outline'
import './render'

function renderRibbon(doc: Outline, currentLineId: number | null = null) {
  return render(TimelineRibbon, { props: { timing: timeline(doc), lines: doc.lines, currentLineId } })
}

const ribbon = () => screen.getByRole('region', { name: 'Timeline' })
const blocks = () => within(screen.getByRole('group', { name: 'Lines on the timeline' })).getAllByRole('button')
const block = (n: number) => within(ribbon()).getByRole('button', { name: new RegExp(`^Line ${n},`) })
/** A block's or band's place on the track, in percent of the whole length (its drawing, which no name carries). */
const percent = (el: HTMLElement, prop: 'left' | 'width') => Number.parseFloat(el.style[prop])

/** Whether the ribbon kept the last key for itself (so the Studio's step keys leave it alone). */
let lastKeyTaken: boolean | null = null
const noteKeys = (event: KeyboardEvent) => (lastKeyTaken = event.defaultPrevented)

describe('TimelineRibbon', () => {
  let doc: Outline
  beforeEach(() => {
    doc = outlineFor('GT07')
    lastKeyTaken = null
    window.addEventListener('keydown', noteKeys)
  })
  afterEach(() => window.removeEventListener('keydown', noteKeys))

  it('should draw one block per visible line, its width in proportion to its duration', () => {
    const t = timeline(doc)
    renderRibbon(doc)
    expect(blocks()).toHaveLength(doc.lines.length)

    const widths = blocks().map((b) => percent(b, 'width'))
    expect(widths.reduce((a, b) => a + b, 0)).toBeCloseTo(100, 2)
    t.lines.forEach((line, i) => expect(widths[i]).toBeCloseTo((line.durationMs / t.totalMs) * 100, 3))
    expect(percent(blocks()[0], 'left')).toBe(0)
    expect(percent(blocks()[5], 'left')).toBeCloseTo((t.lines[5].startMs / t.totalMs) * 100, 3)
    expect(blocks()[1]).toHaveAccessibleName(`Line 2, at ${formatClock(t.lines[1].startMs)}, ${Math.round(t.lines[1].durationMs / 1000)} seconds`)
    expect(ribbon()).toHaveTextContent(formatClock(t.totalMs))
  })

  it('should leave hidden lines out and widen the rest', () => {
    const edited = applyEdit(doc, { op: 'hideLine', lineId: doc.lines[3].id })
    renderRibbon(edited)
    expect(blocks()).toHaveLength(doc.lines.length - 1)
    expect(within(ribbon()).queryByRole('button', { name: /^Line 4,/ })).not.toBeInTheDocument()
    expect(blocks().reduce((sum, b) => sum + percent(b, 'width'), 0)).toBeCloseTo(100, 2)
  })

  it('should show chapters as labelled bands with their start times', () => {
    const t = timeline(doc)
    renderRibbon(doc)
    for (const chapter of t.chapters) {
      const label = within(ribbon()).getByText(chapter.title)
      expect(label).toHaveTextContent(`${formatClock(chapter.startMs)} ${chapter.title}`)
      const band = label.parentElement!
      expect(percent(band, 'width')).toBeCloseTo(((chapter.endMs - chapter.startMs) / t.totalMs) * 100, 3)
    }
  })

  it('should mark the current line and make it the ribbon’s one tab stop', async () => {
    const view = renderRibbon(doc, doc.lines[8].id)
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(block(9))
    expect(blocks().filter((b) => b.tabIndex === 0)).toEqual([block(9)])

    await view.rerender({ currentLineId: doc.lines[9].id })
    expect(within(ribbon()).getByRole('button', { current: 'step' })).toBe(block(10))
    expect(blocks().filter((b) => b.tabIndex === 0)).toEqual([block(10)])
  })

  it('should ask to jump to a line when its block is clicked', async () => {
    const view = renderRibbon(doc)
    await userEvent.setup().click(block(13))
    expect(view.emitted('jump-line')).toEqual([[doc.lines[12].id]])
  })

  it('should move between blocks with the arrow keys without moving the replay', async () => {
    const view = renderRibbon(doc, doc.lines[4].id)
    const user = userEvent.setup()
    await user.tab()
    expect(block(5)).toHaveFocus()

    await user.keyboard('{ArrowRight}')
    expect(lastKeyTaken).toBe(true)
    expect(block(6)).toHaveFocus()

    await user.keyboard('{End}')
    expect(block(doc.lines.length)).toHaveFocus()
    await user.keyboard('{Home}')
    expect(block(1)).toHaveFocus()
    expect(view.emitted('jump-line')).toBeUndefined()
  })
})
