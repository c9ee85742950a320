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

/**
 * A thermometer named by where it lies, so a viewer finds it at once: in coordinates by its bulb
 * ("the r4c2 thermometer"); in words, the first of these that no other thermometer shares: "the
 * thermometer" when it is the only one, "the long thermometer" for the one clearly longest (six
 * cells or more), the box holding most of its cells ("the thermometer in the central box"), the
 * row or column it runs along, and else its bulb ("the thermometer starting at row 3, column 4").
 * Never the box of the bulb alone, which misleads when most of it lies elsewhere.
 */
export function thermoWords(index: number, n: Namer): string {
  const path = n.thermometers[index]
  if (!path) return 'the thermometer'
  if (n.style === 'coords') return `the ${cellWords(path[0], n)} thermometer`
  return thermoNames(n.thermometers)[index]
}

const NAMES_MEMO = new WeakMap<Cell[][], string[]>()

function thermoNames(thermometers: Cell[][]): string[] {
  const memo = NAMES_MEMO.get(thermometers)
  if (memo) return memo
  const words: Namer = { style: 'words', thermometers }
  // each rule gives a name or null; a name is kept only when no other thermometer gets it
  const rules: ((path: Cell[]) => string | null)[] = [
    () => (thermometers.length === 1 ? 'the thermometer' : null),
    (path) => {
      const longest = Math.max(...thermometers.map((p) => p.length))
      return path.length >= 6 && path.length === longest ? 'the long thermometer' : null
    },
    (path) => {
      const counts = new Array<number>(9).fill(0)
      for (const c of path) counts[boxOf(c)]++
      const most = Math.max(...counts)
      return most * 2 > path.length ? `the thermometer in ${boxWords(counts.indexOf(most), words)}` : null
    },
    (path) => {
      if (path.every((c) => rowOf(c) === rowOf(path[0]))) return `the thermometer along row ${rowOf(path[0]) + 1}`
      if (path.every((c) => colOf(c) === colOf(path[0]))) return `the thermometer down column ${colOf(path[0]) + 1}`
      return null
    },
  ]
  const names = thermometers.map((path) => {
    for (const rule of rules) {
      const name = rule(path)
      if (name && thermometers.filter((other) => rule(other) === name).length === 1) return name
    }
    return `the thermometer starting at ${cellWords(path[0], words)}`
  })
  NAMES_MEMO.set(thermometers, names)
  return names
}

/**
 * Cells inside a house that was just named, without naming it again: "columns 1, 7 and 8" after
 * "row 4" (never "row 4, row 4, columns 1, 7 and 8"); full names in a box or in coordinates.
 */
export function cellsInHouse(cells: Cell[], house: HouseRef, n: Namer): string {
  if (n.style === 'words' && house.kind !== 'box' && cells.length > 0) {
    const kind = house.kind === 'row' ? 'column' : 'row'
    const of = house.kind === 'row' ? colOf : rowOf
    return `${kind}${cells.length > 1 ? 's' : ''} ${andList(cells.map((c) => of(c) + 1))}`
  }
  return cellsWords(cells, n)
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
