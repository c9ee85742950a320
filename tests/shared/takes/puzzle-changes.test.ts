import { describe, expect, test } from 'vitest'
import { describePuzzleChanges, puzzleChanges } from '../../../shared/takes/puzzle-changes'

const empty = '.'.repeat(81)
const put = (givens: string, cell: number, digit: string) => givens.slice(0, cell) + digit + givens.slice(cell + 1)

describe('puzzleChanges', () => {
  test('the same grid has no changes', () => {
    expect(puzzleChanges({ givens: put(empty, 0, '5'), thermometers: [[0, 1, 2]] }, { givens: put(empty, 0, '5'), thermometers: [[0, 1, 2]] })).toBeNull()
  })

  test('counts givens added, removed and changed', () => {
    const made = put(put(empty, 0, '5'), 10, '3')
    const now = put(put(put(empty, 0, '6'), 40, '1'), 41, '2')
    expect(puzzleChanges({ givens: made, thermometers: [] }, { givens: now, thermometers: [] })?.givens).toEqual({ added: 2, removed: 1, changed: 1 })
  })

  test('a thermometer read the other way round is another thermometer (its bulb moved)', () => {
    const changes = puzzleChanges({ givens: empty, thermometers: [[0, 1, 2], [9, 18]] }, { givens: empty, thermometers: [[2, 1, 0], [9, 18]] })
    expect(changes?.thermometers).toEqual({ added: 1, removed: 1 })
  })

  test('says the changes as one phrase', () => {
    expect(describePuzzleChanges({ givens: { added: 2, removed: 0, changed: 1 }, thermometers: { added: 0, removed: 1 } })).toBe(
      '2 givens added, 1 given changed and 1 thermometer removed',
    )
    expect(describePuzzleChanges({ givens: { added: 0, removed: 1, changed: 0 }, thermometers: { added: 0, removed: 0 } })).toBe('1 given removed')
  })
})
