/** One-line plain descriptions of steps, in Gridcue's own wording; the narration lives in shared/script. */
import { cellName, houseName } from '../grid'
import { byFactsKind, type FactsTable } from './facts-table'
import type { Cell, ChainLink, Digit, Elimination, Step } from './types'

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

function listCells(cells: Cell[]): string {
  return listWords(cells.map(cellName))
}

function listDigits(digits: Digit[]): string {
  return listWords(digits.map(String))
}

function listWords(words: string[]): string {
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`
}
