/**
 * buildOutline: one call from an engine result to a complete, timed, chaptered script.
 */
import type { Puzzle, SolveResult, Step } from '../engine/types'
import { PEERS } from '../grid'
import { DAY_MS, namingStyleSchema, type NamingStyle, type Outline, type OutlineLine } from '../schemas/outline'
import { stepSchema } from '../schemas/step'
import { groupSteps } from './fold'
import { choosePhrasing, familyOf, renderLine, type ScriptSource } from './narrate'
import { autoChapters } from './chapters'
import { formatClock } from './timecode'
import { checkPace, estimateMs, lineActions, TIMING } from './timing'
import { cellWords } from './words'

interface BuildOptions {
  /** words a minute, 60–400; default 160 */
  pace?: number
  names?: NamingStyle
  /** where viewers find the puzzle; a placeholder is said when missing */
  link?: string
  /** the length the video should come out at; fitToTarget uses it */
  targetMs?: number
}

/** No two lines within this many in a row open with the same word, where the phrasings allow it. */
export const OPENER_WINDOW = 8

/** Script lines, timing inputs and chapters for a solve path. Throws on input it can't narrate. */
export function buildOutline(puzzle: Puzzle, result: SolveResult, options: BuildOptions = {}): Outline {
  const pace = checkPace(options.pace ?? TIMING.defaultPace)
  const names = options.names ?? 'words'
  if (!namingStyleSchema.safeParse(names).success) throw new Error(`names must be "words" or "coords" (got ${String(names)})`)
  const givens = checkPuzzle(puzzle)
  const steps = checkResult(result, puzzle, givens)

  const src: ScriptSource = {
    title: puzzle.title.trim() || 'Untitled puzzle',
    author: puzzle.author?.trim() || undefined,
    link: options.link?.trim() || undefined,
    names,
    status: result.status === 'solved' ? 'solved' : 'stuck',
    puzzle: { givens, thermometers: puzzle.thermometers.map((t) => [...t]) },
    steps,
  }

  const shapes: Pick<OutlineLine, 'kind' | 'steps'>[] = [
    { kind: 'intro', steps: [] },
    ...groupSteps(steps, src.puzzle.thermometers).map((g) => ({ kind: 'step' as const, steps: g })),
    { kind: 'outro', steps: [] },
  ]
  const lines: OutlineLine[] = []
  const lastOfFamily = new Map<string, number>()
  shapes.forEach((shape, i) => {
    const family = familyOf(src, shape)
    const phrasing = choosePhrasing(src, shape, lines.slice(-(OPENER_WINDOW - 1)), lastOfFamily.get(family))
    lastOfFamily.set(family, phrasing)
    const text = renderLine(src, shape, phrasing)
    lines.push({ id: i + 1, ...shape, text, edited: false, hidden: false, phrasing, estMs: estimateMs(text, pace, lineActions(src, shape)) })
  })

  const outline: Outline = { version: 1, ...src, pace, lines, chapters: autoChapters(src, lines) }
  if (options.targetMs !== undefined) outline.targetMs = checkTarget(outline, options.targetMs)
  return stripUndefined(outline)
}

/** A target must leave room for at least the intro. */
export function checkTarget(outline: Outline, targetMs: unknown): number {
  if (typeof targetMs !== 'number' || !Number.isFinite(targetMs) || targetMs <= 0) {
    throw new Error(`target length must be a positive number of milliseconds (got ${String(targetMs)})`)
  }
  if (targetMs >= DAY_MS) throw new Error(`target length must be under 24 hours (got ${formatClock(targetMs)})`)
  const intro = outline.lines.find((l) => l.kind === 'intro')
  if (intro && targetMs < intro.estMs) {
    throw new Error(`target ${formatClock(targetMs)} is shorter than the intro (${formatClock(intro.estMs)})`)
  }
  return Math.round(targetMs)
}

function checkPuzzle(puzzle: Puzzle): string {
  if (!puzzle || typeof puzzle !== 'object') throw new Error('puzzle is missing')
  if (typeof puzzle.title !== 'string') throw new Error('puzzle has no title')
  const g = puzzle.givens
  if (!g || g.length !== 81) throw new Error(`puzzle givens must have 81 cells (got ${g ? g.length : 0})`)
  let givens = ''
  for (let i = 0; i < 81; i++) {
    const d = g[i]
    if (!Number.isInteger(d) || d < 0 || d > 9) throw new Error(`puzzle given at ${cellWords(i, coords)} is not a digit 0..9`)
    givens += d === 0 ? '.' : String(d)
  }
  if (!Array.isArray(puzzle.thermometers)) throw new Error('puzzle thermometers must be a list')
  puzzle.thermometers.forEach((t, i) => {
    if (!Array.isArray(t) || t.length < 2 || t.some((c) => !Number.isInteger(c) || c < 0 || c > 80)) {
      throw new Error(`thermometer ${i + 1} is not a path of cells`)
    }
  })
  return givens
}

const coords = { style: 'coords' as const, thermometers: [] }

/**
 * The result must be narratable and must belong to this puzzle: its placements land on empty
 * cells without clashing with a digit already in the house, and it names only this puzzle's
 * thermometers. A path from another puzzle fails one of these almost at once.
 */
function checkResult(result: SolveResult, puzzle: Puzzle, givens: string): Step[] {
  if (!result || typeof result !== 'object' || !Array.isArray(result.steps)) throw new Error('solve result has no list of steps')
  if (result.status === 'invalid') {
    const why = (result.errors ?? []).map((e) => e.message).join('; ')
    throw new Error(`the puzzle is invalid, so there is nothing to narrate${why ? `: ${why}` : ''}`)
  }
  if (result.steps.length === 0) throw new Error('the solve path is empty: there are no steps to narrate')
  const grid = Array.from(givens, (ch) => (ch === '.' ? 0 : Number(ch)))
  const thermos = puzzle.thermometers
  return result.steps.map((raw, k) => {
    const parsed = stepSchema.safeParse(raw)
    if (!parsed.success) {
      const first = parsed.error.issues[0]
      throw new Error(`step ${k + 1} is malformed: ${first.path.join('.') || 'step'}: ${first.message}`)
    }
    const step = parsed.data
    const fail = (why: string) => new Error(`step ${k + 1} doesn't belong to this puzzle: ${why}`)
    const therms = [...step.reason.thermometers]
    const f = step.facts
    if (f.kind === 'thermo-length' || f.kind === 'thermo-bounds') therms.push(f.thermometer)
    if (f.kind === 'contradiction') f.chain.forEach((l) => l.thermometer !== undefined && therms.push(l.thermometer))
    if (f.kind === 'either-way') f.sides.forEach((side) => side.chain.forEach((l) => l.thermometer !== undefined && therms.push(l.thermometer)))
    for (const t of therms) if (t >= thermos.length) throw fail(`it uses thermometer ${t + 1}, and the puzzle has ${thermos.length}`)
    if (f.kind === 'thermo-length' && f.length !== thermos[f.thermometer].length) {
      throw fail(`it says thermometer ${f.thermometer + 1} has ${f.length} cells, and it has ${thermos[f.thermometer].length}`)
    }
    for (const p of step.placements) {
      const at = cellWords(p.cell, coords)
      if (grid[p.cell] !== 0) throw fail(`it places ${p.digit} at ${at}, which already holds ${grid[p.cell]}`)
      const clash = PEERS[p.cell].find((c) => grid[c] === p.digit)
      if (clash !== undefined) throw fail(`it places ${p.digit} at ${at}, and ${cellWords(clash, coords)} already holds ${p.digit}`)
      grid[p.cell] = p.digit
    }
    return step
  })
}

/** JSON has no undefined: drop optional keys that aren't set, so outlines compare equal after a round trip. */
function stripUndefined<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T
}
