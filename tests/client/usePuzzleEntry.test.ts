import { describe, expect, it } from 'vitest'
import { spokenCell } from './support'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { defineComponent, h, ref } from 'vue'
import PuzzleGivensField from '@/components/PuzzleGivensField.vue'
import PuzzleGridEditor from '@/components/PuzzleGridEditor.vue'
import PuzzleThermometerList from '@/components/PuzzleThermometerList.vue'
import { usePuzzleEntry } from '@/composables/usePuzzleEntry'
import classic from '../fixtures/classic-puzzles.json'
import { renderComponent } from './render'

// The Wikipedia "Sudoku" example (source named in tests/fixtures/classic-puzzles.json), as nine typed rows.
const WIKI1 = classic.puzzles.find((p) => p.id === 'WIKI1')!.givens
const WIKI1_ROWS = WIKI1.match(/.{9}/g)!

/** The grid editor, the givens field and the thermometer list on one entry, as the Puzzle screen wires them. */
function renderEntry(editable = true) {
  const canEdit = ref(editable)
  const Harness = defineComponent({
    setup() {
      const entry = usePuzzleEntry({ editable: canEdit })
      return () => [
        h(PuzzleGridEditor, { entry, editable: canEdit.value }),
        h(PuzzleGivensField, { givens: entry.givensString.value, disabled: !canEdit.value, apply: entry.pasteGivens }),
        h(PuzzleThermometerList, {
          thermometers: entry.thermometerNames.value,
          selected: entry.selectedThermometer.value,
          readonly: !canEdit.value,
          add: entry.addThermometerFromText,
          onSelect: entry.onThermometerClick,
          onRemove: entry.removeThermometer,
        }),
      ]
    },
  })
  renderComponent(Harness)
  const user = userEvent.setup()
  const grid = screen.getByRole('grid', { name: /^Puzzle grid/ })
  const cell = (name: string) => within(grid).getByRole('gridcell', { name: new RegExp(`^${spokenCell(name)},`) })
  const selectedCell = () => within(grid).getByRole('gridcell', { selected: true }).getAttribute('aria-label')!.replace(/^row (\d), column (\d),.*$/, 'r$1c$2')
  const givensText = () => (screen.getByLabelText('Givens as text') as HTMLInputElement).value
  /** Each thermometer as the list reads it, bulb first. */
  const thermometers = () => screen.queryAllByRole('button', { name: /→/ }).map((b) => b.textContent!.replace(/^\d+/, '').trim())
  async function drag(...names: string[]) {
    const [first, ...rest] = names.map(cell)
    await user.pointer([{ keys: '[MouseLeft>]', target: first }, ...rest.map((target) => ({ target })), { keys: '[/MouseLeft]' }])
  }
  return { user, grid, cell, selectedCell, givensText, thermometers, drag }
}

describe('usePuzzleEntry', () => {
  it('should select r1c1 when the grid takes focus, move with arrows and stop at the edges', async () => {
    const { user, grid, selectedCell } = renderEntry()
    await user.tab()
    expect(grid).toHaveFocus()
    expect(selectedCell()).toBe('r1c1')

    await user.keyboard('{ArrowRight}{ArrowDown}{ArrowDown}')
    expect(selectedCell()).toBe('r3c2')
    await user.keyboard('{ArrowUp}{ArrowUp}{ArrowUp}')
    expect(selectedCell()).toBe('r1c2')
  })

  it('should set a given with a digit key and show it on the grid and in the text', async () => {
    const { user, grid, cell, givensText } = renderEntry()
    await user.click(cell('r3c4'))
    await user.keyboard('7')

    expect(cell('r3c4')).toHaveAccessibleName('row 3, column 4, 7, given')
    expect(grid).toHaveAttribute('aria-activedescendant', cell('r3c4').id)
    expect(givensText().slice(18, 27)).toBe('...7.....')
  })

  it('should clear a given with Backspace, Delete or 0 and undo with Ctrl+Z', async () => {
    const { user, cell } = renderEntry()
    await user.click(cell('r5c5'))
    await user.keyboard('4{Backspace}')
    expect(cell('r5c5')).toHaveAccessibleName('row 5, column 5, empty')
    await user.keyboard('6{Delete}')
    expect(cell('r5c5')).toHaveAccessibleName('row 5, column 5, empty')
    await user.keyboard('{Control>}z{/Control}')
    expect(cell('r5c5')).toHaveAccessibleName('row 5, column 5, 6, given')
    await user.keyboard('0')
    expect(cell('r5c5')).toHaveAccessibleName('row 5, column 5, empty')
  })

  it('should fill the grid from a pasted 81-character string, with line breaks allowed', async () => {
    const { user, cell, givensText } = renderEntry()
    await user.click(cell('r1c1'))
    await user.paste(WIKI1_ROWS.join('\n'))

    expect(givensText()).toBe(WIKI1)
    expect(cell('r1c1')).toHaveAccessibleName('row 1, column 1, 5, given')
    expect(cell('r9c9')).toHaveAccessibleName('row 9, column 9, 9, given')
  })

  it('should refuse a paste that is not 81 grid characters, and say why', async () => {
    const { user, cell, givensText } = renderEntry()
    await user.click(cell('r1c1'))
    await user.paste('12345')

    expect(screen.getByText(/That paste isn't a grid/)).toBeVisible()
    expect(givensText()).toBe('.'.repeat(81))
  })

  it('should fill the grid from the givens field on Enter, and explain text that is not a grid', async () => {
    const { user, cell } = renderEntry()
    const field = screen.getByLabelText('Givens as text')
    await user.clear(field)
    await user.type(field, `${'x'.repeat(81)}{Enter}`)
    expect(field).toHaveAccessibleDescription("Use 81 characters: 1-9 for a given, '.' or 0 for an empty cell.")
    expect(cell('r1c1')).toHaveAccessibleName('row 1, column 1, empty')

    await user.clear(field)
    await user.type(field, `${WIKI1}{Enter}`)
    expect(field).toHaveAccessibleDescription("81 characters, row by row; '.' for an empty cell.")
    expect(cell('r1c2')).toHaveAccessibleName('row 1, column 2, 3, given')
  })

  it('should draw a thermometer through touching cells with the bulb where the drag started', async () => {
    const { drag, thermometers } = renderEntry()
    await drag('r2c2', 'r2c3', 'r3c4', 'r4c4')
    expect(thermometers()).toEqual(['r2c2 → r2c3 → r3c4 → r4c4'])
  })

  it('should ignore a move to a cell that does not touch the last one', async () => {
    const { drag, thermometers } = renderEntry()
    // r1c1 → r1c3 skips a cell, so it is ignored; r1c2 then continues the path from r1c1.
    await drag('r1c1', 'r1c3', 'r1c2', 'r2c3')
    expect(thermometers()).toEqual(['r1c1 → r1c2 → r2c3'])
  })

  it('should take the last cell back off when the drag goes back over it, and not keep a single cell', async () => {
    const { drag, thermometers } = renderEntry()
    await drag('r5c5', 'r5c6', 'r5c5')
    expect(thermometers()).toEqual([])
    await drag('r5c5', 'r6c6', 'r7c7', 'r6c6')
    expect(thermometers()).toEqual(['r5c5 → r6c6'])
  })

  it('should select a thermometer from the list and remove it with Delete on the grid', async () => {
    const { user, grid, drag, thermometers } = renderEntry()
    await drag('r1c1', 'r1c2')
    await drag('r9c9', 'r8c8', 'r7c7')
    await user.keyboard('{Escape}')
    expect(screen.queryAllByRole('button', { pressed: true, name: /→/ })).toEqual([])

    const second = screen.getByRole('button', { name: /r9c9 → r8c8 → r7c7/ })
    await user.click(second)
    expect(second).toHaveAttribute('aria-pressed', 'true')

    // back on the grid, as after a Shift+Tab
    grid.focus()
    await user.keyboard('{Delete}')
    expect(thermometers()).toEqual(['r1c1 → r1c2'])
    expect(screen.queryAllByRole('button', { pressed: true, name: /→/ })).toEqual([])
  })

  it('should add a thermometer typed as cell names and explain a bad one', async () => {
    const { user, thermometers } = renderEntry()
    const field = screen.getByLabelText('Add by cells, bulb first')
    const add = async (text: string) => {
      await user.clear(field)
      await user.type(field, text)
      await user.click(screen.getByRole('button', { name: 'Add' }))
    }

    await add('r1c1 r1c3')
    expect(screen.getByText(/r1c1 and r1c3 don't touch/)).toBeVisible()
    await add('r1c1 x9')
    expect(screen.getByText('"x9" is not a cell name such as r3c4.')).toBeVisible()
    await add('r1c1 → r2c2 → r3c3')
    expect(thermometers()).toEqual(['r1c1 → r2c2 → r3c3'])
    expect(field).toHaveValue('')
  })

  it('should change nothing when the grid is read-only', async () => {
    const { user, grid, cell, givensText, drag, thermometers } = renderEntry(false)
    expect(grid).toHaveAttribute('aria-readonly', 'true')
    await user.click(cell('r1c1'))
    await user.keyboard('5')
    await drag('r1c1', 'r1c2')

    expect(givensText()).toBe('.'.repeat(81))
    expect(thermometers()).toEqual([])
    expect(screen.queryByLabelText('Add by cells, bulb first')).toBeNull()
  })
})
