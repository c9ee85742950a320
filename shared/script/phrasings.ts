/**
 * The spoken phrasings, several per technique. Each one points at something, says why it
 * forces a result, and says what it gives (voice.md). They read only structured facts.
 * Sentences never start with a cell name, so r3c4 is never capitalised into "R3c4".
 */
import { TECHNIQUES } from '../engine/techniques/catalog'
import type { Cell, ChainLink, Digit, FactsKind, FactsOf, HouseRef, Step } from '../engine/types'
import { boxOf, colOf, houseCells, rowOf } from '../grid'
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
  cellsInHouse,
  type Namer,
} from './words'

/** What a phrasing may look at besides the facts. */
export interface Said {
  n: Namer
  step: Step
  /** the whole path, so a step can name the earlier steps it relies on (singles' removers) */
  steps?: readonly Step[]
  /** the step's place in the path, so a line can tell what the line before it was about */
  index?: number
  /** the digits on the grid just before the step (givens and placements so far) */
  gridBefore?: () => ArrayLike<number>
}

export type Phrasing<K extends FactsKind> = (f: FactsOf<K>, s: Said) => string

/**
 * A cell by its name alone: "row 3, column 4" or "r3c4". A filler such as "the cell at" said before
 * every cell of a long script is what a viewer hears most, and it adds nothing.
 */
function theCell(cell: Cell, n: Namer): string {
  return cellWords(cell, n)
}

// A single says the true reason for every other digit: the digits placed in its row, column or box
// (only the houses that hold them), and the earlier steps that removed the rest, named by what
// they used ("ruled out earlier with the pair in row 4"), never as if a house held them.
export const SINGLE_CELL: Phrasing<'single-cell'>[] = [
  (f, s) =>
    f.seen.ruledOut.length === 0
      ? `Look at everything ${theCell(f.cell, s.n)} can see: ${seenParts(f.seen)}. That leaves ${aDigit(f.digit)}.`
      : `Look at ${theCell(f.cell, s.n)}.${placedSentence(f.seen, ' It sees ', '.')} ${ruledSentence(f, s)}. That leaves ${aDigit(f.digit)}.`,
  (f, s) =>
    f.seen.ruledOut.length === 0
      ? `Only one digit still fits ${theCell(f.cell, s.n)}. Between ${placedHouses(f.seen)}, the other eight are taken, so it's ${aDigit(f.digit)}.`
      : `Only one digit still fits ${theCell(f.cell, s.n)}. ${ruledSentence(f, s)}${placedDigits(f.seen).length ? `, and ${placedHouses(f.seen)} ${holds(f.seen)} ${andList(placedDigits(f.seen))}` : ''}, so it's ${aDigit(f.digit)}.`,
  (f, s) =>
    f.seen.ruledOut.length === 0
      ? `Count what ${theCell(f.cell, s.n)} sees: ${andList(seenAll(f.seen))}. The one digit missing is ${f.digit}, so in it goes.`
      : `Count what rules out the rest for ${theCell(f.cell, s.n)}.${placedSentence(f.seen, ' ', '.')} ${ruledSentence(f, s)}. The one digit missing is ${f.digit}, so in it goes.`,
  (f, s) =>
    f.seen.ruledOut.length === 0
      ? `What's left for ${theCell(f.cell, s.n)}? Everything but ${aDigit(f.digit)} is already in ${placedHouses(f.seen)}. So that's ${aDigit(f.digit)}.`
      : `What's left for ${theCell(f.cell, s.n)}?${placedDigits(f.seen).length ? ` ${capitalise(placedHouses(f.seen))} already ${holds(f.seen)} ${andList(placedDigits(f.seen))}.` : ''} ${ruledSentence(f, s)}. So that's ${aDigit(f.digit)}.`,
]

// With `blockers`, a hidden single says what blocks each other cell: the houses whose placed digit
// sees it, and the earlier steps that removed the digit. Older outlines keep the general wording.
export const SINGLE_HOUSE: Phrasing<'single-house'>[] = [
  (f, s) => {
    const k = f.blockedCells.length
    const why =
      k === 0
        ? `It's the last empty cell there`
        : blockersWords(f, s) ??
          (k === 1 ? `The only other empty cell there can't take it` : `The other ${plural(k, 'empty cell', 'empty cells')} there can't take it`)
    return `Where does the ${f.digit} go in ${houseWords(f.house, s.n)}? ${why}, so it has to be ${theCell(f.cell, s.n)}.`
  },
  (f, s) => {
    const why = blockersWords(f, s)
    return why
      ? `${capitalise(houseWords(f.house, s.n))} still needs ${aDigit(f.digit)}. ${why}, so only one cell can take it: ${theCell(f.cell, s.n)}.`
      : `${capitalise(houseWords(f.house, s.n))} still needs ${aDigit(f.digit)}, and only one cell can take it: ${theCell(f.cell, s.n)}.`
  },
  (f, s) => {
    const k = f.blockedCells.length
    const blocked = k === 0 ? 'Only one cell is still empty' : (blockersWords(f, s) ?? `${capitalise(countWords(k))} of its empty cells are blocked`)
    return `Let's find the ${f.digit} in ${houseWords(f.house, s.n)}. ${blocked}, which leaves ${theCell(f.cell, s.n)}.`
  },
  (f, s) => {
    const why = blockersWords(f, s)
    return why
      ? `There's just one home for ${aDigit(f.digit)} in ${hereOrNamed(f.house, s)}. ${why}, so it's ${theCell(f.cell, s.n)}.`
      : `There's just one home for ${aDigit(f.digit)} in ${hereOrNamed(f.house, s)}, and it's ${theCell(f.cell, s.n)}.`
  },
]

export const NAKED_SUBSET: Phrasing<'subset'>[] = [
  (f, s) =>
    `These ${countWords(f.cells.length)} cells in ${houseWords(f.house, s.n)}, ${cellsInHouse(f.cells, f.house, s.n)}, can only be ${orList(f.digits)} between them. So those digits are spoken for, and nothing else in the ${f.house.kind} can be ${f.digits.length === 2 ? 'either' : 'any of them'}.`,
  (f, s) =>
    `Look at ${cellsWords(f.cells, s.n)}: ${orList(f.digits)} and nothing else. That's a ${subsetName(f.cells.length)}, so ${andList(f.digits)} have to live in these cells.`,
  (f, s) =>
    `${capitalise(countWords(f.cells.length))} cells, ${countWords(f.digits.length)} digits: ${cellsWords(f.cells, s.n)} only hold ${orList(f.digits)}. The rest of ${houseWords(f.house, s.n)} can let go of them.`,
]

export const HIDDEN_SUBSET: Phrasing<'subset'>[] = [
  (f, s) =>
    `In ${houseWords(f.house, s.n)}, the ${andList(f.digits)} only fit in ${cellsInHouse(f.cells, f.house, s.n)}. Those cells have to hold them, so anything else pencilled there can go.`,
  (f, s) =>
    `Where can ${andList(f.digits)} go in ${houseWords(f.house, s.n)}? Only in ${cellsInHouse(f.cells, f.house, s.n)}. That's a hidden ${subsetName(f.cells.length)}: these cells are taken.`,
  (f, s) =>
    `${capitalise(houseWords(f.house, s.n))} has just ${countWords(f.cells.length)} spots for its ${andList(f.digits)}: ${cellsInHouse(f.cells, f.house, s.n)}. Nothing else fits in those cells now.`,
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

// The cell a bound comes from is said as it stands: "r7c1 is an 8" when it holds a digit, its
// smallest (largest) option otherwise, with the digits in sight that make it so.
/** The lengths of several thermometers, grouped by length, said in one sentence at the start. */
export interface Lengths {
  groups: { length: number; names: string[] }[]
}

export const THERMO_LENGTHS: ((l: Lengths) => string)[] = [
  (l) => `Let's size up the thermometers first: ${lengthGroups(l)}.`,
  (l) => `First, the lengths: ${lengthGroups(l)}.`,
  (l) => `A quick look at how long each thermometer is: ${lengthGroups(l)}.`,
]

/** "the long thermometer has seven cells, so its bulb is 3 at most and its tip 7 or more; and …" */
function lengthGroups(l: Lengths): string {
  const parts = l.groups.map(({ length, names }) =>
    names.length === 1
      ? `${names[0]} has ${countWords(length)} cells, so its bulb is ${10 - length} at most and its tip ${length} or more`
      : `${andList(names)} have ${countWords(length)} cells each, so their bulbs are ${10 - length} at most and their tips ${length} or more`,
  )
  if (parts.length < 2) return parts.join('')
  return `${parts.slice(0, -1).join('; ')}; and ${parts[parts.length - 1]}`
}

export const THERMO_BOUNDS: Phrasing<'thermo-bounds'>[] = [
  (f, s) =>
    f.direction === 'min'
      ? `On ${thermoWords(f.thermometer, s.n)}, ${boundFrom(f, s)}. Everything after it has to climb higher: ${rangesWords(f, s.n)}.`
      : `On ${thermoWords(f.thermometer, s.n)}, ${boundFrom(f, s)}. The cells before it have to stay below that: ${rangesWords(f, s.n)}.`,
  (f, s) =>
    f.direction === 'min'
      ? `Let's push ${thermoWords(f.thermometer, s.n)} upwards. ${capitalise(boundFrom(f, s))}, and the digits must keep rising, so ${rangesWords(f, s.n)}.`
      : `Let's squeeze ${thermoWords(f.thermometer, s.n)} from the top. ${capitalise(boundFrom(f, s))}, and everything nearer the bulb must be smaller, so ${rangesWords(f, s.n)}.`,
  (f, s) =>
    f.direction === 'min'
      ? `Now follow ${thermoWords(f.thermometer, s.n)} up: ${boundFrom(f, s)}. Each step up needs a bigger digit: ${rangesWords(f, s.n)}.`
      : `Now work down ${thermoWords(f.thermometer, s.n)}: ${boundFrom(f, s)}. Each step down needs a smaller digit: ${rangesWords(f, s.n)}.`,
]

export const THERMO_POINTING: Phrasing<'thermo-pointing'>[] = [
  (f, s) =>
    `Where can the ${f.digit} go in ${houseWords(f.house, s.n)}? Only in ${cellsInHouse(pointingHomes(f), f.house, s.n)}, and each of those sits ${nearerEnd(f.side)} than ${theCell(f.cell, s.n)} on ${pointingThermos(f, s.n)}.${pointingGap(f)} Whichever it is, ${theCell(f.cell, s.n)} has to be ${pointingBound(f)}.`,
  (f, s) =>
    `${capitalise(houseWords(f.house, s.n))} has to put its ${f.digit} in ${cellsOr(pointingHomes(f), s.n, f.house)}. Each comes ${f.side} ${theCell(f.cell, s.n)} on ${pointingThermos(f, s.n)}, so that cell sits ${f.side === 'before' ? 'above' : 'below'} a ${f.digit} either way.${pointingGap(f)} That makes it ${pointingBound(f)}.`,
  (f, s) =>
    `Look at the ${f.digit}s in ${houseWords(f.house, s.n)}: ${cellsInHouse(pointingHomes(f), f.house, s.n)}, all ${nearerEnd(f.side)} on ${pointingThermos(f, s.n)} than ${theCell(f.cell, s.n)}. We don't know which one holds it, and we don't need to.${pointingGap(f)} The cell is ${pointingBound(f)} whichever it is.`,
]

export const THERMO_EITHER: Phrasing<'thermo-either'>[] = [
  (f, s) => {
    const other = selfOther(f)
    if (other)
      return `The ${f.digit} in ${houseWords(f.house, s.n)} is either in ${theCell(f.cell, s.n)} itself or in ${cellWords(other.cell, s.n)}, ${thermoPlace(other, s.n)}. Either way, ${theCell(f.cell, s.n)} is ${selfRange(f, other)}, so it can't be ${orList(eitherDigits(s))}.`
    return `The ${f.digit} in ${houseWords(f.house, s.n)} has two homes, ${cellsInHouse(eitherHomes(f), f.house, s.n)}. If it's ${cellWords(f.homes[0].cell, s.n)}, ${eitherBranch(f, 0, s.n)}. If it's ${cellWords(f.homes[1].cell, s.n)}, ${eitherBranch(f, 1, s.n)}. Either way, ${theCell(f.cell, s.n)} can't be ${orList(eitherDigits(s))}.`
  },
  (f, s) => {
    const other = selfOther(f)
    if (other)
      return `Only two cells can take the ${f.digit} in ${houseWords(f.house, s.n)}: ${cellsInHouse(eitherHomes(f), f.house, s.n)}. If it isn't ${theCell(f.cell, s.n)}, it's ${cellWords(other.cell, s.n)}, and then ${eitherBranch(f, f.homes.indexOf(other), s.n)}. So ${theCell(f.cell, s.n)} is ${selfRange(f, other)}, never ${orList(eitherDigits(s))}.`
    return `Only two cells can take the ${f.digit} in ${houseWords(f.house, s.n)}: ${cellsInHouse(eitherHomes(f), f.house, s.n)}. With the ${f.digit} in ${cellWords(f.homes[0].cell, s.n)}, ${eitherBranch(f, 0, s.n)}; with it in ${cellWords(f.homes[1].cell, s.n)}, ${eitherBranch(f, 1, s.n)}. So ${theCell(f.cell, s.n)} loses ${andList(eitherDigits(s))} whichever way it goes.`
  },
  (f, s) => {
    const other = selfOther(f)
    if (other)
      return `Here's a neat one: ${houseWords(f.house, s.n)} needs its ${f.digit} in ${cellsOr(eitherHomes(f), s.n, f.house)}. Either ${theCell(f.cell, s.n)} takes it, or ${cellWords(other.cell, s.n)} does and ${eitherBranch(f, f.homes.indexOf(other), s.n)}. Both ways rule out ${orList(eitherDigits(s))} there.`
    return `Here's a neat one: ${houseWords(f.house, s.n)} needs its ${f.digit} in ${cellsOr(eitherHomes(f), s.n, f.house)}. Put it in the first, and ${eitherBranch(f, 0, s.n)}. Put it in the second, and ${eitherBranch(f, 1, s.n)}. Both ways rule out ${orList(eitherDigits(s))} for ${theCell(f.cell, s.n)}.`
  },
]

export const THERMO_ENDS: Phrasing<'thermo-ends'>[] = [
  (f, s) =>
    `The ${f.digit} in ${houseWords(f.house, s.n)} goes in ${cellsOr(endsHomes(f), s.n, f.house)}. Each of those has exactly ${plural(endsGap(f), 'cell', 'cells')} ${f.end === 'tip' ? 'above' : 'below'} it on its thermometer, so whichever holds the ${f.digit}, ${endsFill(f)}. One of these two ${f.end}s, ${cellsWords(endsEnds(f), s.n)}, is ${aDigit(endDigit(f))}, so a cell that sees both can't be.`,
  (f, s) =>
    `Look at the ${f.digit}s in ${houseWords(f.house, s.n)}: just ${cellsInHouse(endsHomes(f), f.house, s.n)}. From either one, the thermometer has only ${plural(endsGap(f), 'cell', 'cells')} left ${f.end === 'tip' ? 'to climb to the tip' : 'to drop to the bulb'}, so there's no slack: ${endsFill(f)}. That puts ${aDigit(endDigit(f))} on ${cellsOr(endsEnds(f), s.n)}, and anything that sees both ${f.end}s loses its ${endDigit(f)}.`,
  (f, s) =>
    `Here's a lovely bit of thermometer logic. Whichever of ${cellsInHouse(endsHomes(f), f.house, s.n)} holds the ${f.digit} for ${houseWords(f.house, s.n)}, ${endsFill(f)}. So the ${endDigit(f)} sits on one of two ${f.end}s, ${cellsWords(endsEnds(f), s.n)}, and no cell that sees both of them can be ${aDigit(endDigit(f))}.`,
]

// A long what-if (more than six links) is announced as one, so the viewer knows to hold on.
export const CONTRADICTION: Phrasing<'contradiction'>[] = [
  (f, s) =>
    `${f.long ? "Fair warning: this one's a long what-if. " : ''}Suppose ${theCell(f.cell, s.n)} were ${aDigit(f.assumed)}. ${chainWords(f, s.n, ['Then', 'That means', 'And then'])} ${breakWords(f, s.n)}. So it isn't ${aDigit(f.assumed)}.`,
  (f, s) =>
    `${f.long ? 'This chain runs long, so stay with me. ' : ''}What if ${theCell(f.cell, s.n)} is ${aDigit(f.assumed)}? ${chainWords(f, s.n, ['Then', 'Next,', 'After that,'])} ${breakWords(f, s.n)}, and that can't be right. So no ${f.assumed} there.`,
  (f, s) =>
    `${f.long ? "Here's a longer one, so bear with me. " : ''}Let's try ${aDigit(f.assumed)} in ${theCell(f.cell, s.n)} and see what happens. ${chainWords(f, s.n, ['Straight away,', 'Then', 'And then'])} ${breakWords(f, s.n)}. That's impossible, so the ${f.assumed} goes.`,
]

// Each side is told link by link (at most four) with what pushed each, then what every side gives.
export const EITHER_WAY: Phrasing<'either-way'>[] = [
  (f, s) => `${eitherChoice(f, s.n)} ${f.sides.map((_, i) => eitherSide(f, i, s.n, ['Then', 'And'])).join(' ')} Either way, ${eitherOutcome(f, s.n)}.`,
  (f, s) => `Let's try each way. ${eitherChoice(f, s.n)} ${f.sides.map((_, i) => eitherSide(f, i, s.n, ['That means', 'Then'])).join(' ')} So whichever it is, ${eitherOutcome(f, s.n)}.`,
]

/** "The 2 in row 6 can only go in r6c1 or r6c2." / "R5c5 can only be an 8 or a 9" is avoided: the cell comes second. */
function eitherChoice(f: FactsOf<'either-way'>, n: Namer): string {
  if (f.house) return `The ${f.sides[0].digit} in ${houseWords(f.house, n)} can only go in ${orList(f.sides.map((side) => cellWords(side.cell, n)))}.`
  return `There are only ${countWords(f.sides.length)} options for ${theCell(f.sides[0].cell, n)}: ${orList(f.sides.map((side) => aDigit(side.digit)))}.`
}

function eitherSide(f: FactsOf<'either-way'>, i: number, n: Namer, connectives: [string, string]): string {
  const side = f.sides[i]
  const assumed = { cell: side.cell, assumed: side.digit, chain: side.chain }
  const opening = f.house ? `If it's ${cellWords(side.cell, n)},` : `If it's ${aDigit(side.digit)},`
  // no move needed: the assumed digit itself settles it (the cell holds it, or a cell in view can't)
  if (!side.chain.length) return f.house ? `${opening} it holds the ${side.digit} itself, and that already settles it.` : `${opening} that ${side.digit} already settles it.`
  const links = side.chain.map((link, k) => `${k === 0 ? '' : `${connectives[k % 2]} `}${chainLinkWords(link, assumed, k, n)}.`)
  return `${opening} ${links.join(' ')}`
}

function eitherOutcome(f: FactsOf<'either-way'>, n: Namer): string {
  const placed = f.placed.map((p) => `${cellWords(p.cell, n)} is ${aDigit(p.digit)}`)
  const removed = f.eliminated.map((e) => `${cellWords(e.cell, n)} can't be ${orList(e.digits.map(aDigit))}`)
  return andList([...placed, ...removed])
}

/** A what-if in one breath, when a script must be cut to length: the assumption and where it breaks. */
export function briefContradiction(f: FactsOf<'contradiction'>, n: Namer): string {
  return `${capitalise(aDigit(f.assumed))} in ${theCell(f.cell, n)} can't work: follow what it forces and ${breakWords(f, n)}. So it isn't ${aDigit(f.assumed)}.`
}

export const FISH: Phrasing<'fish'>[] = [
  (f, s) => {
    const { base, cover, baseKind, coverKind } = fishWords(f)
    if (f.baseLines.length === 2) {
      const [b1, b2] = f.baseLines.map((h) => houseWords(h, s.n))
      const [c1, c2] = f.coverLines.map((h) => houseWords(h, s.n))
      return `In ${base} the ${f.digit} can only go in ${cover}. Either ${b1} has its ${f.digit} in ${c1} and ${b2} in ${c2}, or the other way round. Either way ${cover} get their ${f.digit}s from these two ${baseKind}s, so no other cell in those ${coverKind}s can be ${aDigit(f.digit)}.`
    }
    return `In ${base} the ${f.digit} can only go in ${cover}. Each of those ${baseKind}s needs its ${f.digit}, and no two of them can put it in the same ${coverKind}, so between them they fill the ${f.digit}s of ${cover}. No other cell in those ${coverKind}s can be ${aDigit(f.digit)}.`
  },
  (f) => {
    const { base, cover, baseKind, coverKind } = fishWords(f)
    return `Look at the ${f.digit}s in ${base}: they only fit in ${cover}, ${fishName(f)}. However the ${baseKind}s place them, each of those ${coverKind}s gets its one ${f.digit} from here, so the rest of those ${coverKind}s can't have one.`
  },
  (f) => {
    const { base, cover, baseKind, coverKind } = fishWords(f)
    return `Where can ${base} put their ${f.digit}s? Only in ${cover}: ${countWords(f.baseLines.length)} ${f.digit}s, one for each ${baseKind}, and never two in one ${coverKind}. That uses up the ${f.digit} of every one of those ${coverKind}s, so nothing else in them can be ${aDigit(f.digit)}.`
  },
]

export const XY_WING: Phrasing<'wing'>[] = [
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Start with ${pivot}: it can only be ${x} or ${y}. If it's ${aDigit(x)}, ${a}, which sees it, is left with just ${z}. If it's ${aDigit(y)}, the same happens to ${b}. Either way one of those two is ${aDigit(z)}, so any cell that sees both of them can't be ${aDigit(z)}.`
  },
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Three cells work together here: ${pivot} is ${x} or ${y}, ${a} is ${x} or ${z}, and ${b} is ${y} or ${z}, and both of those see the first. Whichever digit the first one takes, the partner sharing it drops to ${z}. So there's ${aDigit(z)} in one of the partners, and nothing that sees both of them can be ${aDigit(z)}.`
  },
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Either ${pivot} is ${aDigit(x)}, and then ${a}, which sees it, has to be ${aDigit(z)}, or it's ${aDigit(y)}, and then ${b} has to be ${aDigit(z)}. Those are its only two options, so one of the pair is ${aDigit(z)} for sure, and no cell that sees both of them can hold one.`
  },
]

export const XYZ_WING: Phrasing<'wing'>[] = [
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Follow ${pivot} through its options, ${orList(f.pivotDigits)}. It sees two partners: ${a}, which is ${x} or ${z}, and ${b}, which is ${y} or ${z}. As ${aDigit(x)}, it leaves the first partner with only ${z}. As ${aDigit(y)}, it leaves the second partner with only ${z}. As ${aDigit(z)}, it's the ${z} itself. So one of these three cells is ${aDigit(z)}, and a cell that sees all three can't be ${aDigit(z)}.`
  },
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Three cells, one ${z} between them: ${pivot} with ${orList(f.pivotDigits)}, and two partners it sees, ${a} with ${x} or ${z} and ${b} with ${y} or ${z}. If the middle cell is ${aDigit(x)}, the first partner has to be the ${z}; if it's ${aDigit(y)}, the second partner has to; otherwise it's the ${z} itself. Whatever happens, anything that sees all three loses its ${z}.`
  },
  (f, s) => {
    const { pivot, a, b, x, y, z } = wingWords(f, s.n)
    return `Either ${pivot} is ${aDigit(z)} itself, or it's ${aDigit(x)} or ${aDigit(y)}, and then ${a} (if it's ${x}) or ${b} (if it's ${y}), both of which see it, drops to ${z}. One of the three holds ${aDigit(z)} whatever happens, so nothing that sees all of them can.`
  },
]

export const W_WING: Phrasing<'w-wing'>[] = [
  (f, s) => {
    const { c1, c2, l1, l2, a, b, house } = wWingWords(f, s.n)
    return `Look at ${c1} and ${c2}: both can only be ${a} or ${b}. In ${house} the ${b} has just two places, ${l1}, which sees the first, and ${l2}, which sees the second. Whichever takes the ${b}, the cell it sees can't be ${b} and has to be ${aDigit(a)}. So one of our two cells is ${aDigit(a)}, and anything that sees both can't be ${aDigit(a)}.`
  },
  (f, s) => {
    const { c1, c2, l1, l2, a, b, house } = wWingWords(f, s.n)
    return `Could neither ${c1} nor ${c2} be ${aDigit(a)}? They only hold ${a} or ${b}, so both would be ${b}s. Then ${house} would have nowhere for its ${b}: its only places, ${l1} and ${l2}, see one of them each. So at least one is ${aDigit(a)}, and a cell that sees both of them loses its ${a}.`
  },
  (f, s) => {
    const { c1, c2, l1, l2, a, b, house } = wWingWords(f, s.n)
    return `${capitalise(house)} has only two places for its ${b}: ${l1} and ${l2}. If it's the first, ${c1}, which sees it, can't be ${b}; if it's the second, ${c2} can't. Both of those cells hold only ${a} or ${b}, so either way one of them is ${aDigit(a)}, and nothing that sees both can be ${aDigit(a)}.`
  },
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
  'thermo-pointing': () =>
    `Here's a way to join a house to a thermometer: if every place a digit could go in a house sits below one cell on a thermometer, that cell has to be bigger than the digit, wherever the digit ends up. All of them above it, and it has to be smaller.`,
  'thermo-either': () =>
    `When a digit has only two places in a house, we can try both. Anything ruled out either way is ruled out for good.`,
  'thermo-ends': () =>
    `Digits climb by at least one a cell, so a thermometer with exactly enough room left above a digit has no choice: it climbs one by one, right up to a 9 at the tip. The same goes downwards, to a 1 at the bulb.`,
  fish: (size: number, base: string, cover: string) =>
    `Time for a bigger pattern: when ${countWords(size)} ${base}s can only put a digit in the same ${countWords(size)} ${cover}s, those ${base}s hand that digit to ${size === 2 ? 'both' : `all ${countWords(size)}`} ${cover}s, and the rest of those ${cover}s can't have it.`,
  'wing-xy': () =>
    `This one uses three cells: a cell with two options, and two partners it can see. Whichever way the middle cell goes, it pushes one partner onto the digit the partners share.`,
  'wing-xyz': () =>
    `Now a middle cell with three options, and two partners it sees, each holding one of them plus a digit all three share. Whatever the middle cell is, that shared digit lands in one of the three.`,
  'w-wing': () =>
    `Two cells far apart with the same two options can be tied together by a digit that has only two places in some house: whichever place takes it, one of the two cells is left with its other option.`,
  'either-way': () =>
    `When a cell has only two or three options, or a digit only two or three places, we can follow each one for a few moves. Whatever they all lead to has to be true.`,
  contradiction: () => `Nothing simple is left, so we'll test an idea: put a digit in, follow only what's forced, and see if the grid breaks.`,
} as const

/** Said in front of a line only when every phrasing it has would open like one of the lines just before. */
export const SEGUES = ['Moving on,', 'Right,', 'Next,', 'Meanwhile,', 'Okay,', 'Good.', 'After that,', 'From there,', 'Carrying on,', 'Alright,']

/** A person's small reactions at the first digit of the solve. */
export const BREAK_IN = ["That's the break-in.", "And there's our first digit. That's the break-in.", "Oh, that's nice. That's the break-in."]

/** Runs of easy placements read as one line. Each returns null where it doesn't fit. */
export interface Run {
  placements: { cell: Cell; digit: Digit }[]
  /** the area the run happens in, already named ("the thermometer in the top-left box", "row 4") */
  area: string | null
  /** true when the run fills the last empty cells of that area */
  finishes: boolean
  /** set when the area is a row or a column, so cells are told by the other coordinate alone */
  line?: 'row' | 'column'
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

/** The digits placed in the cell's houses, each once. */
function placedDigits(seen: Seen): Digit[] {
  return [...new Set([...seen.row, ...seen.column, ...seen.box])].sort((a, b) => a - b)
}

/** "its row, column and box", naming only the houses that hold one of the other digits. */
function placedHouses(seen: Seen): string {
  const houses = (['row', 'column', 'box'] as const).filter((h) => seen[h].length > 0)
  return `its ${andList(houses.length ? houses : ['row', 'column', 'box'])}`
}

function holds(seen: Seen): string {
  return (['row', 'column', 'box'] as const).filter((h) => seen[h].length > 0).length === 1 ? 'holds' : 'hold'
}

/** `before` + "1 and 3 in its row and a 7 in its box" + `after`, or nothing when no house holds one. */
function placedSentence(seen: Seen, before: string, after: string): string {
  if (placedDigits(seen).length === 0) return ''
  const parts = seenParts({ ...seen, ruledOut: [] })
  return `${before}${before === ' ' ? capitalise(parts) : parts}${after}`
}

/**
 * "The 4 and 6 were ruled out earlier with the pair in row 4, and the 8 with the bounds along the
 * thermometer in the top-left box": the steps that removed the digits, by what each one used.
 */
function ruledSentence(f: FactsOf<'single-cell'>, s: Said): string {
  const digits = f.seen.ruledOut
  const by = f.ruledOutBy ?? []
  const groups = new Map<number, Digit[]>()
  for (const r of by) groups.set(r.step, [...(groups.get(r.step) ?? []), r.digit])
  const the = (ds: Digit[]) => `the ${andList([...ds].sort((a, b) => a - b))}`
  if (groups.size === 0 || by.length !== digits.length) return `${capitalise(the(digits))} ${digits.length === 1 ? 'was' : 'were'} ruled out earlier`
  const parts = [...groups.entries()].sort((a, b) => a[0] - b[0]).map(([step, ds]) => ({ ds, with: earlierStepWords(s, step) }))
  const [first, ...more] = parts
  const head = `${capitalise(the(first.ds))} ${first.ds.length === 1 ? 'was' : 'were'} ruled out earlier with ${first.with}`
  return more.length === 0 ? head : `${head}, ${andList(more.map((p) => `${the(p.ds)} with ${p.with}`))}`
}

/**
 * A hidden single's blockers: "Row 2 and column 8 already have a 4, and the pair in row 1 took it
 * out of r1c3"; null for an outline stored before blockers were recorded.
 */
function blockersWords(f: FactsOf<'single-house'>, s: Said): string | null {
  if (!f.blockers || f.blockers.length === 0) return null
  const houses: HouseRef[] = []
  const bySteps = new Map<number, Cell[]>()
  for (const b of f.blockers) {
    if ('peer' in b) {
      // the house the placed digit and the blocked cell share, a line before the box
      const h: HouseRef =
        rowOf(b.cell) === rowOf(b.peer) ? { kind: 'row', index: rowOf(b.cell) }
        : colOf(b.cell) === colOf(b.peer) ? { kind: 'column', index: colOf(b.cell) }
        : { kind: 'box', index: boxOf(b.cell) }
      if (!houses.some((x) => x.kind === h.kind && x.index === h.index)) houses.push(h)
    } else bySteps.set(b.step, [...(bySteps.get(b.step) ?? []), b.cell])
  }
  const clauses: string[] = []
  if (houses.length) clauses.push(`${andList(houses.map((h) => houseWords(h, s.n)))} already ${houses.length === 1 ? 'has' : 'have'} ${aDigit(f.digit)}`)
  for (const [step, cells] of [...bySteps.entries()].sort((a, b) => a[0] - b[0])) {
    clauses.push(`${earlierStepWords(s, step)} took it out of ${cellsWords(cells, s.n)}`)
  }
  return capitalise(andList(clauses))
}

/** What an earlier step used, as a noun phrase: "the pair in row 4", "the length of the thermometer…". */
function earlierStepWords(s: Said, index: number): string {
  const step = s.steps?.[index]
  if (!step) return 'an earlier step'
  const f = step.facts
  const n = s.n
  switch (f.kind) {
    case 'subset':
      return `the ${f.form === 'hidden' ? 'hidden ' : ''}${subsetName(f.cells.length)} in ${houseWords(f.house, n)}`
    case 'locked':
      return f.direction === 'box-to-line'
        ? `the ${f.digit}s of ${boxWords(f.box, n)} lining up in ${houseWords(f.line, n)}`
        : `the ${f.digit}s of ${houseWords(f.line, n)} sitting in ${boxWords(f.box, n)}`
    case 'thermo-length':
      return `the length of ${thermoWords(f.thermometer, n)}`
    case 'thermo-bounds':
      return `the bounds along ${thermoWords(f.thermometer, n)}`
    case 'contradiction':
      return `the what-if at ${cellWords(f.cell, n)}`
    case 'thermo-either':
      return `the two places for the ${f.digit} in ${houseWords(f.house, n)}`
    case 'thermo-ends':
      return `the two ${f.end}s for the ${f.digit} in ${houseWords(f.house, n)}`
    case 'thermo-pointing':
      return `the ${f.digit}s of ${houseWords(f.house, n)} on ${pointingThermos(f, n)}`
    default: {
      // techniques added later: a trade name where the trade has one, else where the step looked
      const term = TECHNIQUES[step.technique].tradeTerm
      if (/wing$|^swordfish$/i.test(term)) return `the ${term}`
      const t = step.reason.thermometers[0]
      if (t !== undefined) return `the step on ${thermoWords(t, n)}`
      const h = step.reason.houses[0]
      return h ? `the step in ${houseWords(h, n)}` : 'an earlier step'
    }
  }
}

/** "this box" only when the line before was about that same house; otherwise the house by name. */
function hereOrNamed(house: HouseRef, s: Said): string {
  const prev = s.index !== undefined && s.index > 0 ? s.steps?.[s.index - 1] : undefined
  return prev && stepIsIn(prev, house) ? `this ${house.kind}` : houseWords(house, s.n)
}

/** True when everything a step placed, or else everything it highlighted, lies in the house. */
function stepIsIn(step: Step, house: HouseRef): boolean {
  const cells = step.placements.length > 0 ? step.placements.map((p) => p.cell) : step.focus
  return cells.length > 0 && cells.every((c) => houseCells(house).includes(c))
}

function fishName(f: FactsOf<'fish'>): string {
  return f.baseLines.length === 2 ? 'an X-wing' : f.baseLines.length === 3 ? 'a swordfish' : 'a fish'
}

/** "rows 2 and 7": lines of one kind, spoken. */
function linesWords(lines: HouseRef[]): string {
  return `${lines[0]?.kind ?? 'row'}s ${andList(lines.map((h) => h.index + 1))}`
}

/** Lines read the same in both naming styles. */
function fishWords(f: FactsOf<'fish'>): { base: string; cover: string; baseKind: string; coverKind: string } {
  return { base: linesWords(f.baseLines), cover: linesWords(f.coverLines), baseKind: f.baseLines[0]?.kind ?? 'row', coverKind: f.coverLines[0]?.kind ?? 'column' }
}

/** The pivot and pincers named, with x and y (each pincer's digit shared with the pivot) and z (the digit both pincers hold). */
function wingWords(f: FactsOf<'wing'>, n: Namer) {
  return { pivot: theCell(f.pivot, n), a: theCell(f.pincers[0], n), b: theCell(f.pincers[1], n), x: f.pincerDigits[0], y: f.pincerDigits[1], z: f.digit }
}

/** The two cells (c1, c2), the link's places (l1 sees c1, l2 sees c2), the kept digit a and the linking digit b. */
function wWingWords(f: FactsOf<'w-wing'>, n: Namer) {
  return {
    c1: theCell(f.cells[0], n),
    c2: theCell(f.cells[1], n),
    l1: cellWords(f.link.cells[0], n),
    l2: cellWords(f.link.cells[1], n),
    a: f.digit,
    b: f.link.digit,
    house: houseWords(f.link.house, n),
  }
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
  return r.min === r.max ? `has to be ${r.min}` : rangeWords(r.min, r.max)
}

/**
 * Where a bound starts: "r7c1 is an 8" for a given or placed digit; else "r6c7 is at least 3, with
 * the 1 and 2 already in its row", naming only digits a viewer can see in the cell's houses.
 */
function boundFrom(f: FactsOf<'thermo-bounds'>, s: Said): string {
  const cell = thermoCell(f.fromCell, f.thermometer, s.n)
  const grid = s.gridBefore?.()
  const placed = grid?.[f.fromCell] ?? 0
  if (placed !== 0) return `${cell} is ${aDigit(placed)}`
  const bound = f.direction === 'min' ? `${cell} is at least ${f.fromDigit}` : `${cell} is at most ${f.fromDigit}`
  if (!f.withSudoku || !grid) return bound
  const beyond = f.direction === 'min' ? (d: number) => d < f.fromDigit : (d: number) => d > f.fromDigit
  const seen = (['row', 'column', 'box'] as const)
    .map((kind) => {
      const house = { kind, index: kind === 'row' ? rowOf(f.fromCell) : kind === 'column' ? colOf(f.fromCell) : boxOf(f.fromCell) }
      return { kind, digits: houseCells(house).map((c) => grid[c]).filter((d) => d !== 0 && beyond(d)) }
    })
  const told = new Set<number>()
  const parts: string[] = []
  for (const { kind, digits } of seen) {
    const fresh = [...new Set(digits)].filter((d) => !told.has(d)).sort((a, b) => a - b)
    fresh.forEach((d) => told.add(d))
    if (fresh.length > 0) parts.push(`${fresh.length === 1 ? aDigit(fresh[0]) : andList(fresh)} in its ${kind}`)
  }
  return parts.length > 0 ? `${bound}, with ${andList(parts)} already` : bound
}

const ORDINALS = ['first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth']

/** A cell on a thermometer: by position in words ("the bulb", "the third cell"), by name in coordinates. */
function thermoCell(cell: Cell, thermometer: number, n: Namer): string {
  const path = n.thermometers[thermometer] ?? []
  const i = path.indexOf(cell)
  if (n.style === 'coords') return i === path.length - 1 && i > 0 ? `the tip, ${cellWords(cell, n)},` : cellWords(cell, n)
  if (i < 0) return theCell(cell, n)
  if (i === 0) return 'the bulb'
  if (i === path.length - 1) return 'the tip'
  return `the ${ORDINALS[i]} cell`
}

/**
 * Every changed cell with its new range, the tip included ("r5c8 has to be 8 and the tip, r6c9,
 * is 9"): two options are said as "5 or 6", never as a range, and nothing is left as "and so on".
 */
function rangesWords(f: FactsOf<'thermo-bounds'>, n: Namer): string {
  const shown = f.ranges.map((r, i) => {
    const where = thermoCell(r.cell, f.thermometer, n)
    return r.min === r.max ? `${where} has to be ${r.min}` : `${where} ${i === 0 ? 'is now ' : 'is '}${rangeWords(r.min, r.max)}`
  })
  return shown.length > 0 ? andList(shown) : 'the range tightens'
}

/** "5 or 6" when two digits remain, "4 to 7" for more. */
function rangeWords(min: number, max: number): string {
  return max === min + 1 ? `${min} or ${max}` : `${min} to ${max}`
}

/** An assumption and the moves that follow from it: a what-if, or one side of an either-way step. */
type Assumed = Pick<FactsOf<'contradiction'>, 'cell' | 'assumed' | 'chain'>

function chainLinkWords(link: ChainLink, f: Assumed, i: number, n: Namer): string {
  const b = link.because
  // pushed by a digit the what-if placed: the assumption itself or an earlier link
  const byPlacement =
    b !== undefined &&
    ((b.cell === f.cell && b.digit === f.assumed) || f.chain.slice(0, i).some((l) => l.kind === 'place' && l.cell === b.cell && l.digits[0] === b.digit))
  const once = b && byPlacement ? `, once ${cellWords(b.cell, n)} is ${aDigit(b.digit)}` : ''
  if (link.kind === 'place') {
    const d = link.digits[0]
    if (link.house) return `${houseWords(link.house, n)} would need its ${d} at ${cellWords(link.cell, n)}${once}`
    return `${cellWords(link.cell, n)} would have to be ${aDigit(d)}${once}`
  }
  if (link.thermometer !== undefined) {
    const path = n.thermometers[link.thermometer] ?? []
    const at = path.indexOf(link.cell)
    const from = b ? path.indexOf(b.cell) : -1
    if (b && at >= 0 && from === at - 1) {
      return `on ${thermoWords(link.thermometer, n)}, ${cellWords(link.cell, n)} comes after ${cellWords(b.cell, n)}, which would be at least ${b.digit}, so it couldn't be ${orList(link.digits)}`
    }
    if (b && at >= 0 && from === at + 1) {
      return `on ${thermoWords(link.thermometer, n)}, ${cellWords(link.cell, n)} comes before ${cellWords(b.cell, n)}, which would be at most ${b.digit}, so it couldn't be ${orList(link.digits)}`
    }
    return `on ${thermoWords(link.thermometer, n)}, ${cellWords(link.cell, n)} couldn't be ${orList(link.digits)}`
  }
  return `${cellWords(link.cell, n)} couldn't be ${orList(link.digits)}`
}

/**
 * The forced consequences, every link in order with what pushed it: a viewer watching the grid
 * sees each move, so none is skipped or counted away ("a few steps later").
 */
function chainWords(f: FactsOf<'contradiction'>, n: Namer, connectives: [string, string, string]): string {
  const more = ['After that,', 'Then', 'Next,'].filter((c) => c !== connectives[2])
  const sentences = f.chain.map((l, i) => `${i < 3 ? connectives[i] : more[(i - 3) % more.length]} ${chainLinkWords(l, f, i, n)}.`)
  sentences.push(f.chain.length === 0 ? 'Then' : 'And')
  return sentences.join(' ')
}

function breakWords(f: FactsOf<'contradiction'>, n: Namer): string {
  if (f.emptyCell !== undefined) return `${cellWords(f.emptyCell, n)} would have nothing left`
  if (f.emptyHouse) return `${houseWords(f.emptyHouse.house, n)} would have nowhere for its ${f.emptyHouse.digit}`
  return 'the grid would break'
}

/**
 * Every placement of a run with its cell: "5 in column 2, 2 in column 7" along a named row or
 * column, "r2c2 is 5, r3c2 is 2" in coordinates, full cell names elsewhere.
 */
function runList(r: Run): string {
  if (r.n.style === 'coords') return andList(r.placements.map((p) => `${cellWords(p.cell, r.n)} is ${p.digit}`))
  const line = r.line
  if (line) return andList(r.placements.map((p) => `${p.digit} in ${line === 'row' ? 'column' : 'row'} ${(line === 'row' ? colOf(p.cell) : rowOf(p.cell)) + 1}`))
  return r.placements.map((p, i) => `${i > 0 && i === r.placements.length - 1 ? 'and ' : ''}${aDigit(p.digit)} at ${cellWords(p.cell, r.n)}`).join('; ')
}

function pointingHomes(f: FactsOf<'thermo-pointing'>): Cell[] {
  return f.homes.map((h) => h.cell)
}

/** "the thermometer in the central box", or the thermometers through the cell when the places use several. */
function pointingThermos(f: FactsOf<'thermo-pointing'>, n: Namer): string {
  const ts = [...new Set(f.homes.map((h) => h.thermometer))]
  return ts.length === 1 ? thermoWords(ts[0], n) : `the thermometers through ${theCell(f.cell, n)}`
}

function nearerEnd(side: 'before' | 'after'): string {
  return side === 'before' ? 'nearer the bulb' : 'nearer the tip'
}

/** "more than 4" for a neighbour, "at least 6" when the nearest place is further away. */
function pointingBound(f: FactsOf<'thermo-pointing'>): string {
  const gap = pointingNearest(f)
  if (gap === 1) return f.side === 'before' ? `more than ${f.digit}` : `less than ${f.digit}`
  return f.side === 'before' ? `at least ${f.bound}` : `at most ${f.bound}`
}

/** Why the bound goes past the next digit: the cells between climb (or drop) too. */
function pointingGap(f: FactsOf<'thermo-pointing'>): string {
  const gap = pointingNearest(f)
  if (gap === 1) return ''
  return ` The nearest of them is ${countWords(gap)} cells ${nearerEnd(f.side)}, and the digits ${f.side === 'before' ? 'climb' : 'drop'} by at least one a cell.`
}

function pointingNearest(f: FactsOf<'thermo-pointing'>): number {
  return Math.min(...f.homes.map((h) => h.steps))
}

function eitherHomes(f: FactsOf<'thermo-either'>): Cell[] {
  return f.homes.map((h) => h.cell)
}

function eitherDigits(s: Said): Digit[] {
  return s.step.eliminations[0]?.digits ?? []
}

type EitherHome = FactsOf<'thermo-either'>['homes'][number]
type ThermoHome = Extract<EitherHome, { via: 'thermometer' }>

/** What the digit in one home does to the cell: it is the cell, shares a house with it, or bounds it along a thermometer. */
function eitherBranch(f: FactsOf<'thermo-either'>, i: number, n: Namer): string {
  const h = f.homes[i]
  const target = theCell(f.cell, n)
  if (h.via === 'itself') return `${target} is the ${f.digit}`
  if (h.via === 'house') return `${target} shares ${houseWords(h.house, n)} with it and can't be ${aDigit(f.digit)} too`
  const after = h.side === 'before'
  const where = h.steps === 1 ? (after ? 'right after it' : 'right before it') : `${countWords(h.steps)} cells ${after ? 'after' : 'before'} it`
  return `${target} sits ${where} on ${thermoWords(h.thermometer, n)}, so it has to be ${thermoBound(f.digit, h)}`
}

/** The other place when the cell is itself one of the two (that other place is on its thermometer). */
function selfOther(f: FactsOf<'thermo-either'>): ThermoHome | undefined {
  if (!f.homes.some((h) => h.via === 'itself')) return undefined
  return f.homes.find((h): h is ThermoHome => h.via === 'thermometer')
}

/** "more than 4", "at least 6", "less than 4", "at most 2": the cell's bound when `h` holds d. */
function thermoBound(d: Digit, h: ThermoHome): string {
  if (h.side === 'before') return h.steps === 1 ? `more than ${d}` : `at least ${d + h.steps}`
  return h.steps === 1 ? `less than ${d}` : `at most ${d - h.steps}`
}

/** Where the other place sits, seen from the cell: "right before it on the thermometer in box 5". */
function thermoPlace(h: ThermoHome, n: Namer): string {
  const side = h.side === 'before' ? 'before' : 'after'
  const where = h.steps === 1 ? `right ${side} it` : `${countWords(h.steps)} cells ${side} it`
  return `${where} on ${thermoWords(h.thermometer, n)}`
}

/** "7 or more", "7, or at least 9", "3 or less", "3, or at most 1": the digit itself, or the other place's bound. */
function selfRange(f: FactsOf<'thermo-either'>, h: ThermoHome): string {
  if (h.steps === 1) return `${f.digit} or ${h.side === 'before' ? 'more' : 'less'}`
  return `${f.digit}, or ${thermoBound(f.digit, h)}`
}

function endsHomes(f: FactsOf<'thermo-ends'>): Cell[] {
  return f.homes.map((h) => h.cell)
}

function endsEnds(f: FactsOf<'thermo-ends'>): Cell[] {
  return f.homes.map((h) => h.end)
}

function endDigit(f: FactsOf<'thermo-ends'>): Digit {
  return f.end === 'tip' ? 9 : 1
}

/** Cells between a place and its thermometer's end: 9 − d up to the tip, d − 1 down to the bulb. */
function endsGap(f: FactsOf<'thermo-ends'>): number {
  return f.end === 'tip' ? 9 - f.digit : f.digit - 1
}

/** What the place holding d forces: "the tip right above it has to be 9", "the three cells above it have to be 7, 8 and 9". */
function endsFill(f: FactsOf<'thermo-ends'>): string {
  const gap = endsGap(f)
  const side = f.end === 'tip' ? 'above' : 'below'
  if (gap === 1) return `the ${f.end} right ${side} it has to be ${aDigit(endDigit(f))}`
  const run = Array.from({ length: gap }, (_, i) => (f.end === 'tip' ? f.digit + 1 + i : f.digit - 1 - i))
  return `the ${countWords(gap)} cells ${side} it have to be ${andList(run)}, right ${f.end === 'tip' ? 'up to the tip' : 'down to the bulb'}`
}

/** Two or more cells as alternatives: "row 4, column 7 or 8" in words when they share a line, "r4c7 or r4c8"; "column 7 or 8" inside a row just named. */
function cellsOr(cells: Cell[], n: Namer, within?: HouseRef): string {
  // inside a row or column just named, the other coordinate alone: "column 5 or 6"
  if (n.style === 'words' && within && within.kind !== 'box' && cells.length > 1) {
    return within.kind === 'row' ? `column ${orList(cells.map((c) => (c % 9) + 1))}` : `row ${orList(cells.map((c) => Math.floor(c / 9) + 1))}`
  }
  if (n.style === 'words' && cells.length > 1) {
    const rows = new Set(cells.map((c) => Math.floor(c / 9)))
    const cols = new Set(cells.map((c) => c % 9))
    if (rows.size === 1) return `row ${Math.floor(cells[0] / 9) + 1}, column ${orList(cells.map((c) => (c % 9) + 1))}`
    if (cols.size === 1) return `column ${(cells[0] % 9) + 1}, row ${orList(cells.map((c) => Math.floor(c / 9) + 1))}`
  }
  return orList(cells.map((c) => cellWords(c, n)))
}
