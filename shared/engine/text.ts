/** One-line plain descriptions of steps, in Gridcue's own wording; the narration lives in shared/script. */
import { cellName, houseName } from '../grid'
import { byFactsKind, type FactsTable } from './facts-table'
import type { Cell, ChainLink, Digit, Elimination, FactsOf, HouseRef, Step } from './types'

type Described = Omit<Step, 'text' | 'marks'>

/** A one-line description of a step. */
export function describeStep(step: Described): string {
  return byFactsKind(DESCRIBE, step.facts, step)
}

const DESCRIBE: FactsTable<string, [Described]> = {
  'single-cell': (f) => `${cellName(f.cell)} = ${f.digit}: last candidate in the cell`,
  'single-house': (f) => `${cellName(f.cell)} = ${f.digit}: only place for ${f.digit} in ${houseName(f.house)}`,
  subset: (f, step) => {
    const size = f.cells.length === 2 ? 'pair' : 'triple'
    if (f.form === 'naked') {
      return `${listCells(f.cells)} hold only ${listDigits(f.digits)} in ${houseName(f.house)} (${size}), so ${removals(step.eliminations)}`
    }
    return `${listDigits(f.digits)} fit only in ${listCells(f.cells)} in ${houseName(f.house)} (${size}), so ${removals(step.eliminations)}`
  },
  locked: (f, step) => {
    const box = `box ${f.box + 1}`
    const line = houseName(f.line)
    return f.direction === 'box-to-line'
      ? `In ${box} the ${f.digit}s lie only in ${line}, so ${removals(step.eliminations)}`
      : `In ${line} the ${f.digit}s lie only in ${box}, so ${removals(step.eliminations)}`
  },
  'thermo-length': (f) =>
    `Thermometer ${f.thermometer + 1} has ${f.length} cells, so each cell is held to a range by its position: ${f.ranges.map((r) => `${cellName(r.cell)} ${r.min}-${r.max}`).join(', ')}`,
  'thermo-bounds': (f) => {
    const bound = f.direction === 'min' ? `is at least ${f.fromDigit}, so the cells after it rise above it` : `is at most ${f.fromDigit}, so the cells before it stay below it`
    const ranges = f.ranges.map((r) => `${cellName(r.cell)} ${r.min === r.max ? `= ${r.min}` : `${r.min}-${r.max}`}`).join(', ')
    return `Thermometer ${f.thermometer + 1}: ${cellName(f.fromCell)} ${bound}${f.withSudoku ? ' (counting digits already in their houses)' : ''}: ${ranges}`
  },
  'thermo-pointing': (f, step) => {
    const thermometers = [...new Set(f.homes.map((h) => h.thermometer + 1))]
    const nearest = Math.min(...f.homes.map((h) => h.steps))
    const where = `all ${f.side} ${cellName(f.cell)} on thermometer${thermometers.length > 1 ? 's' : ''} ${listWords(thermometers.map(String))}, the nearest ${nearest} place${nearest > 1 ? 's' : ''} away`
    return `In ${houseName(f.house)} the ${f.digit}s lie only in ${listCells(f.homes.map((h) => h.cell))}, ${where}, so ${cellName(f.cell)} is at ${f.side === 'before' ? 'least' : 'most'} ${f.bound}: ${removals(step.eliminations)}`
  },
  'thermo-either': (f, step) => {
    const branch = (h: FactsOf<'thermo-either'>['homes'][number]) => {
      if (h.via === 'itself') return `if ${cellName(h.cell)}, it is ${f.digit}`
      if (h.via === 'house') return `if ${cellName(h.cell)}, ${cellName(f.cell)} (same ${houseName(h.house)}) is not ${f.digit}`
      const apart = `${h.steps} place${h.steps > 1 ? 's' : ''} ${h.side === 'before' ? 'after' : 'before'} it on thermometer ${h.thermometer + 1}`
      const bound = h.side === 'before' ? `at least ${f.digit + h.steps}` : `at most ${f.digit - h.steps}`
      return `if ${cellName(h.cell)}, ${cellName(f.cell)} (${apart}) is ${bound}`
    }
    const [a, b] = f.homes
    return `The ${f.digit} in ${houseName(f.house)} is in ${cellName(a.cell)} or ${cellName(b.cell)}: ${branch(a)}; ${branch(b)}; so ${removals(step.eliminations)}`
  },
  'thermo-ends': (f, step) => {
    const [a, b] = f.homes
    const run = f.end === 'tip' ? 'climb one by one to a 9 at the tip' : 'fall one by one to a 1 at the bulb'
    return `The ${f.digit} in ${houseName(f.house)} is in ${cellName(a.cell)} or ${cellName(b.cell)}, and from either its thermometer must ${run}, so ${cellName(a.end)} or ${cellName(b.end)} is ${f.end === 'tip' ? 9 : 1}: ${removals(step.eliminations)}`
  },
  fish: (f, step) => {
    const name = f.baseLines.length === 2 ? 'X-wing' : 'swordfish'
    return `In ${listLines(f.baseLines)} the ${f.digit}s lie only in ${listLines(f.coverLines)} (${name}), so ${removals(step.eliminations)}`
  },
  wing: (f, step) => {
    const [a, b] = f.pincers
    const pair = (d: Digit) => `${d}/${f.digit}`
    const pivot = `${cellName(f.pivot)} (${f.pivotDigits.join('/')}) with ${cellName(a)} (${pair(f.pincerDigits[0])}) and ${cellName(b)} (${pair(f.pincerDigits[1])})`
    return f.form === 'xy'
      ? `${pivot}: one of ${cellName(a)} and ${cellName(b)} is ${f.digit} (XY-wing), so ${removals(step.eliminations)}`
      : `${pivot}: one of the three is ${f.digit} (XYZ-wing), so ${removals(step.eliminations)}`
  },
  'w-wing': (f, step) => {
    const [x, y] = f.cells
    const [lx, ly] = f.link.cells
    return `${cellName(x)} and ${cellName(y)} hold only ${listDigits(f.digits)}, and the ${f.link.digit} in ${houseName(f.link.house)} is in ${cellName(lx)} or ${cellName(ly)}, which see them: one of them is ${f.digit} (W-wing), so ${removals(step.eliminations)}`
  },
  'either-way': (f) => {
    const places = f.sides.map((s) => cellName(s.cell))
    const choice = f.house ? `The ${f.sides[0].digit} in ${houseName(f.house)} is in ${orList(places)}` : `${places[0]} is ${orList(f.sides.map((s) => String(s.digit)))}`
    const side = (s: FactsOf<'either-way'>['sides'][number]) => `if ${cellName(s.cell)} = ${s.digit}: ${s.chain.length ? s.chain.map(describeLink).join(', then ') : 'that alone does it'}`
    const outcome = [...f.placed.map((p) => `${cellName(p.cell)} = ${p.digit}`), ...(f.eliminated.length ? [removals(f.eliminated)] : [])].join(', ')
    return `${choice}: ${f.sides.map(side).join('; ')}; either way ${outcome}`
  },
  contradiction: (f) => {
    const moves = f.chain.map(describeLink)
    const end = f.emptyCell !== undefined ? `${cellName(f.emptyCell)} has no candidate left` : f.emptyHouse ? `${houseName(f.emptyHouse.house)} has no place for ${f.emptyHouse.digit}` : 'nothing fits'
    return `If ${cellName(f.cell)} were ${f.assumed}: ${[...moves, end].join(', then ')}; so ${cellName(f.cell)} is not ${f.assumed}`
  },
}

function describeLink(link: ChainLink): string {
  return link.kind === 'place' ? `${cellName(link.cell)} = ${link.digits[0]}` : `${cellName(link.cell)} loses ${listDigits(link.digits)}`
}

function removals(eliminations: Elimination[]): string {
  return eliminations.map((e) => `${cellName(e.cell)} loses ${listDigits(e.digits)}`).join(', ')
}

/** "rows 2 and 7", "columns 3, 5 and 8": lines of one kind. */
function listLines(lines: HouseRef[]): string {
  return `${lines[0]?.kind ?? 'row'}s ${listWords(lines.map((h) => String(h.index + 1)))}`
}

function listCells(cells: Cell[]): string {
  return listWords(cells.map(cellName))
}

function listDigits(digits: Digit[]): string {
  return listWords(digits.map(String))
}

function orList(words: string[]): string {
  return `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`
}

function listWords(words: string[]): string {
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`
}
