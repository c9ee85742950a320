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
  return found
}

test('a contradiction comes only when no single, bound, locked candidate, pair or triple applies in any house', () => {
  let seen = 0
  for (const f of corpus) {
    const puzzle = parsePuzzle({ title: f.title ?? f.id, givens: f.givens, thermometers: f.thermometers ?? [] }).puzzle as Puzzle
    const result = solvePath(puzzle)
    result.steps.forEach((step, k) => {
      if (step.technique.endsWith('single')) return
      const state = stateAt(puzzle, result.steps, k)
      const simpler = simplerMoves(state.digits, state.candidates, puzzle.thermometers)
      // the checker is not blind: it sees a move wherever the engine made a simpler step (beyond singles)
      if (step.technique !== 'contradiction') return void expect(simpler.length).toBeGreaterThan(0)
      seen++
      expect(simpler).toEqual([])
    })
  }
  expect(seen).toBeGreaterThan(0)
}, 60_000)
