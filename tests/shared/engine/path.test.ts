// Path records, replay and names. Puzzles from tests/fixtures (sources noted there); answers
// from the SAT solver logic-solver (npm) where a solution is needed.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { TECHNIQUES, cellName, gridString, houseName, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle } from '../../../shared/engine/index'

const thermo = (JSON.parse(readFileSync(new URL('../../fixtures/thermo-puzzles.json', import.meta.url), 'utf8')) as { puzzles: { id: string; givens: string; thermometers: string[][]; title: string }[] }).puzzles

describe('names', () => {
  test('cellName / parseCellName round-trip "r1c1" … "r9c9"', () => {
    expect(cellName(0)).toBe('r1c1')
    expect(cellName(80)).toBe('r9c9')
    expect(cellName(29)).toBe('r4c3')
    for (let c = 0; c < 81; c++) expect(parseCellName(cellName(c))).toBe(c)
    expect(parseCellName('R3C4')).toBe(21)
    expect(parseCellName('r0c1')).toBeNull()
    expect(parseCellName('r10c1')).toBeNull()
    expect(() => cellName(81)).toThrow('cellName: 81 is not a cell index 0..80')
  })

  test('houseName counts from 1; gridString writes "." for empty', () => {
    expect(houseName({ kind: 'row', index: 0 })).toBe('row 1')
    expect(houseName({ kind: 'column', index: 8 })).toBe('column 9')
    expect(houseName({ kind: 'box', index: 4 })).toBe('box 5')
    expect(gridString([5, 0, ...new Array(79).fill(1)])).toBe('5.' + '1'.repeat(79))
    expect(() => gridString([1])).toThrow('gridString: expected 81 digits, got 1')
  })

  test('TECHNIQUES gives each technique a plain name, a trade term and a difficulty, easiest first', () => {
    expect(TECHNIQUES['naked-single']).toEqual({ plainName: 'Last candidate in a cell', tradeTerm: 'naked single', difficulty: 1 })
    expect(TECHNIQUES['hidden-single'].tradeTerm).toBe('hidden single')
    for (const info of Object.values(TECHNIQUES)) expect(info.plainName).not.toBe(info.tradeTerm)
    expect(TECHNIQUES.contradiction.difficulty).toBeGreaterThan(Math.max(...Object.entries(TECHNIQUES).filter(([id]) => id !== 'contradiction').map(([, i]) => i.difficulty)))
  })
})

describe('step records', () => {
  const runs = thermo.map((f) => ({ puzzle: parsePuzzle(f).puzzle as Puzzle, result: solvePath(f) }))

  test('every step has a technique, focus, reason, facts, a difficulty and a one-line text', () => {
    for (const { result } of runs) {
      for (const s of result.steps) {
        expect(TECHNIQUES[s.technique]).toBeDefined()
        expect(s.focus.length).toBeGreaterThan(0)
        expect(s.difficulty).toBeGreaterThanOrEqual(TECHNIQUES[s.technique].difficulty)
        expect(s.text).not.toMatch(/\n/)
        expect(s.text.length).toBeGreaterThan(10)
        expect(s.placements.length + s.eliminations.length).toBeGreaterThan(0)
        if (s.technique === 'naked-single' || s.technique === 'hidden-single') expect(s.text).toMatch(/^r\dc\d = \d: /)
      }
      expect(result.difficulty).toBe(Math.max(...result.steps.map((s) => s.difficulty)))
    }
  })

  test('marks are cumulative, never on a filled cell, and added only by steps that do not place', () => {
    for (const { puzzle, result } of runs) {
      let previous = new Set<number>()
      result.steps.forEach((s, k) => {
        const state = stateAt(puzzle, result.steps, k + 1)
        for (const c of s.marks) expect(state.digits[c]).toBe(0)
        const now = new Set(s.marks)
        for (const c of previous) if (!state.digits[c]) expect(now.has(c)).toBe(true)
        if (s.placements.length) for (const c of now) expect(previous.has(c)).toBe(true)
        previous = now
      })
    }
  })

  test('a presenter stays near: most consecutive steps are close together', () => {
    let near = 0
    let total = 0
    for (const { result } of runs) {
      for (let k = 1; k < result.steps.length; k++) {
        const a = result.steps[k - 1].focus
        const b = result.steps[k].focus
        const d = Math.min(...a.flatMap((x) => b.map((y) => Math.max(Math.abs((x / 9 | 0) - (y / 9 | 0)), Math.abs((x % 9) - (y % 9))))))
        total++
        if (d <= 2) near++
      }
    }
    expect(near / total).toBeGreaterThan(0.5)
  })

  test('singles fold the removal of the placed digit from peers into the placement', () => {
    const { puzzle, result } = runs[0]
    const k = result.steps.findIndex((s) => s.placements.length)
    const { cell, digit } = result.steps[k].placements[0]
    expect(result.steps[k].eliminations).toEqual([])
    const after = stateAt(puzzle, result.steps, k + 1)
    expect(after.digits[cell]).toBe(digit)
    for (let p = 0; p < 81; p++) {
      const seen = p !== cell && ((p / 9 | 0) === (cell / 9 | 0) || p % 9 === cell % 9 || ((p / 27 | 0) === (cell / 27 | 0) && ((p % 9) / 3 | 0) === ((cell % 9) / 3 | 0)))
      if (seen && !after.digits[p]) expect(after.candidates[p] & (1 << (digit - 1))).toBe(0)
    }
  })
})

describe('stateAt', () => {
  const f = thermo[0]
  const puzzle = parsePuzzle(f).puzzle as Puzzle
  const result = solvePath(f)

  test('k = 0 is the givens with their digits removed from peers; k = steps.length is the end grid', () => {
    const start = stateAt(puzzle, result.steps, 0)
    expect(gridString(start.digits)).toBe(f.givens)
    expect(start.marks).toEqual([])
    expect(Array.from(start.givens)).toEqual([...f.givens].map((ch) => (ch === '.' ? 0 : 1)))
    const end = stateAt(puzzle, result.steps, result.steps.length)
    expect(gridString(end.digits)).toBe(result.grid)
    expect(end.marks).toEqual(result.steps[result.steps.length - 1].marks)
  })

  test('k outside 0..steps.length => throws', () => {
    expect(() => stateAt(puzzle, result.steps, -1)).toThrow(`stateAt: k must be an integer from 0 to ${result.steps.length}, got -1`)
    expect(() => stateAt(puzzle, result.steps, result.steps.length + 1)).toThrow()
  })

  test('candidates only shrink from one k to the next, and each step changes exactly what it lists', () => {
    for (let k = 0; k < result.steps.length; k++) {
      const before = stateAt(puzzle, result.steps, k)
      const after = stateAt(puzzle, result.steps, k + 1)
      const step = result.steps[k]
      for (let c = 0; c < 81; c++) expect(after.candidates[c] & ~before.candidates[c]).toBe(0)
      for (const e of step.eliminations) for (const d of e.digits) expect(after.candidates[e.cell] & (1 << (d - 1))).toBe(0)
      for (const p of step.placements) expect(after.candidates[p.cell]).toBe(1 << (p.digit - 1))
    }
  })
})
