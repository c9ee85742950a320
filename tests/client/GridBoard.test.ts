import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import GridBoard from '@/components/GridBoard.vue'
import type { GridBoardProps } from '@/components/GridBoard.vue'

const empty = () => new Array<number>(81).fill(0)
const cellIndex = (r: number, c: number) => (r - 1) * 9 + (c - 1)
const mask = (...digits: number[]) => digits.reduce((m, d) => m | (1 << (d - 1)), 0)

function board(overrides: Partial<GridBoardProps> = {}) {
  const digits = empty()
  const givens = empty()
  digits[cellIndex(3, 4)] = 7
  givens[cellIndex(3, 4)] = 1
  digits[cellIndex(1, 1)] = 5 // deduced
  const props: GridBoardProps = { digits, givens, thermometers: [], ...overrides }
  return mount(GridBoard, { props })
}

const cell = (wrapper: ReturnType<typeof board>, r: number, c: number) => wrapper.find(`[data-cell="${cellIndex(r, c)}"]`)

describe('GridBoard', () => {
  it('should expose a named grid of 9 rows with 81 cells', () => {
    const wrapper = board({ label: 'Replay grid' })
    const grid = wrapper.find('[role="grid"]')
    expect(grid.attributes('aria-label')).toBe('Replay grid')
    expect(wrapper.findAll('[role="row"]')).toHaveLength(9)
    expect(wrapper.findAll('[role="gridcell"]')).toHaveLength(81)
  })

  it('should name cells like "r3c4, given 7" and tell givens from deduced digits', () => {
    const wrapper = board()
    expect(cell(wrapper, 3, 4).attributes('aria-label')).toBe('r3c4, given 7')
    expect(cell(wrapper, 1, 1).attributes('aria-label')).toBe('r1c1, 5')
    expect(cell(wrapper, 9, 9).attributes('aria-label')).toBe('r9c9, empty')

    const given = wrapper.findAll('.grid-board__digit--given')
    const deduced = wrapper.findAll('.grid-board__digit--deduced')
    expect(given.map((t) => t.text())).toEqual(['7'])
    expect(deduced.map((t) => t.text())).toEqual(['5'])
  })

  it('should show candidates only in marked cells and name them', () => {
    const candidates = new Array<number>(81).fill(mask(1, 2, 3, 4, 5, 6, 7, 8, 9))
    candidates[cellIndex(3, 5)] = mask(1, 2, 5)
    const wrapper = board({ candidates, marks: [cellIndex(3, 5)] })

    // One <text> per cell, each digit placed in its own spot of the cell's 3×3 pattern.
    const shown = wrapper.findAll('.grid-board__candidate')
    expect(shown.map((t) => t.text())).toEqual(['125'])
    expect(shown[0].attributes('x')!.split(' ')).toHaveLength(3)
    expect(cell(wrapper, 3, 5).attributes('aria-label')).toBe('r3c5, empty, candidates 1 2 5')
    expect(cell(wrapper, 3, 6).attributes('aria-label')).toBe('r3c6, empty')
  })

  it('should strike eliminated candidates through, even outside the marked cells', () => {
    const candidates = new Array<number>(81).fill(0)
    candidates[cellIndex(2, 2)] = mask(4, 6)
    const wrapper = board({ candidates, marks: [cellIndex(2, 2)], eliminated: [{ cell: cellIndex(2, 2), digits: [8] }, { cell: cellIndex(5, 5), digits: [3] }] })

    const struck = wrapper.findAll('.grid-board__candidate--struck')
    expect(struck.map((t) => t.text())).toEqual(['8', '3'])
    expect(wrapper.findAll('.grid-board__strike')).toHaveLength(2)
    expect(cell(wrapper, 2, 2).attributes('aria-label')).toBe('r2c2, empty, candidates 4 6, removes 8')
  })

  it('should mark focus with a fill and an inner ring, and reason with a fill and a hatch', () => {
    const wrapper = board({ focus: [cellIndex(1, 2)], reasonCells: [cellIndex(1, 3)], reasonHouses: [{ kind: 'column', index: 8 }] })

    expect(cell(wrapper, 1, 2).classes()).toContain('grid-board__cell--focus')
    expect(cell(wrapper, 1, 3).classes()).toContain('grid-board__cell--reason')
    expect(cell(wrapper, 5, 9).classes()).toContain('grid-board__cell--reason')
    expect(cell(wrapper, 1, 2).attributes('aria-label')).toContain('focus')
    // Not colour alone: one inner ring for the focus cell, hatch overlays for the 1 + 9 reason cells.
    expect(wrapper.findAll('.grid-board__focus-ring')).toHaveLength(1)
    expect(wrapper.findAll('.grid-board__hatch')).toHaveLength(10)
    expect(wrapper.findAll('.grid-board__house')).toHaveLength(1)
  })

  it('should draw thermometers as a tube with a bulb on the first cell, under the digits', () => {
    const wrapper = board({ thermometers: [[cellIndex(5, 5), cellIndex(5, 6), cellIndex(4, 7)]], reasonThermometers: [0] })
    const tube = wrapper.find('.grid-board__tube')
    expect(tube.attributes('d')).toBe('M450 450L550 450L650 350')
    const bulb = wrapper.find('.grid-board__bulb')
    expect([bulb.attributes('cx'), bulb.attributes('cy')]).toEqual(['450', '450'])
    expect(wrapper.find('.grid-board__thermometer').classes()).toContain('is-reason')

    const layers = wrapper.findAll('g').map((g) => g.classes().join(' '))
    expect(layers.indexOf('grid-board__thermometers')).toBeLessThan(layers.indexOf('grid-board__digits'))
  })

  it('should number the cells of a contradiction chain in order', () => {
    const wrapper = board({ chain: [cellIndex(1, 1), cellIndex(1, 5), cellIndex(2, 5)] })
    expect(wrapper.findAll('.grid-board__chain-number').map((t) => t.text())).toEqual(['1', '2', '3'])
    expect(wrapper.find('.grid-board__chain-path').exists()).toBe(true)
  })

  it('should mark placed cells and problem cells', () => {
    const wrapper = board({ placed: [cellIndex(1, 1)], errorCells: [cellIndex(3, 4)] })
    expect(wrapper.findAll('.grid-board__placed-mark')).toHaveLength(1)
    expect(cell(wrapper, 1, 1).attributes('aria-label')).toBe('r1c1, 5, placed now')
    expect(cell(wrapper, 3, 4).classes()).toContain('grid-board__cell--error')
    expect(wrapper.findAll('.grid-board__error-ring')).toHaveLength(1)
  })

  it('should be focusable and point at the selected cell only when interactive', async () => {
    const wrapper = board({ interactive: true, selected: cellIndex(3, 4) })
    const grid = wrapper.find('[role="grid"]')
    expect(grid.attributes('tabindex')).toBe('0')
    expect(grid.attributes('aria-activedescendant')).toBe(cell(wrapper, 3, 4).attributes('id'))
    expect(cell(wrapper, 3, 4).attributes('aria-selected')).toBe('true')

    await wrapper.setProps({ interactive: false })
    expect(grid.attributes('tabindex')).toBeUndefined()
    expect(grid.attributes('aria-activedescendant')).toBeUndefined()
  })

  it('should emit cell and thermometer events from pointer input when interactive', async () => {
    const wrapper = board({ interactive: true, thermometers: [[0, 1]] })
    await cell(wrapper, 2, 2).trigger('pointerdown', { button: 0, pointerId: 1 })
    await cell(wrapper, 2, 3).trigger('pointermove', { pointerId: 1 })
    await cell(wrapper, 2, 3).trigger('pointerup', { pointerId: 1 })
    expect(wrapper.emitted('cell-down')?.[0]?.[0]).toBe(cellIndex(2, 2))
    expect(wrapper.emitted('cell-enter')).toEqual([[cellIndex(2, 3)]])
    expect(wrapper.emitted('cell-up')).toEqual([[cellIndex(2, 3)]])

    await wrapper.find('.grid-board__tube').trigger('pointerdown', { button: 0, pointerId: 2 })
    await wrapper.find('.grid-board__tube').trigger('pointerup', { pointerId: 2 })
    expect(wrapper.emitted('thermometer-click')).toEqual([[0]])
  })

  it('should ignore pointer input when not interactive', async () => {
    const wrapper = board({ thermometers: [[0, 1]] })
    await cell(wrapper, 2, 2).trigger('pointerdown', { button: 0 })
    await cell(wrapper, 2, 2).trigger('pointerup')
    expect(wrapper.emitted('cell-down')).toBeUndefined()
    expect(wrapper.emitted('cell-up')).toBeUndefined()
  })

  it('should keep the node count small with every cell pencil-marked', () => {
    const candidates = new Array<number>(81).fill(mask(1, 2, 3, 4, 5, 6, 7, 8, 9))
    const wrapper = board({ candidates, marks: Array.from({ length: 81 }, (_, i) => i) })
    // The replay re-renders for every step: one <text> per cell for its marks, not one per candidate.
    expect(wrapper.findAll('.grid-board__candidate')).toHaveLength(79)
    expect(wrapper.findAll('text').length).toBeLessThan(100)
  })

  it('should redraw only the cells a change touches, and keep every cell current', async () => {
    const digits = empty()
    const givens = empty()
    digits[cellIndex(3, 4)] = 7
    givens[cellIndex(3, 4)] = 1
    const candidates = new Array<number>(81).fill(mask(1, 2, 3))
    const wrapper = mount(GridBoard, { props: { digits, givens, thermometers: [], candidates, marks: [cellIndex(5, 5), cellIndex(9, 9)] } })
    const rect = (r: number, c: number) => cell(wrapper, r, c).element
    const untouched = rect(1, 1)
    const given = wrapper.find('.grid-board__digit--given').element

    // The next step: r5c5 gets a 2, r9c9 loses a candidate and is the focus.
    const next = [...digits]
    next[cellIndex(5, 5)] = 2
    const fewer = [...candidates]
    fewer[cellIndex(9, 9)] = mask(1, 3)
    await wrapper.setProps({ digits: next, candidates: fewer, focus: [cellIndex(9, 9)], placed: [cellIndex(5, 5)] })

    expect(cell(wrapper, 5, 5).attributes('aria-label')).toBe('r5c5, 2, placed now')
    expect(cell(wrapper, 9, 9).attributes('aria-label')).toBe('r9c9, empty, candidates 1 3, focus')
    expect(cell(wrapper, 9, 9).classes()).toContain('grid-board__cell--focus')
    expect(wrapper.findAll('.grid-board__digit--deduced').map((t) => t.text())).toEqual(['2'])
    expect(wrapper.findAll('.grid-board__candidate').map((t) => t.text())).toEqual(['13'])
    // Cells the step didn't touch keep their elements.
    expect(rect(1, 1)).toBe(untouched)
    expect(wrapper.find('.grid-board__digit--given').element).toBe(given)

    // And back: nothing stale is left behind.
    await wrapper.setProps({ digits, candidates, focus: [], placed: [] })
    expect(cell(wrapper, 5, 5).attributes('aria-label')).toBe('r5c5, empty, candidates 1 2 3')
    expect(cell(wrapper, 9, 9).classes()).toContain('grid-board__cell--plain')
    expect(wrapper.findAll('.grid-board__digit--deduced')).toHaveLength(0)
    expect(wrapper.findAll('.grid-board__candidate').map((t) => t.text())).toEqual(['123', '123'])
  })
})
