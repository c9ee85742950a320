/**
 * One assumption followed on a scratch copy of the grid: singles and thermometer bounds round by
 * round, remembering which move removed each candidate and what each move relied on, so a chain
 * can be cut down to the moves a conclusion needs. Shared by the what-if (a dead end) and the
 * either-way step (the same conclusion from both sides of a two-way choice).
 */
import * as geometry from '../../grid'
import { ALL_DIGITS, digitsOf, houseRef } from '../../grid'
import type { Board } from '../board'
import type { Cell, ChainLink, HouseRef } from '../types'

// Module-level copies of the tables and helpers: the hot loops read plain bindings, not imports
// (which some module loaders turn into property getters).
const { CELL_HOUSES, HOUSES, PEERS, POPCOUNT, digitsAbove, digitsBelow, highestDigit, lowestDigit } = geometry

/** Every move but a placement removes a candidate, and each cell is placed once: 729 + 81 + the assumption. */
const MAX_MOVES = 81 * 10 + 1
/** Each move relies on at most 9 earlier ones per cell it reads (one cell, or eight house cells). */
const MAX_DEPS = MAX_MOVES * 9 + 16

/** The most moves `follows` keeps count of per move (`shortCap`). */
const MAX_SHORT = 8

// move kinds and the simple techniques a trial follows
const PLACE = 0
const ELIMINATE = 1
const NAKED = 0
const HIDDEN = 1
const BOUNDS = 2

/** Where an assumption broke and the moves that led there. */
export interface DeadEnd {
  cell: Cell
  digit: number
  chain: ChainLink[]
  emptyCell?: Cell
  emptyHouse?: { house: HouseRef; digit: number }
}

/**
 * One assumption followed on a scratch copy of the grid, remembering which move removed each
 * candidate. Moves are records in parallel typed arrays; the moves each relies on sit in one
 * shared pool. A single instance serves every trial (the engine is single-threaded per isolate).
 */
export class Trial {
  private static shared: Trial | null = null

  private board!: Board
  private readonly digits = new Uint8Array(81)
  private readonly cand = new Uint16Array(81)
  /** move that removed candidate (cell, digit), −1 when it was gone before the assumption */
  private readonly remover = new Int16Array(81 * 9).fill(-1)
  /** remover entries set by the current trial, so the next one resets only those */
  private readonly touched = new Int16Array(81 * 9)
  private touchedCount = 0
  /** per house, the digits placed in it; `basePlacedIn` is the board's */
  private readonly placedIn = new Uint16Array(27)
  private readonly basePlacedIn = new Uint16Array(27)
  /** per house and digit, the cells (placed or open) still holding it; `baseCount` is the board's */
  private readonly count = new Uint8Array(27 * 9)
  private readonly baseCount = new Uint8Array(27 * 9)

  // moves: kind, technique, cell, digits, house or thermometer, and their slice of the dependency pool
  private readonly moveKind = new Uint8Array(MAX_MOVES)
  private readonly moveTechnique = new Uint8Array(MAX_MOVES)
  private readonly moveCell = new Uint8Array(MAX_MOVES)
  private readonly moveMask = new Uint16Array(MAX_MOVES)
  private readonly moveWhere = new Int16Array(MAX_MOVES)
  /** what pushed each move: a placed cell and its digit, or a thermometer neighbour and its bound */
  private readonly becauseCell = new Int8Array(MAX_MOVES)
  private readonly becauseDigit = new Uint8Array(MAX_MOVES)
  private readonly moveDeps = new Int32Array(MAX_MOVES + 1)
  private moveCount = 0
  private readonly deps = new Int16Array(MAX_DEPS)
  private depCount = 0
  /** `follows` with a short cap: per move, up to MAX_SHORT moves it needs, and their count */
  private shortCap = 0
  private readonly shortMoves = new Int16Array(MAX_MOVES * MAX_SHORT)
  private readonly shortCount = new Uint8Array(MAX_MOVES)
  /** per move, the last move whose dependencies listed it (dedupes a dependency list) */
  private readonly stamp = new Int32Array(MAX_MOVES)
  private readonly needed = new Uint8Array(MAX_MOVES)

  // work for the next round (filled while moves are made) and for the current one
  private nakedNext = new Uint8Array(81)
  private nakedNextCount = 0
  private nakedNow = new Uint8Array(81)
  private nakedNowCount = 0
  private readonly nakedQueued = new Uint8Array(81)
  private houseNext = new Uint16Array(27)
  private houseNow = new Uint16Array(27)
  private thermoNext = new Uint8Array(0)
  private thermoNow = new Uint8Array(0)
  /** thermometers through each cell: indexes thermoList[thermoStart[c] .. thermoStart[c + 1]) */
  private readonly thermoStart = new Int16Array(82)
  private thermoList = new Int16Array(0)
  /** the thermometer being walked, which need not be queued again by its own removals */
  private walking = -1

  // the dead end: kind (0 none, 1 cell, 2 house), where, and its dependencies deps[deadFrom .. deadTo)
  private deadKind = 0
  private deadCell = 0
  private deadHouse = 0
  private deadDigit = 0
  private deadFrom = 0
  private deadTo = 0

  /** The shared trial, set up for this board's thermometers. */
  static for(board: Board): Trial {
    const trial = (Trial.shared ??= new Trial())
    if (trial.board !== board) trial.setUp(board)
    const { baseCount, basePlacedIn } = trial
    baseCount.fill(0)
    basePlacedIn.fill(0)
    for (let c = 0; c < 81; c++) {
      const d = board.digits[c]
      if (d) for (const h of CELL_HOUSES[c]) basePlacedIn[h] |= 1 << (d - 1)
    }
    for (let h = 0; h < 27; h++) {
      const cells = HOUSES[h]
      for (let i = 0; i < 9; i++) {
        const m = board.cand[cells[i]]
        for (let d = 0; d < 9; d++) if (m & (1 << d)) baseCount[h * 9 + d]++
      }
    }
    return trial
  }

  private setUp(board: Board): void {
    this.board = board
    const ts = board.thermometers
    if (this.thermoNext.length < ts.length) {
      this.thermoNext = new Uint8Array(ts.length)
      this.thermoNow = new Uint8Array(ts.length)
    }
    const count = new Int16Array(81)
    let total = 0
    for (const t of ts) for (let i = 0; i < t.length; i++) {
      count[t[i]]++
      total++
    }
    if (this.thermoList.length < total) this.thermoList = new Int16Array(total)
    this.thermoStart[0] = 0
    for (let c = 0; c < 81; c++) this.thermoStart[c + 1] = this.thermoStart[c] + count[c]
    const fill = this.thermoStart.slice(0, 81)
    ts.forEach((t, index) => {
      for (let i = 0; i < t.length; i++) this.thermoList[fill[t[i]]++] = index
    })
  }

  /**
   * Follows `digit` in `cell` for at most `rounds` rounds. Returns the length of the chain to the
   * dead end (moves after the assumption that it needs), or −1 when there is none that deep.
   */
  run(cell: Cell, digit: number, rounds: number): number {
    this.reset()
    // The assumption itself is move 0; the chain leaves it out since the step states it.
    this.place(cell, digit, this.commit(PLACE, NAKED, cell, 1 << (digit - 1), -1))
    return this.follow(rounds) ? this.chainLength() : -1
  }

  /** The board's state, no moves, no work queued. */
  private reset(): void {
    const board = this.board
    const tCount = board.thermometers.length
    this.digits.set(board.digits)
    this.cand.set(board.cand)
    this.count.set(this.baseCount)
    this.placedIn.set(this.basePlacedIn)
    for (let i = 0; i < this.touchedCount; i++) this.remover[this.touched[i]] = -1
    this.touchedCount = 0
    this.moveCount = 0
    this.depCount = 0
    this.moveDeps[0] = 0
    this.deadKind = 0
    for (let i = 0; i < this.nakedNextCount; i++) this.nakedQueued[this.nakedNext[i]] = 0
    this.nakedNextCount = 0
    this.houseNext.fill(0)
    this.thermoNext.fill(0, 0, tCount)
    this.walking = -1
  }

  /**
   * How many cells singles and bounds fill once the digit is removed from the cell: a failed
   * assumption that opens up more of the grid makes the better step.
   */
  progress(cell: Cell, digit: number): number {
    this.reset()
    const bit = 1 << (digit - 1)
    this.remove(cell, bit, this.commit(ELIMINATE, NAKED, cell, bit, -1, cell, digit))
    this.follow(Infinity)
    let placed = 0
    for (let m = 1; m < this.moveCount; m++) if (this.moveKind[m] === PLACE) placed++
    return placed
  }

  /** Rounds of moves until a dead end (true), or no move left or `rounds` used up (false). */
  private follow(rounds: number): boolean {
    const tCount = this.board.thermometers.length
    for (let round = 1; !this.deadKind; round++) {
      if (round > rounds || !this.startRound(tCount)) return false
      this.nakedSingles()
      if (!this.deadKind) this.hiddenSingles()
      if (!this.deadKind) this.bounds(tCount)
    }
    return true
  }

  /** Moves the next round's work to the current round; false when there is none. */
  private startRound(tCount: number): boolean {
    let any = this.nakedNextCount > 0
    ;[this.nakedNow, this.nakedNext] = [this.nakedNext, this.nakedNow]
    this.nakedNowCount = this.nakedNextCount
    this.nakedNextCount = 0
    for (let i = 0; i < this.nakedNowCount; i++) this.nakedQueued[this.nakedNow[i]] = 0
    ;[this.houseNow, this.houseNext] = [this.houseNext, this.houseNow]
    this.houseNext.fill(0)
    for (let h = 0; h < 27 && !any; h++) if (this.houseNow[h]) any = true
    ;[this.thermoNow, this.thermoNext] = [this.thermoNext, this.thermoNow]
    this.thermoNext.fill(0, 0, tCount)
    for (let t = 0; t < tCount && !any; t++) if (this.thermoNow[t]) any = true
    return any
  }

  private nakedSingles(): void {
    const { digits, cand } = this
    for (let i = 0; i < this.nakedNowCount && !this.deadKind; i++) {
      const c = this.nakedNow[i]
      if (digits[c] || POPCOUNT[cand[c]] !== 1) continue
      this.needRemovers(c, ALL_DIGITS)
      this.place(c, lowestDigit(cand[c]), this.commit(PLACE, NAKED, c, cand[c], -1))
    }
  }

  /** A digit left with one place in a house goes there (a house left with none was caught in `remove`). */
  private hiddenSingles(): void {
    const { digits, cand, remover, count } = this
    for (let h = 0; h < 27 && !this.deadKind; h++) {
      let dirty = this.houseNow[h]
      while (dirty && !this.deadKind) {
        const bit = dirty & -dirty
        dirty ^= bit
        const d = lowestDigit(bit) - 1
        // a digit placed in the house keeps its one place there: nothing to find
        if (count[h * 9 + d] !== 1 || this.placedIn[h] & bit) continue
        const cells = HOUSES[h]
        let cell = -1
        for (let i = 0; i < 9; i++) if (cand[cells[i]] & bit) cell = cells[i]
        if (digits[cell]) continue
        this.stampNext()
        for (let i = 0; i < 9; i++) if (cells[i] !== cell) this.need(remover[cells[i] * 9 + d])
        this.place(cell, d + 1, this.commit(PLACE, HIDDEN, cell, bit, h))
      }
    }
  }

  /** Bounds along every queued thermometer, one move per cell that loses digits. */
  private bounds(tCount: number): void {
    const { cand, remover } = this
    const ts = this.board.thermometers
    for (let t = 0; t < tCount && !this.deadKind; t++) {
      if (!this.thermoNow[t]) continue
      const path = ts[t]
      const n = path.length
      this.walking = t
      // from the bulb: a cell must exceed the smallest digit left in the cell before it
      for (let i = 1; i < n && !this.deadKind; i++) {
        const before = path[i - 1]
        const c = path[i]
        const gone = cand[c] & ~digitsAbove(lowestDigit(cand[before]))
        if (!gone) continue
        // it loses digit x because the cell before has nothing below x: who removed those?
        this.stampNext()
        const below = digitsBelow(highestDigit(gone))
        for (let d = 0; d < 9; d++) if (below & (1 << d)) this.need(remover[before * 9 + d])
        // what pushed it: the cell before and its smallest digit left, which this cell must exceed
        this.remove(c, gone, this.commit(ELIMINATE, BOUNDS, c, gone, t, before, lowestDigit(cand[before])))
      }
      // from the tip: a cell must stay below the largest digit left in the cell after it
      for (let i = n - 2; i >= 0 && !this.deadKind; i--) {
        const after = path[i + 1]
        const c = path[i]
        const gone = cand[c] & ~digitsBelow(highestDigit(cand[after]))
        if (!gone) continue
        this.stampNext()
        const above = digitsAbove(lowestDigit(gone))
        for (let d = 0; d < 9; d++) if (above & (1 << d)) this.need(remover[after * 9 + d])
        // what pushed it: the cell after and its largest digit left, which this cell must stay below
        this.remove(c, gone, this.commit(ELIMINATE, BOUNDS, c, gone, t, after, highestDigit(cand[after])))
      }
      this.walking = -1
    }
  }

  /** Starts a fresh dependency list (its entries are pushed by `need`). */
  private stampNext(): void {
    if (this.currentStamp === 0x3fffffff) {
      this.stamp.fill(0)
      this.currentStamp = 0
    }
    this.currentStamp++
  }
  private currentStamp = 0

  private need(move: number): void {
    if (move < 0 || this.stamp[move] === this.currentStamp) return
    this.stamp[move] = this.currentStamp
    this.deps[this.depCount++] = move
  }

  /** Dependencies on the moves that removed `mask`'s digits from a cell. */
  private needRemovers(cell: Cell, mask: number): void {
    this.stampNext()
    for (let d = 0; d < 9; d++) if (mask & (1 << d)) this.need(this.remover[cell * 9 + d])
  }

  /**
   * Records a move whose dependencies were just pushed; returns its index. A thermometer move
   * names its neighbour and bound (`byCell`, `byDigit`); a single names the latest move it relied
   * on, the one that pushed it: that move's placement, or the bound behind it.
   */
  private commit(kind: number, technique: number, cell: Cell, mask: number, where: number, byCell = -1, byDigit = 0): number {
    const id = this.moveCount++
    if (byCell < 0 && id > 0) {
      let pusher = 0
      for (let i = this.moveDeps[id]; i < this.depCount; i++) if (this.deps[i] > pusher) pusher = this.deps[i]
      if (this.moveKind[pusher] === PLACE) {
        byCell = this.moveCell[pusher]
        byDigit = lowestDigit(this.moveMask[pusher])
      } else {
        byCell = this.becauseCell[pusher]
        byDigit = this.becauseDigit[pusher]
      }
    }
    this.moveKind[id] = kind
    this.moveTechnique[id] = technique
    this.moveCell[id] = cell
    this.moveMask[id] = mask
    this.moveWhere[id] = where
    this.becauseCell[id] = byCell
    this.becauseDigit[id] = byDigit
    this.moveDeps[id + 1] = this.depCount
    if (this.shortCap) this.noteShort(id)
    return id
  }

  /**
   * Notes the moves `id` needs (itself included, the assumption left out) while there are at most
   * `shortCap` of them, from its dependencies' own lists; past that it only notes "too many".
   */
  private noteShort(id: number): void {
    const { shortMoves, shortCount, deps } = this
    const cap = this.shortCap
    const base = id * MAX_SHORT
    let n = 0
    // the move itself, then each dependency and what it needs, without repeats, until past the cap
    if (id > 0) shortMoves[base + n++] = id
    for (let i = this.moveDeps[id]; i < this.moveDeps[id + 1] && n <= cap; i++) {
      const dep = deps[i]
      const count = shortCount[dep]
      if (count > cap) n = cap + 1
      for (let k = -1; k < count && n <= cap; k++) {
        const m = k < 0 ? dep : shortMoves[dep * MAX_SHORT + k]
        if (m <= 0) continue
        let seen = false
        for (let j = 0; j < n && !seen; j++) seen = shortMoves[base + j] === m
        if (seen) continue
        if (n === cap) n = cap + 1
        else shortMoves[base + n++] = m
      }
    }
    shortCount[id] = n
  }

  private die(kind: 1 | 2, cell: Cell, house: number, digit: number): void {
    // the dead end's dependencies were just pushed after the last move's
    this.deadKind = kind
    this.deadCell = cell
    this.deadHouse = house
    this.deadDigit = digit
    this.deadFrom = this.moveDeps[this.moveCount]
    this.deadTo = this.depCount
  }

  private remove(cell: Cell, mask: number, id: number): void {
    if (this.beyondCap(id)) return
    const gone = this.cand[cell] & mask
    if (!gone) return
    const left = this.cand[cell] & ~gone
    this.cand[cell] = left
    const houses = CELL_HOUSES[cell]
    const { count } = this
    let emptied = -1
    for (let d = 0; d < 9; d++) {
      if (gone & (1 << d)) {
        this.remover[cell * 9 + d] = id
        this.touched[this.touchedCount++] = cell * 9 + d
        for (let k = 0; k < 3; k++) if (--count[houses[k] * 9 + d] === 0 && emptied < 0) emptied = houses[k] * 9 + d
      }
    }
    if (!left) {
      if (!this.deadKind) {
        this.needRemovers(cell, ALL_DIGITS)
        this.die(1, cell, -1, 0)
      }
      return
    }
    if (emptied >= 0 && !this.deadKind) {
      const h = (emptied / 9) | 0
      const d = emptied % 9
      const cells = HOUSES[h]
      this.stampNext()
      for (let i = 0; i < 9; i++) this.need(this.remover[cells[i] * 9 + d])
      this.die(2, -1, h, d + 1)
      return
    }
    if (!this.digits[cell] && POPCOUNT[left] === 1 && !this.nakedQueued[cell]) {
      this.nakedQueued[cell] = 1
      this.nakedNext[this.nakedNextCount++] = cell
    }
    this.houseNext[houses[0]] |= gone
    this.houseNext[houses[1]] |= gone
    this.houseNext[houses[2]] |= gone
    for (let i = this.thermoStart[cell]; i < this.thermoStart[cell + 1]; i++) {
      const t = this.thermoList[i]
      if (t !== this.walking) this.thermoNext[t] = 1
    }
  }

  /**
   * With a short cap, a move needing more moves than the cap changes nothing: whatever follows from it
   * would need more still, so no conclusion within the cap can use it.
   */
  private beyondCap(id: number): boolean {
    return this.shortCap > 0 && this.shortCount[id] > this.shortCap
  }

  private place(cell: Cell, digit: number, id: number): void {
    if (this.beyondCap(id)) return
    const bit = 1 << (digit - 1)
    this.remove(cell, ALL_DIGITS & ~bit, id)
    this.digits[cell] = digit
    const houses = CELL_HOUSES[cell]
    this.placedIn[houses[0]] |= bit
    this.placedIn[houses[1]] |= bit
    this.placedIn[houses[2]] |= bit
    const peers = PEERS[cell]
    for (let i = 0; i < 20; i++) if (!this.digits[peers[i]]) this.remove(peers[i], bit, id)
  }

  /** Marks the moves the dead end needs and counts them, leaving out the assumption. */
  private chainLength(): number {
    this.needed.fill(0, 0, this.moveCount)
    for (let i = this.deadFrom; i < this.deadTo; i++) this.needed[this.deps[i]] = 1
    return this.sweepNeeded(Infinity)
  }

  /**
   * Follows `digit` in `cell` for at most `rounds` rounds; false when that reached a dead end (then
   * the assumption is simply false). Afterwards `forEachRemoval`, `forEachPlacement`, `neededFor`
   * and `neededLinks` read what it did; with a `shortCap`, `shortLength` too.
   */
  follows(cell: Cell, digit: number, rounds: number, shortCap = 0): boolean {
    this.reset()
    this.shortCap = Math.min(shortCap, MAX_SHORT)
    this.place(cell, digit, this.commit(PLACE, NAKED, cell, 1 << (digit - 1), -1))
    const open = !this.follow(rounds)
    this.shortCap = 0
    return open
  }

  /**
   * How many moves the move needs (itself included, the assumption left out) in the trial just
   * followed with a `shortCap`; cap + 1 when more.
   */
  shortLength(move: number): number {
    return this.shortCount[move]
  }

  /** Calls `visit` with every candidate the trial just run removed (cell × 9 + digit − 1) and the move that did it. */
  forEachRemoval(visit: (key: number, move: number) => void): void {
    for (let i = 0; i < this.touchedCount; i++) {
      const key = this.touched[i]
      visit(key, this.remover[key])
    }
  }

  /** Calls `visit` with every cell the trial just run filled after the assumption, its digit and the move. */
  forEachPlacement(visit: (cell: Cell, digit: number, move: number) => void): void {
    for (let m = 1; m < this.moveCount; m++) if (this.moveKind[m] === PLACE) visit(this.moveCell[m], lowestDigit(this.moveMask[m]), m)
  }

  /** The digit the trial just run placed in the cell (0 when none). */
  digitAt(cell: Cell): number {
    return this.digits[cell]
  }

  /**
   * Marks the moves that `moves` need, themselves included and the assumption left out, and counts
   * them; past `cap` it stops and answers cap + 1. `neededLinks` then lists the marked moves.
   */
  neededFor(moves: readonly number[], cap: number): number {
    this.needed.fill(0, 0, this.moveCount)
    let latest = 0
    for (const m of moves) if (m > 0) {
      this.needed[m] = 1
      if (m > latest) latest = m
    }
    return this.sweepNeeded(cap, latest)
  }

  /**
   * Counts the marked moves from `latest` down, marking what each relies on (moves rely only on
   * earlier ones, so one sweep finds them all).
   */
  private sweepNeeded(cap: number, latest = this.moveCount - 1): number {
    const { needed, deps, moveDeps } = this
    let length = 0
    for (let m = latest; m > 0; m--) {
      if (!needed[m]) continue
      if (++length > cap) return length
      for (let i = moveDeps[m]; i < moveDeps[m + 1]; i++) needed[deps[i]] = 1
    }
    return length
  }

  /** True when the trial just run broke at the assumed cell itself (move 0's cell). */
  refutesItself(): boolean {
    return this.deadKind === 1 && this.deadCell === this.moveCell[0]
  }

  /**
   * True when the chain of the trial just run (after `run` returned a length) stays inside one
   * house and one thermometer: every cell it names is in the house or on the thermometer, every
   * hidden single is in that house, every bound on that thermometer.
   */
  isLocal(): boolean {
    const { needed, moveCell, moveTechnique, moveWhere, local } = this
    let n = 0
    let house = this.deadKind === 2 ? this.deadHouse : -1
    let thermo = -1
    local[n++] = moveCell[0]
    if (this.deadKind === 1) local[n++] = this.deadCell
    for (let m = 1; m < this.moveCount; m++) {
      if (!needed[m]) continue
      local[n++] = moveCell[m]
      const where = moveWhere[m]
      if (moveTechnique[m] === HIDDEN) {
        if (house >= 0 && house !== where) return false
        house = where
      } else if (moveTechnique[m] === BOUNDS) {
        if (thermo >= 0 && thermo !== where) return false
        thermo = where
      }
    }
    for (let h = house >= 0 ? house : 0; h < (house >= 0 ? house + 1 : 27); h++) if (this.fits(n, h, thermo)) return true
    return false
  }
  private readonly local = new Uint8Array(MAX_MOVES + 2)

  /** True when the first `n` cells of `local` lie in house `h` or on one thermometer (`thermo`, or any when −1). */
  private fits(n: number, h: number, thermo: number): boolean {
    const { local, thermoStart, thermoList } = this
    for (let i = 0; i < n; i++) {
      const c = local[i]
      const hs = CELL_HOUSES[c]
      if (hs[0] === h || hs[1] === h || hs[2] === h) continue
      if (thermo < 0) {
        // the first cell outside the house picks the thermometer; try each through it
        for (let k = thermoStart[c]; k < thermoStart[c + 1]; k++) if (this.fits(n, h, thermoList[k])) return true
        return false
      }
      let on = false
      for (let k = thermoStart[c]; k < thermoStart[c + 1]; k++) if (thermoList[k] === thermo) on = true
      if (!on) return false
    }
    return true
  }

  /** The chain of the trial just run (after `run` returned a length), as records. */
  deadEnd(cell: Cell, digit: number): DeadEnd {
    const out: DeadEnd = { cell, digit, chain: this.neededLinks() }
    if (this.deadKind === 1) out.emptyCell = this.deadCell
    else out.emptyHouse = { house: houseRef(this.deadHouse), digit: this.deadDigit }
    return out
  }

  /** The marked moves (by a dead end's chain or `neededFor`) as chain links, in the order they were made. */
  neededLinks(): ChainLink[] {
    const chain: ChainLink[] = []
    for (let m = 1; m < this.moveCount; m++) {
      if (!this.needed[m]) continue
      const link: ChainLink = {
        technique: this.moveTechnique[m] === NAKED ? 'naked-single' : this.moveTechnique[m] === HIDDEN ? 'hidden-single' : 'thermo-bounds',
        kind: this.moveKind[m] === PLACE ? 'place' : 'eliminate',
        cell: this.moveCell[m],
        digits: digitsOf(this.moveMask[m]),
      }
      if (this.moveTechnique[m] === HIDDEN) link.house = houseRef(this.moveWhere[m])
      if (this.moveTechnique[m] === BOUNDS) link.thermometer = this.moveWhere[m]
      link.because = { cell: this.becauseCell[m], digit: this.becauseDigit[m] }
      chain.push(link)
    }
    return chain
  }
}
