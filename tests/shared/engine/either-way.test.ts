// Either-way steps: a two- or three-way choice followed each way; what every side reaches holds.
// Puzzles: the three-tier set (tests/fixtures/thermo-tiers.json, our generator, seeds from 90000) and
// our thermometer fixtures; solutions by the SAT solver logic-solver (npm). Each side's recorded
// chain is replayed on its own, without the engine's code, and must reach every conclusion.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { Board } from '../../../shared/engine/board'
import { cellName, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../../shared/engine/index'
import { eitherWay } from '../../../shared/engine/techniques/either-way'
import type { TierSet } from '../../helpers/thermo-tiers'
import { oracleSolve } from '../../helpers/sat-oracle'

const tiers = JSON.parse(readFileSync(new URL('../../fixtures/thermo-tiers.json', import.meta.url), 'utf8')) as TierSet
const fixtures = (JSON.parse(readFileSync(new URL('../../fixtures/thermo-puzzles.json', import.meta.url), 'utf8')) as { puzzles: { id: string; givens: string; thermometers: string[][] }[] }).puzzles
const corpus = [...tiers.tiers.medium, ...tiers.tiers.hard, ...fixtures].map((p) => ({ id: p.id, puzzle: parsePuzzle({ title: p.id, givens: p.givens, thermometers: p.thermometers }).puzzle as Puzzle }))

const unit = (cell: number) => {
  const r = Math.floor(cell / 9)
  const c = cell % 9
  return [r, 9 + c, 18 + 3 * Math.floor(r / 3) + Math.floor(c / 3)]
}
const sees = (a: number, b: number) => a !== b && unit(a).some((h) => unit(b).includes(h))
const inHouse = (kind: string, index: number, cell: number) => unit(cell)[kind === 'row' ? 0 : kind === 'column' ? 1 : 2] === (kind === 'row' ? index : kind === 'column' ? 9 + index : 18 + index)
const bit = (d: number) => 1 << (d - 1)

const paths = corpus.map(({ id, puzzle }) => ({ id, puzzle, steps: solvePath(puzzle).steps }))
const eitherSteps = paths.flatMap(({ id, puzzle, steps }) => steps.flatMap((step, k) => (step.facts.kind === 'either-way' ? [{ id, puzzle, steps, step, k }] : [])))

describe('either-way steps on the tier set and our fixtures', () => {
  test('there are some, and no path repeats a step', () => {
    expect(eitherSteps.length).toBeGreaterThan(20)
  })

  test('the sides are the whole choice: every candidate of the cell, or every place of the digit in the house', () => {
    for (const { puzzle, steps, step, k } of eitherSteps) {
      if (step.facts.kind !== 'either-way') continue
      const { sides, house } = step.facts
      const state = stateAt(puzzle, steps, k)
      expect(sides.length).toBeGreaterThanOrEqual(2)
      expect(sides.length).toBeLessThanOrEqual(3)
      if (house) {
        const d = sides[0].digit
        expect(sides.every((s) => s.digit === d)).toBe(true)
        const places = Array.from({ length: 81 }, (_, c) => c).filter((c) => inHouse(house.kind, house.index, c) && !state.digits[c] && state.candidates[c] & bit(d))
        expect(sides.map((s) => s.cell).sort((a, b) => a - b)).toEqual(places)
      } else {
        const cell = sides[0].cell
        expect(sides.every((s) => s.cell === cell)).toBe(true)
        expect(sides.map((s) => bit(s.digit)).reduce((a, b) => a | b, 0)).toBe(state.candidates[cell])
      }
    }
  })

  test('each side, replayed from its chain alone (at most four links), reaches every conclusion', () => {
    for (const { id, puzzle, steps, step, k } of eitherSteps) {
      if (step.facts.kind !== 'either-way') continue
      const state = stateAt(puzzle, steps, k)
      for (const side of step.facts.sides) {
        expect(side.chain.length, id).toBeLessThanOrEqual(4)
        const digits = state.digits.slice()
        const cand = state.candidates.slice()
        const place = (cell: number, d: number) => {
          expect(cand[cell] & bit(d), `${id} step ${k + 1}: ${cellName(cell)} could still be ${d}`).not.toBe(0)
          digits[cell] = d
          cand[cell] = bit(d)
          for (let p = 0; p < 81; p++) if (!digits[p] && sees(p, cell)) cand[p] &= ~bit(d)
        }
        place(side.cell, side.digit)
        for (const link of side.chain) {
          if (link.kind === 'place') place(link.cell, link.digits[0])
          else for (const d of link.digits) cand[link.cell] &= ~bit(d)
        }
        for (const p of step.facts.placed) expect(digits[p.cell], `${id} step ${k + 1}: if ${cellName(side.cell)} is ${side.digit}, ${cellName(p.cell)} is ${p.digit}`).toBe(p.digit)
        for (const e of step.facts.eliminated) for (const d of e.digits) expect(cand[e.cell] & bit(d), `${id} step ${k + 1}: ${cellName(e.cell)} loses ${d}`).toBe(0)
      }
      expect(step.placements).toEqual(step.facts.placed)
      expect(step.eliminations).toEqual(step.facts.eliminated)
    }
  })
})

describe('a position where it applies, and one where it must not (constructed from the tier set)', () => {
  // hard-90011 replayed to its first either-way step: the 2 in row 6 has two places, r6c1 and r6c2.
  const entry = tiers.tiers.hard.find((p) => p.id === 'hard-90011')!
  const puzzle = parsePuzzle({ title: entry.id, givens: entry.givens, thermometers: entry.thermometers }).puzzle as Puzzle
  const steps = solvePath(puzzle).steps
  const k = steps.findIndex((s) => s.technique === 'either-way')
  const solution = oracleSolve(entry.givens, entry.thermometers.map((t) => t.map((n) => parseCellName(n) as number))).solution!
  const boardAt = (n: number) => {
    const board = Board.fromPuzzle(puzzle)
    steps.slice(0, n).forEach((s: Step, i) => board.apply(s, i))
    return board
  }

  test('it finds the step the path took there, and the step keeps the true digits (SAT oracle)', () => {
    const found = eitherWay.find(boardAt(k), k ? steps[k - 1].focus : [])
    expect(found?.facts).toEqual(steps[k].facts)
    expect(found!.facts).toMatchObject({ kind: 'either-way', house: { kind: 'row', index: 5 }, sides: [{ cell: parseCellName('r6c1'), digit: 2 }, { cell: parseCellName('r6c2'), digit: 2 }] })
    expect(found!.eliminations).toEqual([{ cell: parseCellName('r6c2'), digits: [1] }])
    for (const e of found!.eliminations) for (const d of e.digits) expect(solution[e.cell]).not.toBe(String(d))
    for (const p of found!.placements) expect(solution[p.cell]).toBe(String(p.digit))
  })

  test('a two-way cell whose sides share no consequence gives nothing', () => {
    // constructed: r5c5 sees 1, 2, 3 in its row and 4, 5, 6, 7 in its column, so it is 8 or 9;
    // nothing else on the board is down to three options, and 8 and 9 in r5c5 remove different digits
    const givens = Array<string>(81).fill('.')
    const at = (name: string, d: number) => (givens[parseCellName(name) as number] = String(d))
    ;[['r5c1', 1], ['r5c2', 2], ['r5c3', 3], ['r1c5', 4], ['r2c5', 5], ['r3c5', 6], ['r7c5', 7]].forEach(([n, d]) => at(n as string, d as number))
    const board = Board.fromPuzzle(parsePuzzle({ title: 'one two-way cell', givens: givens.join(''), thermometers: [] }).puzzle!)
    expect(board.cand[parseCellName('r5c5') as number]).toBe(bit(8) | bit(9))
    expect(eitherWay.find(board, [])).toBeNull()
  })
})
