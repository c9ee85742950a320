/**
 * Grid geometry: houses, peers and cell naming, computed once at load.
 * Cells are 0..80 row-major; houses 0..8 are rows, 9..17 columns, 18..26 boxes.
 */
import type { Cell, HouseKind, HouseRef } from '../schemas/step'

/** All digits as a 9-bit mask (bit d − 1 for digit d). */
export const ALL_DIGITS = 0x1ff

/** Row index 0..8 of a cell. */
export const rowOf = (cell: Cell): number => (cell / 9) | 0
/** Column index 0..8 of a cell. */
export const colOf = (cell: Cell): number => cell % 9
/** Box index 0..8 of a cell, boxes row-major from the top left. */
export const boxOf = (cell: Cell): number => 3 * ((cell / 27) | 0) + (((cell % 9) / 3) | 0)

/** The 27 houses as cell lists: rows, then columns, then boxes. */
export const HOUSES: readonly Int8Array[] = buildHouses()
/** For each cell, the indexes of its row, column and box houses. */
export const CELL_HOUSES: readonly Int8Array[] = buildCellHouses()
/** For each cell, its 20 peers (cells sharing a row, column or box). */
export const PEERS: readonly Int8Array[] = buildPeers()
/** Number of set bits for every 9-bit mask. */
export const POPCOUNT: Uint8Array = buildPopcount()

/** The house index (0..26) a reference points to. */
export function houseIndex(h: HouseRef): number {
  return (h.kind === 'row' ? 0 : h.kind === 'column' ? 9 : 18) + h.index
}

/** The reference for a house index 0..26. */
export function houseRef(index: number): HouseRef {
  const kind: HouseKind = index < 9 ? 'row' : index < 18 ? 'column' : 'box'
  return { kind, index: index % 9 }
}

/** The nine cells of a house, in reading order (left to right, then top to bottom). */
export function houseCells(h: HouseRef): Cell[] {
  if (!Number.isInteger(h.index) || h.index < 0 || h.index > 8) throw new Error(`houseCells: ${h.kind} index ${h.index} is not 0..8`)
  return Array.from(HOUSES[houseIndex(h)])
}

/** "r1c1" style name of a cell, rows and columns counted from 1. */
export function cellName(cell: Cell): string {
  if (!Number.isInteger(cell) || cell < 0 || cell > 80) throw new Error(`cellName: ${cell} is not a cell index 0..80`)
  return `r${rowOf(cell) + 1}c${colOf(cell) + 1}`
}

/** "row 3, column 4": how a screen reader should say a cell (it spells "r3c4" out letter by letter). */
export function cellSpokenName(cell: Cell): string {
  return `row ${rowOf(cell) + 1}, column ${colOf(cell) + 1}`
}

/** Reads "r3c4" (either letter case) back into a cell index, or null when it is not a cell name. */
export function parseCellName(s: string): Cell | null {
  const m = /^[rR]([1-9])[cC]([1-9])$/.exec(typeof s === 'string' ? s.trim() : '')
  return m ? (Number(m[1]) - 1) * 9 + Number(m[2]) - 1 : null
}

/** "row 3", "column 4" or "box 5", counted from 1. */
export function houseName(h: HouseRef): string {
  return `${h.kind} ${h.index + 1}`
}

/** An 81-character grid string from digits, '.' for empty cells. */
export function gridString(digits: ArrayLike<number>): string {
  if (digits.length !== 81) throw new Error(`gridString: expected 81 digits, got ${digits.length}`)
  let s = ''
  for (let i = 0; i < 81; i++) {
    const d = digits[i]
    s += d >= 1 && d <= 9 ? String(d) : '.'
  }
  return s
}

/** Digits present in a mask, ascending. */
export function digitsOf(mask: number): number[] {
  const out: number[] = []
  for (let d = 1; d <= 9; d++) if (mask & (1 << (d - 1))) out.push(d)
  return out
}

/** The mask of a list of digits. */
export function maskOf(digits: readonly number[]): number {
  let m = 0
  for (const d of digits) m |= 1 << (d - 1)
  return m
}

/** Lowest digit in a non-empty mask. */
export function lowestDigit(mask: number): number {
  return 32 - Math.clz32(mask & -mask)
}

/** Highest digit in a non-empty mask. */
export function highestDigit(mask: number): number {
  return 32 - Math.clz32(mask)
}

/** Mask of the digits strictly greater than v (v in 0..9). */
export function digitsAbove(v: number): number {
  return (ALL_DIGITS << v) & ALL_DIGITS
}

/** Mask of the digits strictly smaller than v (v in 1..10). */
export function digitsBelow(v: number): number {
  return (1 << (v - 1)) - 1
}

/** True when two cells touch by a side or a corner. */
export function kingAdjacent(a: Cell, b: Cell): boolean {
  return a !== b && Math.abs(rowOf(a) - rowOf(b)) <= 1 && Math.abs(colOf(a) - colOf(b)) <= 1
}

/** Chebyshev distance between two cells, used to keep consecutive steps near each other. */
export function cellDistance(a: Cell, b: Cell): number {
  return Math.max(Math.abs(rowOf(a) - rowOf(b)), Math.abs(colOf(a) - colOf(b)))
}

function buildHouses(): Int8Array[] {
  const houses: Int8Array[] = []
  for (let r = 0; r < 9; r++) houses.push(Int8Array.from({ length: 9 }, (_, c) => r * 9 + c))
  for (let c = 0; c < 9; c++) houses.push(Int8Array.from({ length: 9 }, (_, r) => r * 9 + c))
  for (let b = 0; b < 9; b++) {
    const r0 = 3 * ((b / 3) | 0)
    const c0 = 3 * (b % 3)
    houses.push(Int8Array.from({ length: 9 }, (_, i) => (r0 + ((i / 3) | 0)) * 9 + c0 + (i % 3)))
  }
  return houses
}

function buildCellHouses(): Int8Array[] {
  return Array.from({ length: 81 }, (_, c) => Int8Array.of(rowOf(c), 9 + colOf(c), 18 + boxOf(c)))
}

function buildPeers(): Int8Array[] {
  return Array.from({ length: 81 }, (_, c) => {
    const set = new Set<number>()
    // HOUSES and CELL_HOUSES are initialised above PEERS, so they are ready here
    for (const h of CELL_HOUSES[c]) for (const p of HOUSES[h]) if (p !== c) set.add(p)
    return Int8Array.from([...set].sort((a, b) => a - b))
  })
}

function buildPopcount(): Uint8Array {
  const t = new Uint8Array(512)
  for (let m = 1; m < 512; m++) t[m] = t[m >> 1] + (m & 1)
  return t
}
