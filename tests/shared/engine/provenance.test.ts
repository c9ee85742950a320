// Provenance (issue #12 §2, §3): every single names the true reason each other digit or cell is
// out, and every what-if is short, sound, said once and says what pushed each link.
// Puzzles: Project Euler problem 96 and the English Wikipedia example (tests/fixtures/classic-puzzles.json),
// our generated thermometer puzzles (tests/fixtures/thermo-puzzles.json and tests/helpers/generate-thermo.ts);
// solutions from the SAT solver logic-solver (npm), tests/helpers/sat-oracle.ts.
import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { describe, expect, test } from 'vitest'
import { parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../../shared/engine/index'
import { soundnessProblems } from '../../helpers/check-path'
import { generateThermo } from '../../helpers/generate-thermo'
import { oracleSolve } from '../../helpers/sat-oracle'

type Fixture = { id: string; title?: string; givens: string; thermometers?: string[][] }
const load = (name: string) => (JSON.parse(readFileSync(new URL(`../../fixtures/${name}`, import.meta.url), 'utf8')) as { puzzles: Fixture[] }).puzzles
const corpus = [...load('thermo-puzzles.json'), ...load('classic-puzzles.json').map((p) => ({ ...p, thermometers: [] }))]

// Sudoku geometry written here, apart from the engine's (the rules of the game).
const rowOf = (c: number) => Math.floor(c / 9)
const colOf = (c: number) => c % 9
const boxOf = (c: number) => 3 * Math.floor(rowOf(c) / 3) + Math.floor(colOf(c) / 3)
const sees = (a: number, b: number) => a !== b && (rowOf(a) === rowOf(b) || colOf(a) === colOf(b) || boxOf(a) === boxOf(b))
const inHouse = (c: number, h: { kind: string; index: number }) => (h.kind === 'row' ? rowOf(c) : h.kind === 'column' ? colOf(c) : boxOf(c)) === h.index
const has = (cand: Uint16Array, cell: number, d: number) => (cand[cell] & (1 << (d - 1))) !== 0

/** Problems with step `by` as the remover of `digit` from `cell` before step k. */
function removedByStep(puzzle: Puzzle, steps: Step[], by: number, k: number, cell: number, digit: number): string[] {
  if (!(by >= 0 && by < k)) return [`step ${k + 1}: remover ${by + 1} is not an earlier step`]
  const out: string[] = []
  if (!has(stateAt(puzzle, steps, by).candidates, cell, digit)) out.push(`step ${k + 1}: ${digit} was already gone from ${cell} before step ${by + 1}`)
  if (!steps[by].eliminations.some((e) => e.cell === cell && e.digits.includes(digit))) out.push(`step ${k + 1}: step ${by + 1} does not eliminate ${digit} from ${cell}`)
  return out
}

/** Everything a single says about its blockers that the replayed grid contradicts. */
function singleProblems(puzzle: Puzzle, steps: Step[], k: number): string[] {
  const f = steps[k].facts
  const before = stateAt(puzzle, steps, k)
  const out: string[] = []
  if (f.kind === 'single-cell') {
    const groups = { row: (c: number) => rowOf(c) === rowOf(f.cell), column: (c: number) => colOf(c) === colOf(f.cell), box: (c: number) => boxOf(c) === boxOf(f.cell) }
    for (const [where, same] of Object.entries(groups)) {
      for (const d of f.seen[where as keyof typeof groups]) {
        if (!Array.from({ length: 81 }, (_, c) => c).some((c) => c !== f.cell && same(c) && before.digits[c] === d)) out.push(`step ${k + 1}: no ${d} in its ${where}`)
      }
    }
    const by = f.ruledOutBy ?? []
    expect(by.map((r) => r.digit).sort()).toEqual([...f.seen.ruledOut].sort())
    for (const r of by) {
      if (has(before.candidates, f.cell, r.digit)) out.push(`step ${k + 1}: ${r.digit} is still a candidate`)
      out.push(...removedByStep(puzzle, steps, r.step, k, f.cell, r.digit))
    }
    const told = new Set([...f.seen.row, ...f.seen.column, ...f.seen.box, ...f.seen.ruledOut])
    if (told.size !== 8 || told.has(f.digit)) out.push(`step ${k + 1}: the reasons cover ${[...told]}`)
  }
  if (f.kind === 'single-house') {
    expect(f.blockers?.map((b) => b.cell)).toEqual(f.blockedCells)
    for (const b of f.blockers ?? []) {
      if (!inHouse(b.cell, f.house) || before.digits[b.cell] || has(before.candidates, b.cell, f.digit)) out.push(`step ${k + 1}: ${b.cell} is not blocked`)
      if ('peer' in b) {
        if (!sees(b.cell, b.peer) || before.digits[b.peer] !== f.digit) out.push(`step ${k + 1}: ${b.peer} does not hold ${f.digit} in sight of ${b.cell}`)
      } else out.push(...removedByStep(puzzle, steps, b.step, k, b.cell, f.digit))
    }
    const open = Array.from({ length: 81 }, (_, c) => c).filter((c) => inHouse(c, f.house) && c !== f.cell && !before.digits[c])
    expect(f.blockedCells.slice().sort((a, b) => a - b)).toEqual(open)
  }
  return out
}

describe('provenance of singles (classic and thermometer fixtures)', () => {
  test('every single names blockers that are really absent, removed by the steps it names or held by the peers it names', () => {
    let fromSteps = 0
    let singles = 0
    for (const f of corpus) {
      const puzzle = parsePuzzle({ title: f.title ?? f.id, givens: f.givens, thermometers: f.thermometers ?? [] }).puzzle as Puzzle
      const { steps } = solvePath(puzzle)
      steps.forEach((s, k) => {
        if (s.facts.kind !== 'single-cell' && s.facts.kind !== 'single-house') return
        singles++
        if (s.facts.kind === 'single-cell' ? s.facts.seen.ruledOut.length : s.facts.blockers?.some((b) => 'step' in b)) fromSteps++
        expect(singleProblems(puzzle, steps, k), `${f.id} step ${k + 1}`).toEqual([])
      })
    }
    expect(singles).toBeGreaterThan(1000)
    expect(fromSteps).toBeGreaterThan(0)
  }, 120_000)

  test('a single whose cell lost digits only to steps lists no house and only the thermometers those steps used', () => {
    // constructed check over the fixtures: the reason's thermometers are the removers' thermometers
    for (const f of load('thermo-puzzles.json').slice(0, 6)) {
      const puzzle = parsePuzzle(f).puzzle as Puzzle
      const { steps } = solvePath(puzzle)
      steps.forEach((s) => {
        if (s.facts.kind !== 'single-cell') return
        const used = new Set((s.facts.ruledOutBy ?? []).flatMap((r) => steps[r.step].reason.thermometers))
        expect(s.reason.thermometers.every((t) => used.has(t))).toBe(true)
        if (!s.facts.seen.row.length && !s.facts.seen.column.length && !s.facts.seen.box.length) expect(s.reason.houses).toEqual([])
      })
    }
  }, 60_000)
})

/** Problems with one what-if's records, replayed from its links only (sudoku and thermometer rules). */
function chainProblems(puzzle: Puzzle, steps: Step[], k: number): string[] {
  const f = steps[k].facts
  if (f.kind !== 'contradiction') return []
  const out: string[] = []
  if ((f.long ?? false) !== f.chain.length > 6) out.push(`step ${k + 1}: ${f.chain.length} links, long ${f.long}`)
  if (f.emptyCell === f.cell) out.push(`step ${k + 1}: refuted by its own cell`)
  const state = stateAt(puzzle, steps, k)
  const digits = state.digits.slice()
  const cand = state.candidates.slice()
  const placedBy = new Map<number, number>()
  const place = (cell: number, d: number) => {
    if (digits[cell] && digits[cell] !== d) out.push(`step ${k + 1}: ${cell} placed twice`)
    digits[cell] = d
    cand[cell] = 1 << (d - 1)
    placedBy.set(cell, d)
    for (let p = 0; p < 81; p++) if (sees(p, cell) && !digits[p]) cand[p] &= ~(1 << (d - 1))
  }
  place(f.cell, f.assumed)
  for (const link of f.chain) {
    const b = link.because
    if (!b) {
      out.push(`step ${k + 1}: a link without because`)
      continue
    }
    if (link.kind === 'eliminate') {
      // a thermometer link: the neighbour's bound moved
      const path = puzzle.thermometers[link.thermometer ?? -1] ?? []
      const i = path.indexOf(link.cell)
      const j = path.indexOf(b.cell)
      const bits = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => cand[b.cell] & (1 << (d - 1)))
      if (i < 0 || Math.abs(i - j) !== 1) out.push(`step ${k + 1}: ${b.cell} is not next to ${link.cell} on its thermometer`)
      else if (j < i && (bits.some((d) => d < b.digit) || link.digits.some((d) => d > b.digit))) out.push(`step ${k + 1}: bound from before is not ${b.digit}`)
      else if (j > i && (bits.some((d) => d > b.digit) || link.digits.some((d) => d < b.digit))) out.push(`step ${k + 1}: bound from after is not ${b.digit}`)
      for (const d of link.digits) cand[link.cell] &= ~(1 << (d - 1))
    } else {
      // a single: pushed by a placement of the chain (or by a bound, on a thermometer cell)
      const byPlacement = placedBy.get(b.cell) === b.digit
      const onThermo = puzzle.thermometers.some((t) => t.includes(b.cell))
      if (!byPlacement && !onThermo) out.push(`step ${k + 1}: nothing in the chain put ${b.digit} at ${b.cell}`)
      if (!has(cand, link.cell, link.digits[0])) out.push(`step ${k + 1}: ${link.digits[0]} no longer fits ${link.cell}`)
      place(link.cell, link.digits[0])
    }
  }
  return out
}

describe('what-ifs', () => {
  test('fixtures: every chain is sound, marked long when over six links, and says what pushed each link', () => {
    let seen = 0
    for (const f of corpus) {
      const puzzle = parsePuzzle({ title: f.title ?? f.id, givens: f.givens, thermometers: f.thermometers ?? [] }).puzzle as Puzzle
      const { steps } = solvePath(puzzle)
      steps.forEach((s, k) => {
        if (s.facts.kind !== 'contradiction') return
        seen++
        expect(chainProblems(puzzle, steps, k), `${f.id} step ${k + 1}`).toEqual([])
      })
    }
    expect(seen).toBeGreaterThan(0)
  }, 120_000)

  test('generated thermometer puzzles (fast-check): path sound against the SAT oracle, no what-if twice, chains over six links marked long', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 1_000_000 }), (seed) => {
        const g = generateThermo(seed)
        const o = oracleSolve(g.givens, g.thermometers.map((p) => p.map((n) => parseCellName(n) as number)))
        expect(o).toEqual({ count: 1, solution: g.solution })
        const puzzle = parsePuzzle(g).puzzle as Puzzle
        const { steps } = solvePath(g)
        expect(soundnessProblems(puzzle, steps, g.solution)).toEqual([])
        const assumed = steps.flatMap((s) => (s.facts.kind === 'contradiction' ? [`${s.facts.cell}:${s.facts.assumed}`] : []))
        expect(new Set(assumed).size).toBe(assumed.length)
        steps.forEach((s, k) => {
          expect(chainProblems(puzzle, steps, k)).toEqual([])
          if (s.facts.kind === 'single-cell' || s.facts.kind === 'single-house') expect(singleProblems(puzzle, steps, k)).toEqual([])
        })
      }),
      { numRuns: 8, seed: 1212 },
    )
  }, 120_000)
})
