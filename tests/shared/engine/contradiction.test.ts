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
})
