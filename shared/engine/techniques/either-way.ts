/**
 * Either way: a choice that must go one of a few ways — a cell left with two (or three) candidates,
 * or a digit left with two (or three) places in a house — is followed each way for a few moves
 * (singles and thermometer bounds, at most SIDE_MOVES on each side). Whatever every side leads to
 * holds whichever is true: a digit all of them put in the same cell, or a candidate all remove.
 * Said as "if r3c4 is 2, then …; if it's 7, then …; either way r5c5 isn't 3". It comes after the
 * named patterns and before any what-if: it places or removes something without a dead end, and
 * each side is short enough to say in full.
 *
 * Choice, most important first: two sides before three; the longest side is shorter; a placement
 * before a removal; the sides together are shorter; the choice is nearer the previous focus. The
 * other conclusions the chosen choice reaches are said with it as long as every side still needs
 * at most SIDE_MOVES moves for all of them together.
 */
import { HOUSES, POPCOUNT, digitsOf, houseRef } from '../../grid'
import type { Board } from '../board'
import type { Cell, ChainLink, Elimination, HouseRef } from '../types'
import { TECHNIQUES } from './catalog'
import { distance, type Deduction, type Technique } from './deduction'
import { Trial } from './trial'

/** Moves a side may take to reach a conclusion, the assumption not counted (issue #12: at most 4). */
const SIDE_MOVES = 4
/** A side's moves come in rounds; a chain of n moves needs at most n rounds. */
const ROUNDS = SIDE_MOVES
/** A three-way choice is still easy to say; four ways is a list, not a deduction. */
const MAX_SIDES = 3

interface Assumption {
  cell: Cell
  digit: number
}

/** Assumptions of which exactly one holds; `house` ≥ 0 when they are a digit's places in it. */
interface Choice {
  sides: Assumption[]
  house: number
}

/** What every side leads to: a digit placed in a cell, or a candidate removed. */
interface Conclusion {
  place: boolean
  cell: Cell
  digit: number
  /** per side, the move that makes it */
  moves: number[]
  /** per side, the moves it needs */
  lengths: number[]
}

interface Rank {
  sides: number
  longest: number
  place: boolean
  total: number
  distance: number
}

function beats(a: Rank, b: Rank): boolean {
  if (a.sides !== b.sides) return a.sides < b.sides
  if (a.longest !== b.longest) return a.longest < b.longest
  if (a.place !== b.place) return a.place
  if (a.total !== b.total) return a.total < b.total
  return a.distance < b.distance
}

export const eitherWay: Technique = {
  find(board, near) {
    const trial = Trial.for(board)
    // each assumption is followed once, however many choices it belongs to
    const reachedFrom = new Map<number, Reached | null>()
    const reach = (a: Assumption) => {
      const key = a.cell * 9 + a.digit - 1
      if (!reachedFrom.has(key)) reachedFrom.set(key, follow(board, trial, a))
      return reachedFrom.get(key)!
    }
    let best: { choice: Choice; found: Conclusion[] } | null = null
    let bestRank: Rank | null = null
    for (const choice of choices(board)) {
      // three ways only when no two-way choice leads anywhere: they take longer to say
      if (bestRank && choice.sides.length > bestRank.sides) break
      const found = conclusions(choice, reach)
      for (const c of found) {
        const rank: Rank = {
          sides: choice.sides.length,
          longest: Math.max(...c.lengths),
          place: c.place,
          total: c.lengths.reduce((x, y) => x + y, 0),
          distance: distance([...choiceCells(choice), c.cell], near),
        }
        if (bestRank && !beats(rank, bestRank)) continue
        bestRank = rank
        best = { choice, found: [c, ...found.filter((o) => o !== c)] }
      }
    }
    return best ? toDeduction(trial, best.choice, best.found) : null
  },
}

/**
 * Every cell with two or three candidates, and every digit with two or three places in a house
 * (the same places seen from a line and from their box once), two-way choices first.
 */
function choices(board: Board): Choice[] {
  const out: Choice[] = []
  for (let c = 0; c < 81; c++) {
    const m = board.cand[c]
    if (board.digits[c] || POPCOUNT[m] > MAX_SIDES) continue
    out.push({ sides: digitsOf(m).map((digit) => ({ cell: c, digit })), house: -1 })
  }
  const seen = new Set<number>()
  for (let h = 0; h < 27; h++) {
    const cells = HOUSES[h]
    for (let d = 1; d <= 9; d++) {
      const bit = 1 << (d - 1)
      const places: Cell[] = []
      let placed = false
      for (let i = 0; i < 9; i++) {
        const c = cells[i]
        if (board.digits[c] === d) placed = true
        else if (!board.digits[c] && board.cand[c] & bit) places.push(c)
      }
      if (placed || places.length < 2 || places.length > MAX_SIDES) continue
      // the places in cell order, and the digit: one number for the same places seen from a line and a box
      const key = ((d * 81 + places[0]) * 81 + places[1]) * 82 + (places[2] ?? 81)
      if (seen.has(key)) continue
      seen.add(key)
      out.push({ sides: places.map((cell) => ({ cell, digit: d })), house: h })
    }
  }
  return out.sort((a, b) => a.sides.length - b.sides.length)
}

function choiceCells(choice: Choice): Cell[] {
  return [...new Set(choice.sides.map((s) => s.cell))]
}

/**
 * What one assumption reaches within SIDE_MOVES moves: keys (a removed candidate cell × 9 + digit − 1
 * of an open cell; a placement 729 + the same), the move that did it and how many moves it needs.
 */
interface Reached {
  keys: number[]
  moves: number[]
  lengths: number[]
}

/** Follows an assumption; null when it runs into a dead end (that is a what-if's job). */
function follow(board: Board, trial: Trial, a: Assumption): Reached | null {
  if (!trial.follows(a.cell, a.digit, ROUNDS, SIDE_MOVES)) return null
  const out: Reached = { keys: [], moves: [], lengths: [] }
  const note = (key: number, move: number) => {
    const length = trial.shortLength(move)
    if (length > SIDE_MOVES) return
    out.keys.push(key)
    out.moves.push(move)
    out.lengths.push(length)
  }
  trial.forEachPlacement((cell, digit, move) => note(729 + cell * 9 + digit - 1, move))
  trial.forEachRemoval((key, move) => {
    if (!board.digits[(key / 9) | 0]) note(key, move)
  })
  return out
}

// Per key, how many sides of the current choice (`stamp`) reached it so far, and each side's move
// and length: reused across choices so nothing is cleared or allocated per choice.
const KEYS = 2 * 729
const reachedBy = new Uint8Array(KEYS)
const reachedStamp = new Int32Array(KEYS)
const movesBySide = Array.from({ length: MAX_SIDES }, () => new Int16Array(KEYS))
const lengthsBySide = Array.from({ length: MAX_SIDES }, () => new Uint8Array(KEYS))
let stamp = 0

/**
 * What every side reaches; none when a side runs into a dead end. Sides are followed (through
 * `reach`, which remembers them) only while the earlier ones still share something.
 */
function conclusions(choice: Choice, reach: (a: Assumption) => Reached | null): Conclusion[] {
  const current = ++stamp
  const last = choice.sides.length - 1
  const found: Conclusion[] = []
  for (let s = 0; s <= last; s++) {
    const side = reach(choice.sides[s])
    if (!side) return []
    const { keys, moves, lengths } = side
    let shared = 0
    for (let i = 0; i < keys.length; i++) {
      const key = keys[i]
      if (s === 0) {
        reachedStamp[key] = current
        reachedBy[key] = 0
      } else if (reachedStamp[key] !== current || reachedBy[key] !== s) continue
      reachedBy[key] = s + 1
      movesBySide[s][key] = moves[i]
      lengthsBySide[s][key] = lengths[i]
      shared++
      if (s < last) continue
      const cellKey = key % 729
      found.push({
        place: key >= 729,
        cell: (cellKey / 9) | 0,
        digit: (cellKey % 9) + 1,
        moves: choice.sides.map((_, k) => movesBySide[k][key]),
        lengths: choice.sides.map((_, k) => lengthsBySide[k][key]),
      })
    }
    if (!shared) return []
  }
  return found
}

/**
 * The step: the best conclusion, with the others the same choice reaches as long as every side
 * still needs at most SIDE_MOVES moves for all of them together.
 */
function toDeduction(trial: Trial, choice: Choice, found: Conclusion[]): Deduction {
  const { sides } = choice
  // Keep conclusions in rank order while each side's moves for all of them stay within the limit;
  // dropping a conclusion only shrinks another side's moves, so earlier sides stay within it.
  let kept = found
  for (let s = 0; s < sides.length; s++) {
    trial.follows(sides[s].cell, sides[s].digit, ROUNDS, SIDE_MOVES)
    kept = keepWithin(trial, kept, s)
  }
  const chains: ChainLink[][] = []
  for (let s = 0; s < sides.length; s++) {
    trial.follows(sides[s].cell, sides[s].digit, ROUNDS, SIDE_MOVES)
    trial.neededFor(kept.map((c) => c.moves[s]), Infinity)
    chains.push(trial.neededLinks())
  }

  const placements = kept.filter((c) => c.place).map((c) => ({ cell: c.cell, digit: c.digit }))
  const placedCells = new Set(placements.map((p) => p.cell))
  const removed = new Map<Cell, number[]>()
  for (const c of kept) {
    if (c.place || placedCells.has(c.cell)) continue
    removed.set(c.cell, [...(removed.get(c.cell) ?? []), c.digit])
  }
  const eliminations: Elimination[] = [...removed].sort((x, y) => x[0] - y[0]).map(([cell, digits]) => ({ cell, digits: digits.sort((x, y) => x - y) }))
  const houses: HouseRef[] = choice.house >= 0 ? [houseRef(choice.house)] : []
  const thermometers = new Set<number>()
  const cells = new Set<Cell>(choiceCells(choice))
  for (const link of chains.flat()) {
    cells.add(link.cell)
    if (link.house && !houses.some((h) => h.kind === link.house!.kind && h.index === link.house!.index)) houses.push(link.house)
    if (link.thermometer !== undefined) thermometers.add(link.thermometer)
  }
  const links = chains.reduce((n, chain) => n + chain.length, 0)
  return {
    technique: 'either-way',
    placements,
    eliminations,
    focus: [...new Set([...choiceCells(choice), ...placedCells, ...removed.keys()])],
    reason: { houses, thermometers: [...thermometers], cells: [...cells] },
    facts: {
      kind: 'either-way',
      ...(choice.house >= 0 ? { house: houseRef(choice.house) } : {}),
      sides: sides.map((s, i) => ({ cell: s.cell, digit: s.digit, chain: chains[i] })),
      placed: placements,
      eliminated: eliminations,
    },
    difficulty: TECHNIQUES['either-way'].difficulty + (sides.length - 2) / 10 + links / 100,
  }
}

/** The conclusions, in order, that side `s` (the trial just followed) reaches together within SIDE_MOVES moves. */
function keepWithin(trial: Trial, found: Conclusion[], s: number): Conclusion[] {
  const kept: Conclusion[] = []
  for (const c of found) {
    if (trial.neededFor([...kept.map((k) => k.moves[s]), c.moves[s]], SIDE_MOVES) <= SIDE_MOVES) kept.push(c)
  }
  return kept
}
