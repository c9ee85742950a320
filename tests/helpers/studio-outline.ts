/**
 * Real outlines for Studio tests: a fixture puzzle run through the engine (solvePath) and the
 * script writer (buildOutline), so the tests see the same shapes the server stores.
 */
import { parsePuzzle, solvePath } from '../../shared/engine/index'
import { buildOutline } from '../../shared/script/index'
import type { Outline } from '../../shared/schemas/outline'
import type { OutlineRecord } from '../../shared/schemas/studio'
import classicPuzzles from '../fixtures/classic-puzzles.json'
import thermoPuzzles from '../fixtures/thermo-puzzles.json'
import thermoTiers from '../fixtures/thermo-tiers.json'

interface FixtureFile {
  puzzles: { id: string; title: string; givens: string; thermometers?: string[][] }[]
}

const cache = new Map<string, Outline>()

/**
 * An outline for a fixture puzzle: 'PE01' (Project Euler 96, grid 01; classic rules), a generated
 * thermometer puzzle such as 'GT07', or one of the three-tier set such as 'hard-90011'. `stopAfter` cuts the path short and marks it stuck, as the engine
 * does when it needs a technique it doesn't know.
 */
export function outlineFor(id = 'PE01', options: { stopAfter?: number } = {}): Outline {
  const key = `${id}:${options.stopAfter ?? ''}`
  const hit = cache.get(key)
  if (hit) return structuredClone(hit)
  const tiers = thermoTiers.tiers
  const file: FixtureFile = id.startsWith('PE') ? classicPuzzles : /^(easy|medium|hard)-/.test(id) ? { puzzles: [...tiers.easy, ...tiers.medium, ...tiers.hard] } : thermoPuzzles
  const entry = file.puzzles.find((p) => p.id === id)
  if (!entry) throw new Error(`outlineFor: no fixture puzzle ${id}`)
  const input = { title: entry.title, givens: entry.givens, thermometers: entry.thermometers ?? [] }
  const { puzzle } = parsePuzzle(input)
  if (!puzzle) throw new Error(`outlineFor: fixture ${id} does not parse`)
  let result = solvePath(input)
  if (options.stopAfter !== undefined) result = { ...result, status: 'stuck', steps: result.steps.slice(0, options.stopAfter) }
  const outline = buildOutline(puzzle, result, { names: 'words' })
  cache.set(key, outline)
  return structuredClone(outline)
}

/** The record GET /outlines/:id answers with. */
export function recordFor(outline: Outline, overrides: Partial<OutlineRecord> = {}): OutlineRecord {
  return {
    id: 31,
    puzzleId: 4,
    name: 'First take',
    status: outline.status,
    stepCount: outline.steps.length,
    totalMs: 0,
    version: 3,
    puzzleVersion: 1,
    puzzleChanges: null,
    savedBy: { id: 7, name: 'Priya Castellanos' },
    updatedAt: '2025-03-01T10:00:00.000Z',
    outline,
    ...overrides,
  }
}
