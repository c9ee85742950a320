import { describe, expect, it } from 'vitest'
import { fireEvent, render, screen, within } from '@testing-library/vue'
import { maskOf } from '@shared/grid'
import GridBoard from '@/components/GridBoard.vue'
import type { GridBoardProps } from '@/components/GridBoard.vue'
import './render'

const empty = () => new Array<number>(81).fill(0)
const cellIndex = (r: number, c: number) => (r - 1) * 9 + (c - 1)
const ALL = maskOf([1, 2, 3, 4, 5, 6, 7, 8, 9])

/** A 7 given at r3c4 and a deduced 5 at r1c1, plus whatever the test adds. */
function boardProps(overrides: Partial<GridBoardProps> = {}): GridBoardProps {
  const digits = empty()
  const givens = empty()
  digits[cellIndex(3, 4)] = 7
  givens[cellIndex(3, 4)] = 1
  digits[cellIndex(1, 1)] = 5
  return { digits, givens, thermometers: [], ...overrides }
}

const renderBoard = (overrides: Partial<GridBoardProps> = {}) => render(GridBoard, { props: boardProps(overrides) })
const grid = () => screen.getByRole('grid')
/** The cell at row r, column c, found by its name ("row 3, column 4, …"). */
const cell = (r: number, c: number) => screen.getByRole('gridcell', { name: new RegExp(`^row ${r}, column ${c},`) })

// Drawing details that no cell name carries (shapes beside the tints, one text per cell) are counted by SVG
// element; the overlays are aria-hidden, since the cell names already say what they show.
const shapes = (tag: 'path' | 'rect' | 'line' | 'text') => grid().querySelectorAll(tag).length
const pathThrough = (d: string) => Array.from(grid().querySelectorAll('path')).find((p) => p.getAttribute('d') === d)

describe('GridBoard', () => {
  it('should expose a named grid of 9 rows with 81 cells', () => {
    renderBoard({ label: 'Replay grid' })
    const named = screen.getByRole('grid', { name: 'Replay grid' })
    expect(within(named).getAllByRole('row')).toHaveLength(9)
    expect(within(named).getAllByRole('gridcell')).toHaveLength(81)
    expect(within(named).getAllByRole('row')[2]).toContainElement(cell(3, 4))
  })

  it('should name cells like "row 3, column 4, 7, given", telling givens from deduced digits, and draw the digits', () => {
    renderBoard()
    expect(cell(3, 4)).toHaveAccessibleName('row 3, column 4, 7, given')
    expect(cell(1, 1)).toHaveAccessibleName('row 1, column 1, 5')
    expect(cell(9, 9)).toHaveAccessibleName('row 9, column 9, empty')
    expect(within(grid()).getByText('7')).toBeInTheDocument()
    expect(within(grid()).getByText('5')).toBeInTheDocument()
  })

  it('should show candidates only in marked cells, one text per cell, and name them', () => {
    const candidates = new Array<number>(81).fill(ALL)
    candidates[cellIndex(3, 5)] = maskOf([1, 2, 5])
    renderBoard({ candidates, marks: [cellIndex(3, 5)] })

    expect(cell(3, 5)).toHaveAccessibleName('row 3, column 5, empty, candidates 1 2 5')
    expect(cell(3, 6)).toHaveAccessibleName('row 3, column 6, empty')
    // each digit of the text placed in its own spot of the cell's 3×3 pattern
    const marks = within(grid()).getByText('125')
    expect(marks.getAttribute('x')!.split(' ')).toHaveLength(3)
    expect(within(grid()).queryByText('123456789')).not.toBeInTheDocument()
  })

  it('should strike eliminated candidates through, even outside the marked cells', () => {
    const candidates = empty()
    candidates[cellIndex(2, 2)] = maskOf([4, 6])
    const plain = renderBoard({ candidates, marks: [cellIndex(2, 2)] })
    const linesBefore = shapes('line')
    plain.unmount()

    renderBoard({ candidates, marks: [cellIndex(2, 2)], eliminated: [{ cell: cellIndex(2, 2), digits: [8] }, { cell: cellIndex(5, 5), digits: [3] }] })
    expect(cell(2, 2)).toHaveAccessibleName('row 2, column 2, empty, candidates 4 6, removes 8')
    expect(cell(5, 5)).toHaveAccessibleName('row 5, column 5, empty, removes 3')
    expect(within(grid()).getByText('8')).toBeInTheDocument()
    expect(within(grid()).getByText('3')).toBeInTheDocument()
    // one stroke across each removed candidate
    expect(shapes('line') - linesBefore).toBe(2)
  })

  it('should mark focus and reason cells in their names, and draw a ring and hatching (not colour alone)', async () => {
    const view = renderBoard()
    const before = { path: shapes('path'), rect: shapes('rect') }
    await view.rerender(boardProps({ focus: [cellIndex(1, 2)], reasonCells: [cellIndex(1, 3)], reasonHouses: [{ kind: 'column', index: 8 }] }))

    expect(cell(1, 2)).toHaveAccessibleName('row 1, column 2, empty, focus')
    expect(cell(1, 3)).toHaveAccessibleName('row 1, column 3, empty, reason')
    expect(cell(5, 9)).toHaveAccessibleName('row 5, column 9, empty, reason')
    expect(screen.getAllByRole('gridcell', { name: /, reason$/ })).toHaveLength(10)
    // a hatch for each of the 1 + 9 reason cells; a ring inside the focus cell and one around the reason column
    expect(shapes('path') - before.path).toBe(10)
    expect(shapes('rect') - before.rect).toBe(2)
  })

  it('should draw thermometers through the cell centres, bulb first and under the digits, and read them out', () => {
    renderBoard({ thermometers: [[cellIndex(5, 5), cellIndex(5, 6), cellIndex(4, 7)]], reasonThermometers: [0], digits: Object.assign(empty(), { [cellIndex(5, 6)]: 4 }) })
    expect(grid()).toHaveAccessibleDescription('Thermometer 1: r5c5 (bulb), r5c6, r4c7, a reason for this step.')
    // cells are 100 units wide, so r5c5's centre is (450, 450)
    const tube = pathThrough('M450 450L550 450L650 350')
    expect(tube).toBeDefined()
    expect(tube!.compareDocumentPosition(within(grid()).getByText('4')) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy()
  })

  it('should number the cells of a contradiction chain in order and read the chain out', () => {
    renderBoard({ chain: [cellIndex(1, 1), cellIndex(1, 5), cellIndex(2, 5)] })
    expect(grid()).toHaveAccessibleDescription('Chain in order: r1c1, r1c5, r2c5.')
    for (const n of ['1', '2', '3']) expect(within(grid()).getByText(n)).toBeInTheDocument()
  })

  it("should read a caller's help after its own description, not instead of it", () => {
    const help = document.createElement('p')
    help.id = 'grid-help'
    help.textContent = 'Arrows move.'
    document.body.append(help)
    renderBoard({ thermometers: [[cellIndex(1, 1), cellIndex(1, 2)]], describedBy: 'grid-help' })
    expect(grid()).toHaveAccessibleDescription('Thermometer 1: r1c1 (bulb), r1c2. Arrows move.')
    help.remove()
  })

  it('should have no description when nothing is drawn across cells', () => {
    renderBoard()
    expect(grid()).not.toHaveAttribute('aria-describedby')
  })

  it('should mark placed cells and problem cells, with a mark under the digit and a ring', async () => {
    const view = renderBoard()
    const before = { line: shapes('line'), rect: shapes('rect') }
    await view.rerender(boardProps({ placed: [cellIndex(1, 1)], errorCells: [cellIndex(3, 4)] }))
    expect(cell(1, 1)).toHaveAccessibleName('row 1, column 1, 5, placed now')
    expect(cell(3, 4)).toHaveAccessibleName('row 3, column 4, 7, given, problem')
    expect(shapes('line') - before.line).toBe(1)
    expect(shapes('rect') - before.rect).toBe(1)
  })

  it('should be focusable and point at the selected cell only when interactive', async () => {
    const view = renderBoard({ interactive: true, selected: cellIndex(3, 4) })
    expect(grid()).toHaveAttribute('tabindex', '0')
    expect(grid()).toHaveAttribute('aria-activedescendant', cell(3, 4).id)
    expect(cell(3, 4)).toHaveAttribute('aria-selected', 'true')
    expect(grid()).not.toHaveAttribute('aria-readonly')

    await view.rerender(boardProps({ interactive: false, selected: cellIndex(3, 4) }))
    expect(grid()).not.toHaveAttribute('tabindex')
    expect(grid()).not.toHaveAttribute('aria-activedescendant')
    expect(grid()).toHaveAttribute('aria-readonly', 'true')
  })

  it('should report cells and thermometers under the pointer when interactive', async () => {
    const view = renderBoard({ interactive: true, thermometers: [[0, 1]] })
    await fireEvent.pointerDown(cell(2, 2), { button: 0, pointerId: 1 })
    await fireEvent.pointerMove(cell(2, 3), { pointerId: 1 })
    await fireEvent.pointerUp(cell(2, 3), { pointerId: 1 })
    expect((view.emitted('cell-down') as unknown[][])[0][0]).toBe(cellIndex(2, 2))
    expect(view.emitted('cell-enter')).toEqual([[cellIndex(2, 3)]])
    expect(view.emitted('cell-up')).toEqual([[cellIndex(2, 3)]])

    const tube = pathThrough('M50 50L150 50')!
    await fireEvent.pointerDown(tube, { button: 0, pointerId: 2 })
    await fireEvent.pointerUp(tube, { pointerId: 2 })
    expect(view.emitted('thermometer-click')).toEqual([[0]])
  })

  it('should ignore pointer input when not interactive', async () => {
    const view = renderBoard({ thermometers: [[0, 1]] })
    await fireEvent.pointerDown(cell(2, 2), { button: 0 })
    await fireEvent.pointerUp(cell(2, 2))
    expect(view.emitted('cell-down')).toBeUndefined()
    expect(view.emitted('cell-up')).toBeUndefined()
  })

  it('should keep the node count small with every cell pencil-marked', () => {
    renderBoard({ candidates: new Array<number>(81).fill(ALL), marks: Array.from({ length: 81 }, (_, i) => i) })
    // The replay re-renders for every step: one <text> per cell for its marks, not one per candidate.
    expect(within(grid()).getAllByText('123456789')).toHaveLength(79)
    expect(shapes('text')).toBeLessThan(100)
  })

  it('should redraw only the cells a change touches, and keep every cell current', async () => {
    const candidates = new Array<number>(81).fill(maskOf([1, 2, 3]))
    const digits = Object.assign(empty(), { [cellIndex(3, 4)]: 7 })
    const start = boardProps({ digits, candidates, marks: [cellIndex(5, 5), cellIndex(9, 9)] })
    const view = render(GridBoard, { props: start })
    const untouched = cell(1, 1)
    const given = within(grid()).getByText('7')

    // The next step: r5c5 gets a 2, r9c9 loses a candidate and is the focus.
    const fewer = [...candidates]
    fewer[cellIndex(9, 9)] = maskOf([1, 3])
    await view.rerender({ ...start, digits: Object.assign([...digits], { [cellIndex(5, 5)]: 2 }), candidates: fewer, focus: [cellIndex(9, 9)], placed: [cellIndex(5, 5)] })

    expect(cell(5, 5)).toHaveAccessibleName('row 5, column 5, 2, placed now')
    expect(cell(9, 9)).toHaveAccessibleName('row 9, column 9, empty, candidates 1 3, focus')
    expect(within(grid()).getByText('2')).toBeInTheDocument()
    expect(within(grid()).getByText('13')).toBeInTheDocument()
    expect(within(grid()).queryByText('123')).not.toBeInTheDocument()
    // Cells the step didn't touch keep their elements.
    expect(cell(1, 1)).toBe(untouched)
    expect(within(grid()).getByText('7')).toBe(given)

    // And back: nothing stale is left behind.
    await view.rerender({ ...start, focus: [], placed: [] })
    expect(cell(5, 5)).toHaveAccessibleName('row 5, column 5, empty, candidates 1 2 3')
    expect(cell(9, 9)).toHaveAccessibleName('row 9, column 9, empty, candidates 1 2 3')
    expect(within(grid()).queryByText('2')).not.toBeInTheDocument()
    expect(within(grid()).getAllByText('123')).toHaveLength(2)
  })
})
