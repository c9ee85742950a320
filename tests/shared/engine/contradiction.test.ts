// Short contradictions: the recorded chain alone must lead from the assumption to the dead end.
// Puzzles: tests/fixtures/thermo-puzzles.json (our generator) and Project Euler 96 (source in the fixture).
import { readFileSync } from 'node:fs'
import { expect, test } from 'vitest'
import { parsePuzzle, solvePath, stateAt, type Puzzle } from '../../../shared/engine/index'

const load = (name: string) => (JSON.parse(readFileSync(new URL(`../../fixtures/${name}`, import.meta.url), 'utf8')) as { puzzles: { id: string; title?: string; givens: string; thermometers?: string[][] }[] }).puzzles
const corpus = [...load('thermo-puzzles.json'), ...load('classic-puzzles.json').map((p) => ({ ...p, thermometers: [] }))]

const unit = (cell: number) => {
  const r = Math.floor(cell / 9)
  const c = cell % 9
  const b = 3 * Math.floor(r / 3) + Math.floor(c / 3)
  return [r, 9 + c, 18 + b]
}
const houseCells = (kind: string, index: number) =>
  Array.from({ length: 81 }, (_, x) => x).filter((x) => (kind === 'row' ? Math.floor(x / 9) === index : kind === 'column' ? x % 9 === index : 3 * Math.floor(Math.floor(x / 9) / 3) + Math.floor((x % 9) / 3) === index))

test('contradiction steps: assumption → chain → empty cell or house, replayed from the recorded links only', () => {
  let seen = 0
  for (const f of corpus) {
    const puzzle = parsePuzzle({ title: f.title ?? f.id, givens: f.givens, thermometers: f.thermometers ?? [] }).puzzle as Puzzle
    const result = solvePath(puzzle)
    result.steps.forEach((step, k) => {
      if (step.facts.kind !== 'contradiction') return
      seen++
      const facts = step.facts
      expect(step.eliminations).toEqual([{ cell: facts.cell, digits: [facts.assumed] }])
      expect(step.text).toMatch(new RegExp(`^If r\\dc\\d were ${facts.assumed}: .*; so r\\dc\\d is not ${facts.assumed}$`))
      const state = stateAt(puzzle, result.steps, k)
      const digits = state.digits.slice()
      const cand = state.candidates.slice()
      const place = (cell: number, d: number) => {
        expect(cand[cell] & (1 << (d - 1))).not.toBe(0) // each placement was still possible at its turn
        digits[cell] = d
        cand[cell] = 1 << (d - 1)
        for (let p = 0; p < 81; p++) if (p !== cell && !digits[p] && unit(p).some((h) => unit(cell).includes(h))) cand[p] &= ~(1 << (d - 1))
      }
      place(facts.cell, facts.assumed)
      for (const link of facts.chain) {
        if (link.kind === 'place') place(link.cell, link.digits[0])
        else for (const d of link.digits) cand[link.cell] &= ~(1 << (d - 1))
      }
      if (facts.emptyCell !== undefined) expect(cand[facts.emptyCell]).toBe(0)
      else {
        const { house, digit } = facts.emptyHouse!
        expect(houseCells(house.kind, house.index).every((x) => !(cand[x] & (1 << (digit - 1))))).toBe(true)
      }
    })
  }
  expect(seen).toBeGreaterThan(0)
}, 60_000)

// Independent checks (common practice trade facts, written here without the engine's code): when the
// engine resorts to a contradiction, no single, thermometer bound, locked candidate, pair or triple
// applies anywhere in the grid, in any of the 27 houses.
const HOUSES = [
  ...Array.from({ length: 9 }, (_, i) => houseCells('row', i)),
  ...Array.from({ length: 9 }, (_, i) => houseCells('column', i)),
  ...Array.from({ length: 9 }, (_, i) => houseCells('box', i)),
]
const bits = (m: number) => [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => m & (1 << (d - 1)))
const subsets = <T,>(xs: T[], k: number): T[][] => (k === 0 ? [[]] : xs.flatMap((x, i) => subsets(xs.slice(i + 1), k - 1).map((r) => [x, ...r])))

function simplerMoves(digits: Uint8Array, cand: Uint16Array, thermometers: number[][]): string[] {
  const found: string[] = []
  for (let c = 0; c < 81; c++) if (!digits[c] && bits(cand[c]).length === 1) found.push(`naked single r${(c / 9) | 0}c${c % 9}`)
  HOUSES.forEach((house, h) => {
    const open = house.filter((c) => !digits[c])
    for (let d = 1; d <= 9; d++) {
      const bit = 1 << (d - 1)
      if (house.some((c) => digits[c] === d)) continue
      const places = open.filter((c) => cand[c] & bit)
      if (places.length === 1) found.push(`hidden single ${d} in house ${h}`)
      // locked candidates: all places inside another house, which still has the digit elsewhere
      if (places.length >= 2) {
        HOUSES.forEach((other, o) => {
          if (o === h || !places.every((c) => other.includes(c))) return
          if (other.some((c) => !house.includes(c) && !digits[c] && cand[c] & bit)) found.push(`locked ${d} from house ${h} to ${o}`)
        })
      }
    }
    for (const k of [2, 3]) {
      for (const cells of subsets(open, k)) {
        const union = cells.reduce((m, c) => m | cand[c], 0)
        if (bits(union).length === k && open.some((c) => !cells.includes(c) && cand[c] & union)) found.push(`naked subset in house ${h}`)
      }
      const free = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => !house.some((c) => digits[c] === d))
      for (const ds of subsets(free, k)) {
        const mask = ds.reduce((m, d) => m | (1 << (d - 1)), 0)
        const where = open.filter((c) => cand[c] & mask)
        if (where.length === k && ds.every((d) => where.some((c) => cand[c] & (1 << (d - 1)))) && where.some((c) => cand[c] & ~mask)) found.push(`hidden subset in house ${h}`)
      }
    }
  })
  // thermometer bounds: each candidate needs a smaller one in the cell before and a larger one in the cell after
  thermometers.forEach((path, t) => {
    path.forEach((c, i) => {
      for (const d of bits(cand[c])) {
        if (i > 0 && !bits(cand[path[i - 1]]).some((x) => x < d)) found.push(`bound on thermometer ${t}`)
        if (i < path.length - 1 && !bits(cand[path[i + 1]]).some((x) => x > d)) found.push(`bound on thermometer ${t}`)
      }
    })
  })
  found.push(...fishAndWingMoves(digits, cand))
  found.push(...thermoHouseMoves(digits, cand, thermometers))
  return found
}

// Fish and wings (trade facts, from memory), again without the engine's code: an X-wing or swordfish
// on any digit, rows to columns or columns to rows; an XY-wing, XYZ-wing or W-wing; each counted only
// when it removes a candidate. Three wing cells sharing one house are a triple, counted as that.
const sees = (a: number, b: number) => a !== b && unit(a).some((h) => unit(b).includes(h))
const oneHouse = (cells: number[]) => unit(cells[0]).some((h) => cells.every((c) => unit(c).includes(h)))

function fishAndWingMoves(digits: Uint8Array, cand: Uint16Array): string[] {
  const found: string[] = []
  const has = (c: number, d: number) => !digits[c] && (cand[c] & (1 << (d - 1))) !== 0
  const open = Array.from({ length: 81 }, (_, c) => c).filter((c) => !digits[c])
  const removable = (d: number, keep: number[], test: (c: number) => boolean) => open.some((c) => !keep.includes(c) && has(c, d) && test(c))
  for (const kind of ['row', 'column'] as const) {
    const lines = HOUSES.slice(kind === 'row' ? 0 : 9, kind === 'row' ? 9 : 18)
    const across = (c: number) => (kind === 'row' ? c % 9 : Math.floor(c / 9))
    for (let d = 1; d <= 9; d++) {
      const spots = lines.map((line) => (line.some((c) => digits[c] === d) ? [] : line.filter((c) => has(c, d)).map(across)))
      const candidates = spots.map((s, i) => (s.length >= 2 ? i : -1)).filter((i) => i >= 0)
      for (const k of [2, 3]) {
        for (const base of subsets(candidates, k)) {
          const cover = [...new Set(base.flatMap((i) => spots[i]))]
          if (cover.length === k && spots.some((s, i) => !base.includes(i) && s.some((x) => cover.includes(x)))) found.push(`fish of ${k} on ${d} in ${kind}s ${base.join(',')}`)
        }
      }
    }
  }
  const two = open.filter((c) => bits(cand[c]).length === 2)
  const three = open.filter((c) => bits(cand[c]).length === 3)
  for (const p of [...two, ...three]) {
    for (const [a, b] of subsets(two.filter((c) => sees(c, p)), 2)) {
      const z = cand[a] & cand[b]
      if (bits(z).length !== 1 || (cand[a] | cand[b]) !== (cand[p] | z) || oneHouse([p, a, b])) continue
      const xyz = (cand[p] & z) !== 0
      // XY-wing: the pivot is the two digits other than z; XYZ-wing: the pivot is all three
      if (xyz ? bits(cand[p]).length !== 3 : bits(cand[p]).length !== 2 || cand[a] === cand[b]) continue
      const d = bits(z)[0]
      if (removable(d, [p, a, b], (c) => sees(c, a) && sees(c, b) && (!xyz || sees(c, p)))) found.push(`${xyz ? 'XYZ' : 'XY'}-wing at ${p}`)
    }
  }
  for (const [c1, c2] of subsets(two, 2)) {
    if (cand[c1] !== cand[c2] || sees(c1, c2)) continue
    for (const b of bits(cand[c1])) {
      const a = bits(cand[c1] & ~(1 << (b - 1)))[0]
      for (const house of HOUSES) {
        if (house.some((c) => digits[c] === b)) continue
        const places = house.filter((c) => has(c, b))
        if (places.length !== 2 || places.includes(c1) || places.includes(c2)) continue
        const [l1, l2] = places
        if (!((sees(l1, c1) && sees(l2, c2)) || (sees(l2, c1) && sees(l1, c2)))) continue
        if (removable(a, [c1, c2], (c) => sees(c, c1) && sees(c, c2))) found.push(`W-wing at ${c1} and ${c2}`)
      }
    }
  }
  return found
}

// Thermometer and house together (constructed rules, written here without the engine's code): a digit's
// places in a house all before (or all after) one cell on thermometers through it; a digit's two places
// in a house each limiting one cell (it is the place, shares a house with it, or is bounded by it along a
// thermometer), at least one through a thermometer; two places each with exactly the room to force their
// thermometer to a 9 at the tip (or a 1 at the bulb), with a cell seeing both ends still holding it.
function thermoHouseMoves(digits: Uint8Array, cand: Uint16Array, thermometers: number[][]): string[] {
  const found: string[] = []
  if (!thermometers.length) return found
  // k > 0: a is k cells before b on some thermometer (the largest such k); k < 0: after; 0: none
  const apart = (a: number, b: number) => {
    let best = 0
    for (const path of thermometers) {
      const i = path.indexOf(a)
      const j = path.indexOf(b)
      if (i >= 0 && j >= 0 && Math.abs(j - i) > Math.abs(best)) best = j - i
    }
    return best
  }
  const range = (lo: number, hi: number) => [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((x) => x >= lo && x <= hi).reduce((m, x) => m | (1 << (x - 1)), 0)
  const open = Array.from({ length: 81 }, (_, c) => c).filter((c) => !digits[c])
  const shrinks = (c: number, out: number) => (cand[c] & out) !== 0 && (cand[c] & ~out) !== 0
  HOUSES.forEach((house, h) => {
    for (let d = 1; d <= 9; d++) {
      const bit = 1 << (d - 1)
      if (house.some((c) => digits[c] === d)) continue
      const places = house.filter((c) => !digits[c] && cand[c] & bit)
      if (places.length < 2) continue
      for (const x of open) {
        const ks = places.map((p) => (p === x ? 0 : apart(p, x)))
        // pointing: every place on one side of x along thermometers
        if (!places.includes(x) && (ks.every((k) => k > 0) || ks.every((k) => k < 0))) {
          const near = Math.min(...ks.map(Math.abs))
          if (shrinks(x, ks[0] > 0 ? range(1, d + near - 1) : range(d - near + 1, 9))) found.push(`thermometer pointing ${d} from house ${h} at ${x}`)
        }
        // either place: what both possibilities deny x
        if (places.length === 2 && ks.some((k) => k !== 0)) {
          const deny = places.map((p, i) => (p === x ? 0x1ff & ~bit : ks[i] > 0 ? range(1, d + ks[i] - 1) : ks[i] < 0 ? range(d + ks[i] + 1, 9) : sees(p, x) ? bit : 0))
          if (shrinks(x, deny[0] & deny[1])) found.push(`either place of ${d} in house ${h} at ${x}`)
        }
      }
      if (places.length !== 2 || d === 1 || d === 9) continue
      for (const [end, e] of [['tip', 9], ['bulb', 1]] as const) {
        const ends = places.map((p) =>
          thermometers.filter((path) => path.includes(p) && (end === 'tip' ? path.length - 1 - path.indexOf(p) === 9 - d : path.indexOf(p) === d - 1)).map((path) => (end === 'tip' ? path[path.length - 1] : path[0])),
        )
        for (const ea of ends[0]) for (const eb of ends[1]) {
          if (ea !== eb && open.some((c) => c !== ea && c !== eb && sees(c, ea) && sees(c, eb) && cand[c] & (1 << (e - 1)))) found.push(`two ${end}s for ${d} in house ${h}`)
        }
      }
    }
  })
  return found
}

// Either way (a common practice idea: follow each option of a choice and keep what they all
// imply), again without the engine's code: each option of a cell with two or three candidates, or of
// a digit with two or three places in a house, is placed and its direct singles placed too (every
// single it leaves, at once: moves of one link). A candidate every option removes that way would
// have been an either-way step. A choice with an option that runs into a dead end when followed
// further (singles and bounds, 8 rounds) is a what-if's business and is left out.
interface Trial {
  digits: Uint8Array
  cand: Uint16Array
  dead: boolean
}

function placeIn(t: Trial, cell: number, d: number): void {
  if (!(t.cand[cell] & (1 << (d - 1))) || t.digits[cell]) {
    t.dead = t.digits[cell] !== d
    return
  }
  t.digits[cell] = d
  t.cand[cell] = 1 << (d - 1)
  for (let p = 0; p < 81; p++) {
    if (p === cell || !sees(p, cell) || !(t.cand[p] & (1 << (d - 1)))) continue
    if (t.digits[p]) t.dead = true
    t.cand[p] &= ~(1 << (d - 1))
    if (!t.cand[p]) t.dead = true
  }
}

/** One round: every single on the grid placed at once, then (with `bounds`) thermometer bounds until they settle. */
function round(t: Trial, thermometers: number[][], bounds: boolean): void {
  const singles: [number, number][] = []
  for (let c = 0; c < 81; c++) if (!t.digits[c] && bits(t.cand[c]).length === 1) singles.push([c, bits(t.cand[c])[0]])
  HOUSES.forEach((house) => {
    for (let d = 1; d <= 9; d++) {
      if (house.some((c) => t.digits[c] === d)) continue
      const places = house.filter((c) => t.cand[c] & (1 << (d - 1)))
      if (places.length === 0) t.dead = true
      if (places.length === 1) singles.push([places[0], d])
    }
  })
  for (const [c, d] of singles) placeIn(t, c, d)
  for (let changed = bounds; changed && !t.dead; ) {
    changed = false
    for (const path of thermometers) {
      for (let i = 0; i < path.length; i++) {
        const low = i > 0 ? Math.min(...bits(t.cand[path[i - 1]])) : 0
        const high = i < path.length - 1 ? Math.max(...bits(t.cand[path[i + 1]])) : 10
        const keep = bits(t.cand[path[i]]).filter((d) => d > low && d < high).reduce((m, d) => m | (1 << (d - 1)), 0)
        if (keep === t.cand[path[i]]) continue
        t.cand[path[i]] = keep
        changed = true
        if (!keep) t.dead = true
      }
    }
  }
}

function eitherWayMoves(digits: Uint8Array, cand: Uint16Array, thermometers: number[][]): string[] {
  const choices: [number, number][][] = []
  for (let c = 0; c < 81; c++) if (!digits[c] && bits(cand[c]).length <= 3) choices.push(bits(cand[c]).map((d) => [c, d]))
  HOUSES.forEach((house) => {
    for (let d = 1; d <= 9; d++) {
      const places = house.filter((c) => !digits[c] && cand[c] & (1 << (d - 1)))
      if (!house.some((c) => digits[c] === d) && places.length >= 2 && places.length <= 3) choices.push(places.map((c) => [c, d]))
    }
  })
  const found: string[] = []
  const start = (): Trial => ({ digits: digits.slice(), cand: cand.slice(), dead: false })
  for (const options of choices) {
    const deadEnd = options.some(([c, d]) => {
      const t = start()
      placeIn(t, c, d)
      for (let r = 0; r < 8 && !t.dead; r++) round(t, thermometers, true)
      return t.dead
    })
    if (deadEnd) continue
    const removed = options.map(([c, d]) => {
      const t = start()
      placeIn(t, c, d)
      round(t, thermometers, false)
      return t.cand
    })
    for (let c = 0; c < 81; c++) {
      if (digits[c]) continue
      const everywhere = removed.reduce((m, after) => m & cand[c] & ~after[c], 0x1ff)
      if (everywhere) found.push(`either way from ${options.map(([x, d]) => `r${(x / 9) | 0}c${x % 9}=${d}`).join('/')} at r${(c / 9) | 0}c${c % 9}`)
    }
  }
  return found
}

test('a contradiction comes only when no single, bound, locked candidate, pair, triple, fish, wing or short either-way applies', () => {
  let seen = 0
  let eitherSeen = 0
  for (const f of corpus) {
    const puzzle = parsePuzzle({ title: f.title ?? f.id, givens: f.givens, thermometers: f.thermometers ?? [] }).puzzle as Puzzle
    const result = solvePath(puzzle)
    result.steps.forEach((step, k) => {
      if (step.technique.endsWith('single')) return
      const state = stateAt(puzzle, result.steps, k)
      if (step.technique === 'either-way') {
        // the either-way checker is not blind: it sees some of the engine's either-way steps (those of
        // one link a side; longer ones are replayed side by side in either-way.test.ts)
        if (eitherWayMoves(state.digits, state.candidates, puzzle.thermometers).length) eitherSeen++
        return
      }
      const simpler = simplerMoves(state.digits, state.candidates, puzzle.thermometers)
      // the checker is not blind: it sees a move wherever the engine made a simpler step (beyond singles)
      if (step.technique !== 'contradiction') return void expect(simpler.length).toBeGreaterThan(0)
      seen++
      expect(simpler).toEqual([])
      expect(eitherWayMoves(state.digits, state.candidates, puzzle.thermometers)).toEqual([])
    })
  }
  expect(seen).toBeGreaterThan(0)
  expect(eitherSeen).toBeGreaterThan(0)
}, 60_000)
