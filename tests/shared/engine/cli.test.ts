// The command line contract: `npm run --silent solve -- <file | ->` (docs/engine.md).
// Puzzle: GT04 from tests/fixtures/thermo-puzzles.json (our generator; oracle-checked in thermo.test.ts).
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, test } from 'vitest'

const root = new URL('../../../', import.meta.url).pathname
const tsx = join(root, 'node_modules/.bin/tsx')
const run = (args: string[], input?: string) => spawnSync(tsx, ['scripts/solve.ts', ...args], { cwd: root, input, encoding: 'utf8', timeout: 60_000 })
const GT04 = (JSON.parse(readFileSync(join(root, 'tests/fixtures/thermo-puzzles.json'), 'utf8')) as { puzzles: { id: string; title: string; givens: string; thermometers: string[][]; solution: string }[] }).puzzles.find((p) => p.id === 'GT04')!

describe('scripts/solve.ts', { timeout: 60_000 }, () => {
  test('a puzzle file => JSON with status, steps in r1c1 names, grid; exit 0', () => {
    const dir = mkdtempSync(join(tmpdir(), 'gridcue-solve-'))
    const file = join(dir, 'p.json')
    writeFileSync(file, JSON.stringify({ title: GT04.title, givens: GT04.givens, thermometers: GT04.thermometers }))
    const r = run([file])
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout)
    expect(Object.keys(out)).toEqual(['status', 'steps', 'grid'])
    expect(out.status).toBe('solved')
    expect(out.grid).toBe(GT04.solution)
    const place = out.steps.find((s: { placements: unknown[] }) => s.placements.length)
    expect(place).toEqual({ technique: expect.any(String), placements: [{ cell: expect.stringMatching(/^r\dc\d$/), digit: expect.any(Number) }], eliminations: [], text: expect.any(String) })
    const elim = out.steps.find((s: { eliminations: unknown[] }) => s.eliminations.length)
    expect(elim.eliminations[0]).toEqual({ cell: expect.stringMatching(/^r\dc\d$/), digits: expect.any(Array) })
  })

  test('"-" reads stdin; an invalid puzzle => status "invalid" with errors, exit 0', () => {
    const r = run(['-'], JSON.stringify({ title: 'x', givens: '55' + '.'.repeat(79), thermometers: [] }))
    expect(r.status).toBe(0)
    const out = JSON.parse(r.stdout)
    expect(out.status).toBe('invalid')
    expect(out.errors).toContainEqual({ code: 'duplicate-given', message: 'Row 1 has the given 5 more than once: r1c1, r1c2.', cells: ['r1c1', 'r1c2'] })
  })

  test('an unreadable file => message on stderr, nothing on stdout, exit 2', () => {
    const r = run(['/nonexistent/puzzle.json'])
    expect(r.status).toBe(2)
    expect(r.stdout).toBe('')
    expect(r.stderr).toMatch(/^solve: cannot read \/nonexistent\/puzzle\.json/)
  })
})
