/**
 * How things are said aloud: cells, houses, thermometers, digit lists and counts,
 * in either naming style (plain words, or r3c4 coordinates).
 */
import { boxOf, colOf, rowOf, type Cell, type Digit, type HouseRef } from '../grid'
import type { NamingStyle } from '../schemas/outline'

// Boxes by position: a viewer sees "the top-left box" faster than they count to box 7.
const BOX_WORDS = ['top-left', 'top-middle', 'top-right', 'middle-left', 'central', 'middle-right', 'bottom-left', 'bottom-middle', 'bottom-right']
const NUMBER_WORDS = ['zero', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten']

/** What a script needs to name things: the style and the puzzle's thermometers. */
export interface Namer {
  style: NamingStyle
  thermometers: Cell[][]
}

export function cellWords(cell: Cell, n: Namer): string {
  return n.style === 'coords' ? `r${rowOf(cell) + 1}c${colOf(cell) + 1}` : `row ${rowOf(cell) + 1}, column ${colOf(cell) + 1}`
}

/** Several cells: "r1c2, r1c3 and r2c1"; in words they share a row or column when they can. */
export function cellsWords(cells: Cell[], n: Namer): string {
  if (n.style === 'words' && cells.length > 1) {
    const rows = new Set(cells.map(rowOf))
    const cols = new Set(cells.map(colOf))
    if (rows.size === 1) return `row ${rowOf(cells[0]) + 1}, columns ${andList(cells.map((c) => colOf(c) + 1))}`
    if (cols.size === 1) return `column ${colOf(cells[0]) + 1}, rows ${andList(cells.map((c) => rowOf(c) + 1))}`
  }
  return andList(cells.map((c) => cellWords(c, n)))
}

export function boxWords(box: number, n: Namer): string {
  return n.style === 'coords' ? `box ${box + 1}` : `the ${BOX_WORDS[box]} box`
}

/** "row 3", "column 7", "the central box" / "box 5". */
export function houseWords(h: HouseRef, n: Namer): string {
  return h.kind === 'box' ? boxWords(h.index, n) : `${h.kind} ${h.index + 1}`
}

/** "this row", "this column", "this box". */
export function thisHouse(h: HouseRef): string {
  return `this ${h.kind}`
}

/** "the thermometer in the central box"; spelled from its bulb when two bulbs share a box. */
export function thermoWords(index: number, n: Namer): string {
  const path = n.thermometers[index]
  if (!path) return 'the thermometer'
  const bulb = path[0]
  const sameBox = n.thermometers.filter((p) => boxOf(p[0]) === boxOf(bulb)).length
  if (n.style === 'coords') return `the ${cellWords(bulb, n)} thermometer`
  if (sameBox > 1) return `the thermometer starting at ${cellWords(bulb, n)}`
  return `the thermometer in ${boxWords(boxOf(bulb), n)}`
}

/** "6, 7, 8 and 9" */
export function andList(items: (string | number)[]): string {
  return joinList(items.map(String), 'and')
}

/** "3 or 8", "1, 2 or 3" */
export function orList(items: (string | number)[]): string {
  return joinList(items.map(String), 'or')
}

/** "a 4", "an 8" */
export function aDigit(d: Digit): string {
  return d === 8 ? `an ${d}` : `a ${d}`
}

/** Spelled counts read better aloud for small numbers: "five cells". */
export function countWords(n: number): string {
  return NUMBER_WORDS[n] ?? String(n)
}

export function plural(n: number, one: string, many: string): string {
  return `${countWords(n)} ${n === 1 ? one : many}`
}

/** Upper-cases a sentence start, but never a coordinate: "r3c4" stays as written. */
export function capitalise(s: string): string {
  if (s.length === 0 || /^r\dc\d/.test(s)) return s
  return s[0].toUpperCase() + s.slice(1)
}

/** Spoken words in a line: anything with a letter or digit counts ("r3c4" is one word, "—" none). */
export function wordCount(text: string): number {
  return text.split(/\s+/).filter((w) => /[\p{L}\p{N}]/u.test(w)).length
}

function joinList(items: string[], conj: string): string {
  if (items.length <= 1) return items.join('')
  if (items.length === 2) return `${items[0]} ${conj} ${items[1]}`
  return `${items.slice(0, -1).join(', ')} ${conj} ${items[items.length - 1]}`
}
