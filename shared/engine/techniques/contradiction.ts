/**
 * Short contradiction: assume one candidate, follow singles and thermometer bounds for a
 * bounded number of moves, and when a cell or a house is left without an option, the assumed
 * candidate is false. Only the moves that lead to the dead end are kept in the chain, so the
 * script can read it aloud. Expensive, so the solve loop tries it last.
 */
import { ALL_DIGITS, CELL_HOUSES, HOUSES, PEERS, POPCOUNT, digitsOf, houseRef, lowestDigit } from '../geometry'
import type { Board } from '../board'
import type { Cell, ChainLink, HouseRef } from '../types'
import { distance, type Technique } from './deduction'
import { TECHNIQUES } from './catalog'
import { boundRuns } from './thermo-bounds'

/** Move budgets tried in turn; the last is the most moves followed after one assumption. */
const BUDGETS = [4, 10, 30]

interface Move {
  link: ChainLink
  /** indexes of earlier moves this one relies on */
  deps: number[]
}

interface DeadEnd {
  cell: Cell
  digit: number
  chain: ChainLink[]
  emptyCell?: Cell
  emptyHouse?: { house: HouseRef; digit: number }
}

/**
 * Assumptions that failed last time, per board: they usually still fail, and trying them first
 * gives a short chain early, which caps every later trial's budget.
 */
const remembered = new WeakMap<Board, number[]>()

export const contradiction: Technique = {
  find(board, near) {
    let best: DeadEnd | null = null
    let bestDistance = Infinity
    const failed: number[] = []
    const trial = new Trial(board)
    const consider = (cell: Cell, digit: number, budget: number) => {
      const found = trial.run(cell, digit, best ? Math.min(budget, best.chain.length) : budget)
      if (!found) return
      failed.push(cell * 9 + digit - 1)
      const d = distance([cell], near)
      if (!best || found.chain.length < best.chain.length || (found.chain.length === best.chain.length && d < bestDistance)) {
        best = found
        bestDistance = d
      }
    }
    for (const key of remembered.get(board) ?? []) {
      const cell = (key / 9) | 0
      if (!board.digits[cell] && board.cand[cell] & (1 << key % 9)) consider(cell, (key % 9) + 1, BUDGETS[BUDGETS.length - 1])
    }
    // Cells with fewest candidates first: "if this were a 3" reads best on a two-way cell.
    const order: Cell[] = []
    for (let c = 0; c < 81; c++) if (!board.digits[c]) order.push(c)
    order.sort((a, b) => POPCOUNT[board.cand[a]] - POPCOUNT[board.cand[b]] || a - b)
    // Short budgets first: most dead ends are near, and a failed deep trial costs the most.
    for (const budget of BUDGETS) {
      for (const cell of order) for (const digit of digitsOf(board.cand[cell])) consider(cell, digit, budget)
      if (best) break
    }
    remembered.set(board, failed)
    return best ? toDeduction(best) : null
  },
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
    },
    difficulty: TECHNIQUES.contradiction.difficulty + Math.round(dead.chain.length * 25) / 100,
  }
}

/** One assumption followed on a scratch copy of the grid, remembering who removed each candidate. */
class Trial {
  private readonly digits = new Uint8Array(81)
  private readonly cand = new Uint16Array(81)
  /** move index that removed candidate (cell, digit), −1 when it was gone before the assumption */
  private readonly remover = new Int16Array(81 * 9).fill(-1)
  /** remover entries set by the current trial, so the next one resets only those */
  private readonly touched: number[] = []
  /** per house, digits that lost a place since they were last examined */
  private readonly houseDirty = new Uint16Array(27)
  private readonly thermoDirty: Uint8Array
  private readonly thermoOf: number[][] = Array.from({ length: 81 }, () => [])
  private readonly naked: number[] = []
  private moves: Move[] = []
  private dead: { emptyCell?: Cell; emptyHouse?: { house: HouseRef; digit: number }; deps: number[] } | null = null

  constructor(private readonly board: Board) {
    board.thermometers.forEach((t, i) => t.forEach((c) => this.thermoOf[c].push(i)))
    this.thermoDirty = new Uint8Array(board.thermometers.length)
  }

  // The board has no single or thermometer bound left when this technique runs, so every move
  // in a trial follows from a change the trial made: only touched cells, houses and
  // thermometers need looking at.
  run(cell: Cell, digit: number, maxMoves: number): DeadEnd | null {
    this.digits.set(this.board.digits)
    this.cand.set(this.board.cand)
    for (const i of this.touched) this.remover[i] = -1
    this.touched.length = 0
    this.houseDirty.fill(0)
    this.thermoDirty.fill(0)
    this.naked.length = 0
    this.moves = []
    this.dead = null
    // The assumption itself is move 0; the chain leaves it out since the step states it.
    this.place(cell, digit, { technique: 'naked-single', kind: 'place', cell, digits: [digit] }, [])
    for (;;) {
      if (this.dead) return this.explain(cell, digit, this.dead)
      if (this.moves.length > maxMoves || !this.next()) return null
    }
  }

  private remove(cell: Cell, mask: number, id: number): void {
    const gone = this.cand[cell] & mask
    if (!gone) return
    const left = this.cand[cell] & ~gone
    this.cand[cell] = left
    for (let d = 0; d < 9; d++) {
      if (gone & (1 << d)) {
        this.remover[cell * 9 + d] = id
        this.touched.push(cell * 9 + d)
      }
    }
    if (!left) {
      if (!this.dead) this.dead = { emptyCell: cell, deps: this.removersOf(cell, ALL_DIGITS) }
      return
    }
    if (!this.digits[cell] && POPCOUNT[left] === 1) this.naked.push(cell)
    const houses = CELL_HOUSES[cell]
    for (let i = 0; i < 3; i++) this.houseDirty[houses[i]] |= gone
    for (const t of this.thermoOf[cell]) this.thermoDirty[t] = 1
  }

  private place(cell: Cell, digit: number, link: ChainLink, deps: number[]): void {
    const id = this.moves.push({ link, deps }) - 1
    const bit = 1 << (digit - 1)
    this.remove(cell, ALL_DIGITS & ~bit, id)
    this.digits[cell] = digit
    for (const t of this.thermoOf[cell]) this.thermoDirty[t] = 1
    const peers = PEERS[cell]
    for (let i = 0; i < 20; i++) if (!this.digits[peers[i]]) this.remove(peers[i], bit, id)
  }

  /** Applies the next simple move; false when none is left. */
  private next(): boolean {
    const { digits, cand } = this
    while (this.naked.length) {
      const c = this.naked.shift() as number
      if (digits[c] || POPCOUNT[cand[c]] !== 1) continue
      const d = lowestDigit(cand[c])
      this.place(c, d, { technique: 'naked-single', kind: 'place', cell: c, digits: [d] }, this.removersOf(c, ALL_DIGITS))
      return true
    }
    for (let h = 0; h < 27; h++) {
      let dirty = this.houseDirty[h]
      if (!dirty) continue
      const cells = HOUSES[h]
      for (let i = 0; i < 9; i++) if (digits[cells[i]]) dirty &= ~(1 << (digits[cells[i]] - 1))
      while (dirty) {
        const bit = dirty & -dirty
        dirty ^= bit
        this.houseDirty[h] &= ~bit
        const d = lowestDigit(bit)
        let cell = -1
        let count = 0
        for (let i = 0; i < 9; i++) if (!digits[cells[i]] && cand[cells[i]] & bit) {
          cell = cells[i]
          count++
        }
        if (count > 1) continue
        const deps: number[] = []
        for (let i = 0; i < 9; i++) {
          const r = this.remover[cells[i] * 9 + d - 1]
          if (cells[i] !== cell && r >= 0) deps.push(r)
        }
        if (count === 0) {
          this.dead = { emptyHouse: { house: houseRef(h), digit: d }, deps }
          return true
        }
        this.place(cell, d, { technique: 'hidden-single', kind: 'place', cell, digits: [d], house: houseRef(h) }, deps)
        return true
      }
      this.houseDirty[h] = 0
    }
    const thermometers = this.board.thermometers
    for (let t = 0; t < thermometers.length; t++) {
      if (!this.thermoDirty[t]) continue
      const path = thermometers[t]
      for (const direction of ['min', 'max'] as const) {
        const runs = boundRuns(digits, cand, path, direction, true)
        if (!runs.length) continue
        const deps: number[] = []
        for (const c of path) for (const r of this.removersOf(c, ALL_DIGITS)) deps.push(r)
        for (const { index, keep } of runs[0].changed) {
          const c = path[index]
          const gone = cand[c] & ~keep
          const id = this.moves.push({ link: { technique: 'thermo-bounds', kind: 'eliminate', cell: c, digits: digitsOf(gone), thermometer: t }, deps }) - 1
          this.remove(c, gone, id)
        }
        return true
      }
      this.thermoDirty[t] = 0
    }
    return false
  }

  private removersOf(cell: Cell, mask: number): number[] {
    const out: number[] = []
    for (let d = 0; d < 9; d++) if (mask & (1 << d) && this.remover[cell * 9 + d] >= 0) out.push(this.remover[cell * 9 + d])
    return out
  }

  /** Keeps only the moves the dead end depends on, in the order they were made. */
  private explain(cell: Cell, digit: number, dead: { emptyCell?: Cell; emptyHouse?: { house: HouseRef; digit: number }; deps: number[] }): DeadEnd {
    const needed = new Uint8Array(this.moves.length)
    for (const d of dead.deps) needed[d] = 1
    for (let i = this.moves.length - 1; i > 0; i--) if (needed[i]) for (const d of this.moves[i].deps) needed[d] = 1
    const chain: ChainLink[] = []
    for (let i = 1; i < this.moves.length; i++) if (needed[i]) chain.push(this.moves[i].link)
    const out: DeadEnd = { cell, digit, chain }
    if (dead.emptyCell !== undefined) out.emptyCell = dead.emptyCell
    if (dead.emptyHouse) out.emptyHouse = dead.emptyHouse
    return out
  }
}
