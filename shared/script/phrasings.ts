/**
 * The spoken phrasings, several per technique. Each one points at something, says why it
 * forces a result, and says what it gives (voice.md). They read only structured facts.
 * Sentences never start with a cell name, so r3c4 is never capitalised into "R3c4".
 */
import type { Cell, ChainLink, Digit, FactsKind, FactsOf, Step } from '../engine/types'
import {
  aDigit,
  andList,
  boxWords,
  capitalise,
  cellWords,
  cellsWords,
  countWords,
  houseWords,
  orList,
  plural,
  thermoWords,
  thisHouse,
  type Namer,
} from './words'

/** What a phrasing may look at besides the facts. */
export interface Said {
  n: Namer
  step: Step
}

export type Phrasing<K extends FactsKind> = (f: FactsOf<K>, s: Said) => string

/** "the cell at row 3, column 4" in words, "r3c4" in coordinates. */
function theCell(cell: Cell, n: Namer): string {
  return n.style === 'coords' ? cellWords(cell, n) : `the cell at ${cellWords(cell, n)}`
}

export const SINGLE_CELL: Phrasing<'single-cell'>[] = [
  (f, s) => `Look at everything ${theCell(f.cell, s.n)} can see: ${seenParts(f.seen)}. That leaves ${aDigit(f.digit)}.`,
  (f, s) =>
    `Only one digit still fits ${theCell(f.cell, s.n)}. Between its row, column and box${earlier(f.seen, ', plus what we ruled out earlier')}, the other eight are taken, so it's ${aDigit(f.digit)}.`,
  (f, s) =>
    `Count what ${theCell(f.cell, s.n)} sees${earlier(f.seen, ', plus what we ruled out earlier')}: ${andList(seenAll(f.seen))}. The one digit missing is ${f.digit}, so in it goes.`,
  (f, s) =>
    `What's left for ${theCell(f.cell, s.n)}? Everything but ${aDigit(f.digit)} is already in its row, column and box${earlier(f.seen, ', or was ruled out earlier')}. So that's ${aDigit(f.digit)}.`,
]

export const SINGLE_HOUSE: Phrasing<'single-house'>[] = [
  (f, s) => {
    const k = f.blockedCells.length
    const why =
      k === 0
        ? `It's the last empty cell there`
        : k === 1
          ? `The only other empty cell there can't take it`
          : `The other ${plural(k, 'empty cell', 'empty cells')} there can't take it`
    return `Where does the ${f.digit} go in ${houseWords(f.house, s.n)}? ${why}, so it has to be ${theCell(f.cell, s.n)}.`
  },
  (f, s) =>
    `${capitalise(houseWords(f.house, s.n))} still needs ${aDigit(f.digit)}, and only one cell can take it: ${theCell(f.cell, s.n)}.`,
  (f, s) => {
    const k = f.blockedCells.length
    const blocked = k === 0 ? 'Only one cell is still empty' : `${capitalise(countWords(k))} of its empty cells are blocked`
    return `Let's find the ${f.digit} in ${houseWords(f.house, s.n)}. ${blocked}, which leaves ${theCell(f.cell, s.n)}.`
  },
  (f, s) => `There's just one home for ${aDigit(f.digit)} in ${thisHouse(f.house)}, and it's ${theCell(f.cell, s.n)}.`,
]

export const NAKED_SUBSET: Phrasing<'subset'>[] = [
  (f, s) =>
    `These ${countWords(f.cells.length)} cells in ${houseWords(f.house, s.n)}, ${cellsWords(f.cells, s.n)}, can only be ${orList(f.digits)} between them. So those digits are spoken for, and nothing else in ${thisHouse(f.house)} can be ${f.digits.length === 2 ? 'either' : 'any of them'}.`,
  (f, s) =>
    `Look at ${cellsWords(f.cells, s.n)}: ${orList(f.digits)} and nothing else. That's a ${subsetName(f.cells.length)}, so ${andList(f.digits)} have to live in these cells.`,
  (f, s) =>
    `${capitalise(countWords(f.cells.length))} cells, ${countWords(f.digits.length)} digits: ${cellsWords(f.cells, s.n)} only hold ${orList(f.digits)}. The rest of ${houseWords(f.house, s.n)} can let go of them.`,
]

export const HIDDEN_SUBSET: Phrasing<'subset'>[] = [
  (f, s) =>
    `In ${houseWords(f.house, s.n)}, the ${andList(f.digits)} only fit in ${cellsWords(f.cells, s.n)}. Those cells have to hold them, so anything else pencilled there can go.`,
  (f, s) =>
    `Where can ${andList(f.digits)} go in ${houseWords(f.house, s.n)}? Only in ${cellsWords(f.cells, s.n)}. That's a hidden ${subsetName(f.cells.length)}: these cells are taken.`,
  (f, s) =>
    `${capitalise(houseWords(f.house, s.n))} has just ${countWords(f.cells.length)} spots for its ${andList(f.digits)}, ${cellsWords(f.cells, s.n)}. Nothing else fits in those cells now.`,
]

export const LOCKED_BOX_LINE: Phrasing<'locked'>[] = [
  (f, s) =>
    `Every place for ${aDigit(f.digit)} in ${boxWords(f.box, s.n)} sits on ${houseWords(f.line, s.n)}. Whichever it is, ${houseWords(f.line, s.n)} gets its ${f.digit} from this box, so the rest of the ${f.line.kind} can't have one.`,
  (f, s) =>
    `The ${f.digit} in ${boxWords(f.box, s.n)} is stuck on ${houseWords(f.line, s.n)}. That uses up the ${f.line.kind}'s ${f.digit}, so there's no ${f.digit} anywhere else along it.`,
  (f, s) =>
    `Look at the ${f.digit}s in ${boxWords(f.box, s.n)}: they all line up in ${houseWords(f.line, s.n)}. So we can take ${f.digit} out of the rest of that ${f.line.kind}.`,
]

export const LOCKED_LINE_BOX: Phrasing<'locked'>[] = [
  (f, s) =>
    `${capitalise(houseWords(f.line, s.n))} can only put its ${f.digit} inside ${boxWords(f.box, s.n)}. So that box's ${f.digit} is on this ${f.line.kind}, and the box's other cells can't be ${aDigit(f.digit)}.`,
  (f, s) =>
    `All the ${f.digit}s left in ${houseWords(f.line, s.n)} are in ${boxWords(f.box, s.n)}. Whichever one it is, the box has its ${f.digit}, so the rest of the box loses it.`,
  (f, s) =>
    `Where's the ${f.digit} in ${houseWords(f.line, s.n)}? Somewhere in ${boxWords(f.box, s.n)}. That rules ${f.digit} out of the rest of the box.`,
]

export const THERMO_LENGTH: Phrasing<'thermo-length'>[] = [
  (f, s) =>
    `${capitalise(thermoWords(f.thermometer, s.n))} is ${countWords(f.length)} cells long, so nothing on it is free: the bulb can be ${bulbMax(f)} at most, and the tip has to be ${tipMin(f)} or more.`,
  (f, s) =>
    `Count the cells on ${thermoWords(f.thermometer, s.n)}: ${countWords(f.length)}. Each one has to climb past the last, so the bulb stays at ${bulbMax(f)} or below and the tip starts at ${tipMin(f)}.`,
  (f, s) =>
    `With ${countWords(f.length)} cells to climb, ${thermoWords(f.thermometer, s.n)} leaves each of them only ${countWords(10 - f.length)} options: the bulb ${lengthRange(f, 0)}, the tip ${lengthRange(f, f.ranges.length - 1)}.`,
]

export const THERMO_BOUNDS: Phrasing<'thermo-bounds'>[] = [
  (f, s) =>
    f.direction === 'min'
      ? `On ${thermoWords(f.thermometer, s.n)}, ${thermoCell(f.fromCell, f.thermometer, s.n)} can't be lower than ${f.fromDigit}${withSudoku(f)}. Everything after it has to climb higher: ${rangesWords(f, s.n)}.`
      : `On ${thermoWords(f.thermometer, s.n)}, ${thermoCell(f.fromCell, f.thermometer, s.n)} can't go above ${f.fromDigit}${withSudoku(f)}. The cells before it have to stay below that: ${rangesWords(f, s.n)}.`,
  (f, s) =>
    f.direction === 'min'
      ? `Let's push ${thermoWords(f.thermometer, s.n)} upwards. ${capitalise(thermoCell(f.fromCell, f.thermometer, s.n))} is at least ${f.fromDigit}${withSudoku(f)}, and the digits must keep rising, so ${rangesWords(f, s.n)}.`
      : `Let's squeeze ${thermoWords(f.thermometer, s.n)} from the top. ${capitalise(thermoCell(f.fromCell, f.thermometer, s.n))} is ${f.fromDigit} at most${withSudoku(f)}, and everything nearer the bulb must be smaller, so ${rangesWords(f, s.n)}.`,
  (f, s) =>
    f.direction === 'min'
      ? `Now follow ${thermoWords(f.thermometer, s.n)} up from ${thermoCell(f.fromCell, f.thermometer, s.n)}, which starts at ${f.fromDigit} or more${withSudoku(f)}. Each step up needs a bigger digit: ${rangesWords(f, s.n)}.`
      : `Now work down ${thermoWords(f.thermometer, s.n)} from ${thermoCell(f.fromCell, f.thermometer, s.n)}, which tops out at ${f.fromDigit}${withSudoku(f)}. Each step down needs a smaller digit: ${rangesWords(f, s.n)}.`,
]

export const CONTRADICTION: Phrasing<'contradiction'>[] = [
  (f, s) =>
    `Suppose ${theCell(f.cell, s.n)} were ${aDigit(f.assumed)}. ${chainWords(f, s.n, ['Then', 'That means', 'And then'])} ${breakWords(f, s.n)}. So it isn't ${aDigit(f.assumed)}.`,
  (f, s) =>
    `What if ${theCell(f.cell, s.n)} is ${aDigit(f.assumed)}? ${chainWords(f, s.n, ['Then', 'Next,', 'After that,'])} ${breakWords(f, s.n)}, and that can't be right. So no ${f.assumed} there.`,
  (f, s) =>
    `Let's try ${aDigit(f.assumed)} in ${theCell(f.cell, s.n)} and see what happens. ${chainWords(f, s.n, ['Straight away,', 'Then', 'And then'])} ${breakWords(f, s.n)}. That's impossible, so the ${f.assumed} goes.`,
]

/** Said once, the first time a family of techniques appears in a script. */
export const EXPLAIN = {
  'subset-naked': (size: number) =>
    `Here's a useful idea: when ${countWords(size)} cells in a house can only hold the same ${countWords(size)} digits, those digits must go in them, one each.`,
  'subset-hidden': (size: number) =>
    `Here's a handy pattern: when ${countWords(size)} digits in a house only fit in the same ${countWords(size)} cells, those cells belong to them, whatever else is pencilled in.`,
  locked: () => `This one's worth a moment: when a digit's spots in one house all sit inside another house, that second house must take its copy from there.`,
  'thermo-length': () => `Remember, digits go up strictly from the bulb, so a long thermometer squeezes every cell on it.`,
  'thermo-bounds': () => `Because each cell on a thermometer has to beat the one before it, a limit on one cell travels along the whole tube.`,
  contradiction: () => `Nothing simple is left, so we'll test an idea: put a digit in, follow only what's forced, and see if the grid breaks.`,
} as const

/** A person's small reactions at the first digit of the solve. */
export const BREAK_IN = ["That's the break-in.", "And there's our first digit. That's the break-in.", "Oh, that's nice. That's the break-in."]

/** Runs of easy placements read as one line. Each returns null where it doesn't fit. */
export interface Run {
  placements: { cell: Cell; digit: Digit }[]
  /** the area the run happens in, already named ("the thermometer in the top-left box", "row 4") */
  area: string | null
  /** true when the run fills the last empty cells of that area */
  finishes: boolean
  n: Namer
}
export const RUN: ((r: Run) => string | null)[] = [
  // A run that fills its area says so: that's the satisfying bit.
  (r) => (r.area && r.finishes ? `And that finishes ${r.area}: ${runList(r)}.` : null),
  (r) => (r.area && r.finishes ? `That completes ${r.area}: ${runList(r)}.` : null),
  (r) => (r.area && r.finishes ? `${capitalise(r.area)} is done now: ${runList(r)}.` : null),
  (r) => (r.area && !r.finishes ? `More of ${r.area} falls into place: ${runList(r)}.` : null),
  (r) => (!r.finishes ? `A few quick ones${r.area ? ` in ${r.area}` : ''} now: ${runList(r)}.` : null),
  (r) => (!r.finishes ? `These come easily${r.area ? ` in ${r.area}` : ''}: ${runList(r)}.` : null),
]

/** "That gives us a 5 at row 2, column 3." for steps whose main point is not the placement. */
export function placementsWords(placements: { cell: Cell; digit: Digit }[], n: Namer): string {
  return andList(placements.map((p) => `${aDigit(p.digit)} at ${cellWords(p.cell, n)}`))
}

/** "That takes 3 and 8 out of row 4, columns 1 and 2." */
export function eliminationsWords(step: Step, n: Namer): string | null {
  const elims = step.eliminations.filter((e) => e.digits.length > 0)
  if (elims.length === 0) return null
  const digits = [...new Set(elims.flatMap((e) => e.digits))].sort((a, b) => a - b)
  const cells = elims.map((e) => e.cell)
  const where = cells.length <= 3 ? cellsWords(cells, n) : `${countWords(cells.length)} other cells`
  return `That takes ${andList(digits)} out of ${where}.`
}

type Seen = FactsOf<'single-cell'>['seen']

function seenAll(seen: Seen): Digit[] {
  return [...new Set([...seen.row, ...seen.column, ...seen.box, ...seen.ruledOut])].sort((a, b) => a - b)
}

/** "1, 3 and 9 in its row, 2 and 6 in its column and a 7 in its box"; each digit said once. */
function seenParts(seen: Seen): string {
  const used = new Set<Digit>()
  const parts: string[] = []
  const add = (digits: Digit[], where: string) => {
    const fresh = [...new Set(digits)].filter((d) => !used.has(d)).sort((a, b) => a - b)
    fresh.forEach((d) => used.add(d))
    if (fresh.length === 1) parts.push(`${aDigit(fresh[0])} ${where}`)
    else if (fresh.length > 1) parts.push(`${andList(fresh)} ${where}`)
  }
  add(seen.row, 'in its row')
  add(seen.column, 'in its column')
  add(seen.box, 'in its box')
  add(seen.ruledOut, 'ruled out earlier')
  return parts.length > 0 ? andList(parts) : 'every other digit'
}

/**
 * `words` when earlier steps removed some of the cell's digits, else nothing. The facts don't say
 * which step removed them (a thermometer, a pair, locked candidates…), so neither does the script.
 */
function earlier(seen: Seen, words: string): string {
  return seen.ruledOut.length > 0 ? words : ''
}

function subsetName(size: number): string {
  return size === 2 ? 'pair' : size === 3 ? 'triple' : `set of ${countWords(size)}`
}

function bulbMax(f: FactsOf<'thermo-length'>): number {
  return f.ranges[0]?.max ?? 10 - f.length
}

function tipMin(f: FactsOf<'thermo-length'>): number {
  return f.ranges[f.ranges.length - 1]?.min ?? f.length
}

function lengthRange(f: FactsOf<'thermo-length'>, i: number): string {
  const r = f.ranges[i]
  if (!r) return 'is squeezed'
  return r.min === r.max ? `has to be ${r.min}` : `${r.min} to ${r.max}`
}

function withSudoku(f: FactsOf<'thermo-bounds'>): string {
  return f.withSudoku ? `, once we count what its row, column and box already hold` : ''
}

const ORDINALS = ['first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth']

/** A cell on a thermometer: by position in words ("the bulb", "the third cell"), by name in coordinates. */
function thermoCell(cell: Cell, thermometer: number, n: Namer): string {
  if (n.style === 'coords') return cellWords(cell, n)
  const path = n.thermometers[thermometer] ?? []
  const i = path.indexOf(cell)
  if (i < 0) return theCell(cell, n)
  if (i === 0) return 'the bulb'
  if (i === path.length - 1) return 'the tip'
  return `the ${ORDINALS[i]} cell`
}

function rangesWords(f: FactsOf<'thermo-bounds'>, n: Namer): string {
  const shown = f.ranges.slice(0, 3).map((r) => {
    const where = thermoCell(r.cell, f.thermometer, n)
    return r.min === r.max ? `${where} has to be ${r.min}` : `${where} is now ${r.min} to ${r.max}`
  })
  if (f.ranges.length > 3) shown.push('so on along the thermometer')
  return shown.length > 0 ? andList(shown) : 'the range tightens'
}

function chainLinkWords(link: ChainLink, n: Namer): string {
  if (link.kind === 'place') {
    const d = link.digits[0]
    if (link.house) return `${houseWords(link.house, n)} would need its ${d} at ${cellWords(link.cell, n)}`
    return `${cellWords(link.cell, n)} would have to be ${aDigit(d)}`
  }
  if (link.thermometer !== undefined) {
    return `on ${thermoWords(link.thermometer, n)}, ${cellWords(link.cell, n)} couldn't be ${orList(link.digits)}`
  }
  return `${cellWords(link.cell, n)} couldn't be ${orList(link.digits)}`
}

/** The forced consequences, at most three aloud: a viewer follows a short story, not a list. */
function chainWords(f: FactsOf<'contradiction'>, n: Namer, connectives: [string, string, string]): string {
  const links = f.chain.slice(0, 3)
  const sentences = links.map((l, i) => `${connectives[i]} ${chainLinkWords(l, n)}.`)
  if (f.chain.length > 3) sentences.push('A couple of steps later,')
  else sentences.push(links.length === 0 ? 'Then' : 'And')
  return sentences.join(' ')
}

function breakWords(f: FactsOf<'contradiction'>, n: Namer): string {
  if (f.emptyCell !== undefined) return `${cellWords(f.emptyCell, n)} would have nothing left`
  if (f.emptyHouse) return `${houseWords(f.emptyHouse.house, n)} would have nowhere for its ${f.emptyHouse.digit}`
  return 'the grid would break'
}

function runList(r: Run): string {
  if (r.n.style === 'coords') return andList(r.placements.map((p) => `${p.digit} in ${cellWords(p.cell, r.n)}`))
  return andList(r.placements.map((p) => p.digit))
}
