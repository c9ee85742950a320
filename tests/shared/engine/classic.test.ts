// Classic sudoku: the 50 grids of Project Euler problem 96 and the example of the English Wikipedia
// article "Sudoku" (tests/fixtures/classic-puzzles.json, sources noted in the file), each checked
// against the SAT solver logic-solver (npm) as an independent oracle.
import { readFileSync } from 'node:fs'
import { describe, expect, test } from 'vitest'
import { countSolutions, parsePuzzle, solvePath, type Puzzle } from '../../../shared/engine/index'
import { soundnessProblems } from '../../helpers/check-path'
import { oracleSolve } from '../../helpers/sat-oracle'

interface Fixture {
  id: string
  title: string
  givens: string
}
const data = JSON.parse(readFileSync(new URL('../../fixtures/classic-puzzles.json', import.meta.url), 'utf8')) as { puzzles: Fixture[] }
const euler = data.puzzles.filter((p) => p.id.startsWith('PE'))
const wiki = data.puzzles.find((p) => p.id === 'WIKI1') as Fixture

const oracle = new Map(data.puzzles.map((p) => [p.id, oracleSolve(p.givens)]))
const puzzleOf = (p: Fixture) => parsePuzzle({ title: p.title, givens: p.givens, thermometers: [] }).puzzle as Puzzle

describe('Project Euler 96 (source: Project Euler problem 96, sudoku.txt)', () => {
  test('the fixture holds 50 grids', () => expect(euler).toHaveLength(50))

  test.each(euler.map((p) => [p.id, p] as const))('%s: the oracle finds one solution and the engine agrees', (_, p) => {
    const o = oracle.get(p.id)!
    expect(o.count).toBe(1)
    const puzzle = puzzleOf(p)
    expect(countSolutions(puzzle)).toEqual({ count: 1, solution: o.solution })
    const result = solvePath(p.givens)
    expect(result.status).toBe('solved')
    expect(result.grid).toBe(o.solution)
    expect(soundnessProblems(puzzle, result.steps, o.solution!)).toEqual([])
  })

  test('sum of the top-left 3-digit numbers is 24702 (from memory; confirmed by the oracle)', () => {
    let fromOracle = 0
    let fromEngine = 0
    for (const p of euler) {
      fromOracle += Number(oracle.get(p.id)!.solution!.slice(0, 3))
      fromEngine += Number(solvePath(p.givens).grid.slice(0, 3))
    }
    expect(fromOracle).toBe(24702)
    expect(fromEngine).toBe(24702)
  })

  test('contradictions stay rare on classic grids (a path should read like a person)', () => {
    const used = euler.flatMap((p) => solvePath(p.givens).steps.filter((s) => s.technique === 'contradiction'))
    expect(used.length).toBeLessThanOrEqual(5)
  })
})

describe('Wikipedia example (source: English Wikipedia, article "Sudoku", introduction image)', () => {
  test('solved by singles alone, matching the oracle; the solution begins 534678912 (from the source note)', () => {
    const o = oracle.get('WIKI1')!
    expect(o.count).toBe(1)
    expect(o.solution!.slice(0, 9)).toBe('534678912')
    const result = solvePath(wiki.givens)
    expect(result.status).toBe('solved')
    expect(result.grid).toBe(o.solution)
    expect(result.steps.every((s) => s.technique === 'naked-single' || s.technique === 'hidden-single')).toBe(true)
    expect(soundnessProblems(puzzleOf(wiki), result.steps, o.solution!)).toEqual([])
  })
})
