import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { defineComponent, h, ref } from 'vue'
import GridBoard from '@/components/GridBoard.vue'
import { usePuzzleEntry } from '@/composables/usePuzzleEntry'

const at = (r: number, c: number) => (r - 1) * 9 + (c - 1)

/** GridBoard wired to the composable the way the Puzzle screen does it. */
function mountEntry(editable = true) {
  let entry!: ReturnType<typeof usePuzzleEntry>
  const canEdit = ref(editable)
  const Harness = defineComponent({
    setup() {
      entry = usePuzzleEntry({ editable: canEdit })
      return () =>
        h(GridBoard, {
          digits: entry.givens.value,
          givens: entry.givenFlags.value,
          thermometers: entry.shownThermometers.value,
          selected: entry.selected.value,
          selectedThermometer: entry.selectedThermometer.value,
          interactive: canEdit.value,
          onCellDown: entry.onCellDown,
          onCellEnter: entry.onCellEnter,
          onCellUp: entry.onCellUp,
          onThermometerClick: entry.onThermometerClick,
          onKeydown: entry.onKeydown,
          onPaste: entry.onPaste,
          onFocus: entry.ensureSelection,
        })
    },
  })
  const wrapper = mount(Harness, { attachTo: document.body })
  const grid = wrapper.find('[role="grid"]')
  const cell = (c: number) => wrapper.find(`[data-cell="${c}"]`)
  const key = (k: string, extra: Record<string, unknown> = {}) => grid.trigger('keydown', { key: k, ...extra })
  async function drag(...cells: number[]) {
    await cell(cells[0]).trigger('pointerdown', { button: 0, pointerId: 1 })
    for (const c of cells.slice(1)) await cell(c).trigger('pointermove', { pointerId: 1 })
    await cell(cells[cells.length - 1]).trigger('pointerup', { pointerId: 1 })
  }
  return { wrapper, grid, cell, key, drag, entry: () => entry, canEdit }
}

describe('usePuzzleEntry', () => {
  it('should select r1c1 when the grid takes focus, move with arrows and stop at the edges', async () => {
    const { grid, key, entry } = mountEntry()
    await grid.trigger('focus')
    expect(entry().selected.value).toBe(at(1, 1))
    await key('ArrowRight')
    await key('ArrowDown')
    await key('ArrowDown')
    expect(entry().selected.value).toBe(at(3, 2))
    await key('ArrowUp')
    await key('ArrowUp')
    await key('ArrowUp')
    expect(entry().selected.value).toBe(at(1, 2))
  })

  it('should set a given with a digit key and show it on the grid', async () => {
    const { cell, key, entry, grid } = mountEntry()
    await cell(at(3, 4)).trigger('pointerdown', { button: 0 })
    await cell(at(3, 4)).trigger('pointerup')
    await key('7')
    expect(entry().givens.value[at(3, 4)]).toBe(7)
    expect(entry().givensString.value.slice(18, 27)).toBe('...7.....')
    expect(cell(at(3, 4)).attributes('aria-label')).toBe('r3c4, given 7')
    expect(grid.attributes('aria-activedescendant')).toBe(cell(at(3, 4)).attributes('id'))
  })

  it('should clear a given with Backspace, Delete or 0 and undo with Ctrl+Z', async () => {
    const { key, entry } = mountEntry()
    entry().select(at(5, 5))
    await key('4')
    await key('Backspace')
    expect(entry().givens.value[at(5, 5)]).toBe(0)
    await key('6')
    await key('Delete')
    expect(entry().givens.value[at(5, 5)]).toBe(0)
    await key('z', { ctrlKey: true })
    expect(entry().givens.value[at(5, 5)]).toBe(6)
    await key('0')
    expect(entry().givens.value[at(5, 5)]).toBe(0)
  })

  it('should fill the grid from a pasted 81-character string, with line breaks allowed', async () => {
    const { grid, entry } = mountEntry()
    const rows = ['53..7....', '6..195...', '.98....6.', '8...6...3', '4..8.3..1', '7...2...6', '.6....28.', '...419..5', '....8..79']
    const clipboardData = { getData: (type: string) => (type === 'text/plain' ? rows.join('\n') : '') }
    await grid.trigger('paste', { clipboardData })
    expect(entry().givensString.value).toBe(rows.join(''))
    expect(entry().givens.value[0]).toBe(5)
  })

  it('should refuse a paste that is not 81 grid characters', () => {
    const { entry } = mountEntry()
    expect(entry().pasteGivens('12345')).toBe(false)
    expect(entry().pasteGivens('x'.repeat(81))).toBe(false)
    expect(entry().givensString.value).toBe('.'.repeat(81))
  })

  it('should draw a thermometer through touching cells with the bulb where the drag started', async () => {
    const { wrapper, drag, entry } = mountEntry()
    await drag(at(2, 2), at(2, 3), at(3, 4), at(4, 4))
    expect(entry().thermometers.value).toEqual([[at(2, 2), at(2, 3), at(3, 4), at(4, 4)]])
    expect(entry().thermometerNames.value).toEqual([['r2c2', 'r2c3', 'r3c4', 'r4c4']])
    const bulb = wrapper.find('.grid-board__bulb')
    expect([bulb.attributes('cx'), bulb.attributes('cy')]).toEqual(['150', '150'])
  })

  it('should ignore a move to a cell that does not touch the last one', async () => {
    const { drag, entry } = mountEntry()
    // r1c1 → r1c3 skips a cell, so it is ignored; r1c2 then continues the path from r1c1.
    await drag(at(1, 1), at(1, 3), at(1, 2), at(2, 3))
    expect(entry().thermometers.value).toEqual([[at(1, 1), at(1, 2), at(2, 3)]])
  })

  it('should take the last cell back off when the drag goes back over it, and not save a single cell', async () => {
    const { drag, entry } = mountEntry()
    await drag(at(5, 5), at(5, 6), at(5, 5))
    expect(entry().thermometers.value).toEqual([])
    await drag(at(5, 5), at(6, 6), at(7, 7), at(6, 6))
    expect(entry().thermometers.value).toEqual([[at(5, 5), at(6, 6)]])
  })

  it('should select a thermometer with a click and remove it with Delete', async () => {
    const { wrapper, drag, key, entry } = mountEntry()
    await drag(at(1, 1), at(1, 2))
    await drag(at(9, 9), at(8, 8), at(7, 7))
    await key('Escape')
    expect(entry().selectedThermometer.value).toBeNull()

    const tube = wrapper.findAll('.grid-board__thermometer')[1]!.find('.grid-board__tube')
    await tube.trigger('pointerdown', { button: 0, pointerId: 3 })
    await tube.trigger('pointerup', { pointerId: 3 })
    expect(entry().selectedThermometer.value).toBe(1)
    expect(wrapper.findAll('.grid-board__thermometer')[1]!.classes()).toContain('is-selected')

    await key('Delete')
    expect(entry().thermometers.value).toEqual([[at(1, 1), at(1, 2)]])
    expect(entry().selectedThermometer.value).toBeNull()
  })

  it('should add a thermometer typed as cell names and explain a bad one', () => {
    const { entry } = mountEntry()
    expect(entry().addThermometerFromText('r1c1 r1c3')).toMatch(/don't touch/)
    expect(entry().addThermometerFromText('r1c1 x9')).toMatch(/not a cell name/)
    expect(entry().addThermometerFromText('r1c1 → r2c2 → r3c3')).toBeNull()
    expect(entry().thermometers.value).toEqual([[at(1, 1), at(2, 2), at(3, 3)]])
  })

  it('should change nothing when the grid is read-only', async () => {
    const { entry, key, drag } = mountEntry(false)
    entry().select(0)
    await key('5')
    await drag(at(1, 1), at(1, 2))
    expect(entry().givensString.value).toBe('.'.repeat(81))
    expect(entry().thermometers.value).toEqual([])
  })
})
