/**
 * Short contradiction, the last resort: assume one candidate, follow singles and thermometer
 * bounds round by round (everything the assumption allows at once, then what that allows, and so
 * on), and when a cell or a house is left without an option, the assumed candidate is false.
 * Only the moves that lead to the dead end are kept in the chain, so the script can read it aloud.
 *
 * The search is staged by depth (rounds of moves): every candidate is tried shallow first, and
 * only when no candidate fails there (or every one that fails needs a long chain) is it tried
 * deeper. The final stage follows an assumption
 * until nothing more follows (at most one move per candidate of the grid, so still bounded); it
 * runs only when every shallower stage found nothing.
 *
 * Choice (ORDER below): a chain of at most six links beats a longer one (a long what-if is taken
 * only when no short one exists, and its facts say `long`); then an assumption whose removal leaves
 * a single behind; then a chain that stays inside one house and one thermometer (a viewer follows
 * it without looking away); then the shorter chain, the elimination that opens up more of the
 * grid, and the assumption nearest the previous focus. A dead end at the assumed cell itself is
 * not taken: that refutes the assumption by its own cell, which is a simpler step. Every link records
 * what pushed it (`because`). All trial state lives in typed arrays reused across trials: a trial
 * allocates nothing unless its chain may be chosen.
 */
import * as geometry from '../../grid'
import type { Board } from '../board'
import type { Cell, HouseRef } from '../types'
import { distance, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { Trial, type DeadEnd } from './trial'

// Module-level copies of the tables and helpers: the hot loops read plain bindings, not imports
// (which some module loaders turn into property getters).
const { CELL_HOUSES, HOUSES, POPCOUNT, lowestDigit } = geometry

/** Chains longer than this are long what-ifs: taken only when no shorter one exists, and marked. */
const LONG_CHAIN = 6
/** Chains of up to three links are equally quick to follow aloud, so they count as equally short. */
const READ_IN_FULL = 3

/** Rounds followed after an assumption, stage by stage; Infinity = until nothing more follows. */
const STAGES = [2, 4, 8, Infinity]

/** How a dead end ranks (see ORDER). */
interface Rank {
  long: boolean
  /** removing the candidate leaves a single behind */
  opens: boolean
  local: boolean
  /** the chain's length, with chains of up to three links counted as equally short */
  bucket: number
  /** cells singles and bounds fill once the candidate is gone */
  progress: number
  length: number
  distance: number
}

/**
 * What decides between dead ends, most important first. Short before long (issue #12). Then a
 * refuted candidate that leaves a single behind: measured on our thermometer fixtures, putting it
 * after locality took 18 what-ifs to 21 (generated seeds 7000–7011: 83 to 91), and dropping it with
 * `progress` took them to 31. Then one house and one thermometer, then the shorter chain (up to
 * three links, equally quick to follow aloud, count as equally short), then the elimination
 * that lets singles and bounds fill the most cells, then the shorter, then the nearer.
 */
const ORDER: readonly (keyof Rank)[] = ['long', 'opens', 'local', 'bucket', 'progress', 'length', 'distance']

function beats(a: Rank, b: Rank): boolean {
  for (const k of ORDER) {
    const x = a[k]
    const y = b[k]
    if (x === y) continue
    if (k === 'long') return !x
    if (k === 'opens' || k === 'local') return x === true
    if (k === 'progress') return x > y
    return x < y
  }
  return false
}

/**
 * Assumptions that failed last time, per board: they usually still fail, and trying them first
 * finds a chain early, which caps the depth of the later trials.
 */
const remembered = new WeakMap<Board, number[]>()

export const contradiction: Technique = {
  find(board, near) {
    const trial = Trial.for(board)
    let best: DeadEnd | null = null
    let bestRank: Rank | null = null
    const failed: number[] = []
    const tried = new Uint8Array(729)
    const consider = (cell: Cell, digit: number, depth: number) => {
      const useful = opens(board, cell, digit)
      // once a short chain leaves a single behind, one that does not cannot win
      if (bestRank && bestRank.opens && !bestRank.long && !useful) return
      // A chain needs about as many rounds as it has links: deeper than the held chain's bucket
      // (or than a long chain, while the held one is local) nothing can beat it.
      const cap = !bestRank || bestRank.long ? depth : Math.min(depth, bestRank.local ? bestRank.bucket : LONG_CHAIN + 1)
      const length = trial.run(cell, digit, cap)
      if (length < 0 || trial.refutesItself()) return
      failed.push(cell * 9 + digit - 1)
      const rank: Rank = { long: length > LONG_CHAIN, opens: useful, local: trial.isLocal(), bucket: Math.max(length, READ_IN_FULL), progress: Infinity, length, distance: distance([cell], near) }
      // progress costs a full follow, so it is measured only for a chain that could win with it
      if (bestRank && !beats(rank, bestRank)) return
      const dead = trial.deadEnd(cell, digit)
      rank.progress = trial.progress(cell, digit)
      if (bestRank && !beats(rank, bestRank)) return
      best = dead
      bestRank = rank
    }
    // Cells with fewest candidates first ("if this were a 3" reads best on a two-way cell), then nearest.
    const order: Cell[] = []
    for (let c = 0; c < 81; c++) if (!board.digits[c]) order.push(c)
    const rank = new Uint8Array(81)
    for (const c of order) rank[c] = distance([c], near)
    order.sort((a, b) => POPCOUNT[board.cand[a]] - POPCOUNT[board.cand[b]] || rank[a] - rank[b] || a - b)
    const previous = (remembered.get(board) ?? []).filter((key) => !board.digits[(key / 9) | 0] && board.cand[(key / 9) | 0] & (1 << key % 9))
    for (const depth of STAGES) {
      tried.fill(0)
      for (const key of previous) {
        tried[key] = 1
        consider((key / 9) | 0, (key % 9) + 1, depth)
      }
      for (const cell of order) {
        let m = board.cand[cell]
        while (m) {
          const bit = m & -m
          m ^= bit
          const digit = lowestDigit(bit)
          if (!tried[cell * 9 + digit - 1]) consider(cell, digit, depth)
        }
      }
      // A long chain is kept only when the stages up to 8 rounds find no short one either; the last
      // stage, which follows every candidate to the end, runs only when nothing was found at all.
      if (bestRank && (!(bestRank as Rank).long || depth >= 8)) break
    }
    remembered.set(board, failed)
    return best ? toDeduction(best) : null
  },
}

/** True when removing the digit leaves a single behind: a two-way cell, or a digit with two places in a house. */
function opens(board: Board, cell: Cell, digit: number): boolean {
  if (POPCOUNT[board.cand[cell]] === 2) return true
  const bit = 1 << (digit - 1)
  const houses = CELL_HOUSES[cell]
  for (let k = 0; k < 3; k++) {
    let count = 0
    const cells = HOUSES[houses[k]]
    for (let i = 0; i < 9; i++) if (!board.digits[cells[i]] && board.cand[cells[i]] & bit) count++
    if (count === 2) return true
  }
  return false
}

function toDeduction(dead: DeadEnd) {
  const houses: HouseRef[] = []
  const thermometers = new Set<number>()
  const cells = new Set<Cell>()
  for (const l of dead.chain) {
    cells.add(l.cell)
    if (l.house && !houses.some((h) => h.kind === l.house!.kind && h.index === l.house!.index)) houses.push(l.house)
    if (l.thermometer !== undefined) thermometers.add(l.thermometer)
  }
  if (dead.emptyCell !== undefined) cells.add(dead.emptyCell)
  if (dead.emptyHouse) houses.push(dead.emptyHouse.house)
  return {
    technique: 'contradiction' as const,
    placements: [],
    eliminations: [{ cell: dead.cell, digits: [dead.digit] }],
    focus: [dead.cell],
    reason: { houses, thermometers: [...thermometers], cells: [...cells] },
    facts: {
      kind: 'contradiction' as const,
      cell: dead.cell,
      assumed: dead.digit,
      chain: dead.chain,
      ...(dead.emptyCell !== undefined ? { emptyCell: dead.emptyCell } : {}),
      ...(dead.emptyHouse ? { emptyHouse: dead.emptyHouse } : {}),
      ...(dead.chain.length > LONG_CHAIN ? { long: true } : {}),
    },
    difficulty: TECHNIQUES.contradiction.difficulty + Math.round(dead.chain.length * 25) / 100,
  }
}
