// Grid geometry against the trade's own facts: 27 houses of nine cells, boxes numbered left to
// right and top to bottom, 20 peers per cell (8 in the row, 8 in the column, 4 more in the box),
// and r3c4 notation with rows and columns counted from 1.
import { describe, expect, test } from 'vitest'
import { boxOf, cellName, colOf, gridString, houseCells, parseCellName, PEERS, rowOf, type HouseRef } from '../../../shared/grid'

const rc = (r: number, c: number) => (r - 1) * 9 + (c - 1)
const names = (cells: number[]) => cells.map(cellName)

describe('houseCells', () => {
  test('houseCells(row 3) => r3c1 … r3c9, left to right', () => {
    expect(names(houseCells({ kind: 'row', index: 2 }))).toEqual(['r3c1', 'r3c2', 'r3c3', 'r3c4', 'r3c5', 'r3c6', 'r3c7', 'r3c8', 'r3c9'])
  })

  test('houseCells(column 7) => r1c7 … r9c7, top to bottom', () => {
    expect(names(houseCells({ kind: 'column', index: 6 }))).toEqual(['r1c7', 'r2c7', 'r3c7', 'r4c7', 'r5c7', 'r6c7', 'r7c7', 'r8c7', 'r9c7'])
  })

  test('houseCells(box 6) => the middle-right box, in reading order', () => {
    expect(names(houseCells({ kind: 'box', index: 5 }))).toEqual(['r4c7', 'r4c8', 'r4c9', 'r5c7', 'r5c8', 'r5c9', 'r6c7', 'r6c8', 'r6c9'])
  })

  test('every cell lies in exactly the row, column and box that rowOf, colOf and boxOf name', () => {
    const of = { row: rowOf, column: colOf, box: boxOf }
    for (const kind of ['row', 'column', 'box'] as const) {
      for (let index = 0; index < 9; index++) {
        const house: HouseRef = { kind, index }
        const expected = Array.from({ length: 81 }, (_, c) => c).filter((c) => of[kind](c) === index)
        expect(houseCells(house)).toEqual(expected)
      }
    }
  })

  test('houseCells returns a fresh list the caller may change', () => {
    const first = houseCells({ kind: 'row', index: 0 })
    first.push(99)
    expect(houseCells({ kind: 'row', index: 0 })).toHaveLength(9)
  })

  test('houseCells(an index outside 0..8) => throws "houseCells: box index 9 is not 0..8"', () => {
    expect(() => houseCells({ kind: 'box', index: 9 })).toThrow('houseCells: box index 9 is not 0..8')
    expect(() => houseCells({ kind: 'row', index: -1 })).toThrow('houseCells: row index -1 is not 0..8')
  })
})

describe('peers and names', () => {
  test('every cell has 20 peers, all sharing its row, column or box', () => {
    for (let c = 0; c < 81; c++) {
      expect(PEERS[c]).toHaveLength(20)
      for (const p of PEERS[c]) expect(rowOf(p) === rowOf(c) || colOf(p) === colOf(c) || boxOf(p) === boxOf(c)).toBe(true)
    }
  })

  test('cellName and parseCellName round-trip all 81 cells; r9c9 is the last', () => {
    for (let c = 0; c < 81; c++) expect(parseCellName(cellName(c))).toBe(c)
    expect(cellName(rc(9, 9))).toBe('r9c9')
    expect(parseCellName('R3C4')).toBe(rc(3, 4))
  })

  test('gridString(81 digits) => "." for empty cells', () => {
    const digits = Array.from({ length: 81 }, (_, c) => (c % 10 === 0 ? 0 : (c % 9) + 1))
    expect(gridString(digits)).toBe(digits.map((d) => (d === 0 ? '.' : String(d))).join(''))
  })
})
