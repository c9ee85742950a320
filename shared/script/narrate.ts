/**
 * Turns one outline line (intro, a step, or several folded steps) into spoken text, and picks
 * the phrasing a new line gets. Text depends only on the steps' structured facts, the stored
 * phrasing index and the naming style, so re-rendering is exact.
 */
import type { Cell, Step } from '../engine/types'
import type { Outline, OutlineLine } from '../schemas/outline'
import { digitsAfter } from './grid'
import { INTRO, OUTRO, type Credits } from './intro'
import { hashNumbers, hashString, openerOf, rotation } from './pick'
import {
  BREAK_IN,
  CONTRADICTION,
  EXPLAIN,
  HIDDEN_SUBSET,
  LOCKED_BOX_LINE,
  LOCKED_LINE_BOX,
  NAKED_SUBSET,
  RUN,
  SINGLE_CELL,
  SINGLE_HOUSE,
  THERMO_BOUNDS,
  THERMO_LENGTH,
  eliminationsWords,
  placementsWords,
  type Run,
  type Said,
} from './phrasings'
import { segmentSteps, TRIVIAL } from './segments'
import { boxOf, colOf, houseWords, rowOf, thermoWords, type Namer } from './words'

/** The parts of an outline that text is rendered from. */
export type ScriptSource = Pick<Outline, 'title' | 'author' | 'link' | 'names' | 'status' | 'puzzle' | 'steps'>
type LineShape = Pick<OutlineLine, 'kind' | 'steps'>


/** The text of a line with the given phrasing. */
export function renderLine(src: ScriptSource, line: LineShape, phrasing: number, style = src.names): string {
  const n: Namer = { style, thermometers: src.puzzle.thermometers }
  if (line.kind === 'intro') return pickOf(INTRO, phrasing)(credits(src))
  if (line.kind === 'outro') return pickOf(OUTRO, phrasing)(credits(src))
  const lead = leadOf(src, line)
  const body = renderSteps(src, line, phrasing, n)
  return lead ? `${lead} ${body}` : body
}

function leadOf(src: ScriptSource, line: LineShape): string | undefined {
  if (line.kind !== 'step') return undefined
  return segmentSteps(src.steps).find((s) => s.start === line.steps[0])?.lead
}

function renderSteps(src: ScriptSource, line: LineShape, phrasing: number, n: Namer): string {
  if (line.steps.length === 1) return renderStep(src, line.steps[0], phrasing, n)
  if (line.steps.every((i) => TRIVIAL.has(src.steps[i].technique))) {
    const run = runOf(src, line.steps, n)
    const text = usableRuns(run)[phrasing % usableRuns(run).length](run) as string
    return withBreakIn(src, line.steps, text, phrasing)
  }
  // A presenter folded steps that aren't a simple run: say each, in order.
  return line.steps.map((i, k) => renderStep(src, i, phrasing + k, n)).join(' ')
}

/** How many phrasings a line can take. */
export function phrasingCount(src: ScriptSource, line: LineShape): number {
  if (line.kind === 'intro') return INTRO.length
  if (line.kind === 'outro') return OUTRO.length
  if (line.steps.length === 1) return familyPhrasings(src.steps[line.steps[0]]).length
  if (line.steps.every((i) => TRIVIAL.has(src.steps[i].technique))) {
    return usableRuns(runOf(src, line.steps, { style: 'words', thermometers: src.puzzle.thermometers })).length
  }
  return 3
}

/** Lines whose phrasings should not repeat back to back share a family. */
export function familyOf(src: ScriptSource, line: LineShape): string {
  if (line.kind !== 'step') return line.kind
  if (line.steps.length > 1) return 'run'
  return familyKey(src.steps[line.steps[0]])
}

/**
 * The phrasing for a new or re-chosen line: a hashed start, then the first one that neither
 * repeats the last line of its family nor opens like a neighbouring line. Openers are compared
 * in the words style so both naming styles choose alike.
 */
export function choosePhrasing(
  src: ScriptSource,
  line: LineShape,
  neighbours: { text: string; edited: boolean; kind: OutlineLine['kind']; steps: number[]; phrasing: number }[],
  lastOfFamily: number | undefined,
): number {
  const count = phrasingCount(src, line)
  const seed =
    line.kind === 'step'
      ? hashNumbers([...line.steps, ...line.steps.flatMap((i) => src.steps[i].focus), hashString(src.steps[line.steps[0]].technique)])
      : hashString(`${line.kind}:${src.title}`)
  const openers = new Set(neighbours.map((nb) => openerOf(nb.edited ? nb.text : renderLine(src, nb, nb.phrasing, 'words'))))
  // A chapter lead-in ("Let's head over to…") comes first; the sentence after it mustn't echo it.
  const lead = leadOf(src, line)
  if (lead) openers.add(openerOf(lead))
  const order = rotation(count, seed)
  const n: Namer = { style: 'words', thermometers: src.puzzle.thermometers }
  const opens = (p: number) => openerOf(line.kind === 'step' ? renderSteps(src, line, p, n) : renderLine(src, line, p, 'words'))
  return (
    order.find((p) => p !== lastOfFamily && !openers.has(opens(p))) ??
    order.find((p) => !openers.has(opens(p))) ??
    order.find((p) => p !== lastOfFamily) ??
    order[0]
  )
}

function renderStep(src: ScriptSource, index: number, phrasing: number, n: Namer): string {
  const step = src.steps[index]
  const said: Said = { n, step }
  const f = step.facts
  const parts: string[] = []
  const explain = firstOfFamily(src.steps, index) ? explanation(step) : null
  if (explain) parts.push(explain)
  switch (f.kind) {
    case 'single-cell':
      parts.push(pickOf(SINGLE_CELL, phrasing)(f, said))
      break
    case 'single-house':
      parts.push(pickOf(SINGLE_HOUSE, phrasing)(f, said))
      break
    case 'subset':
      parts.push(pickOf(f.form === 'naked' ? NAKED_SUBSET : HIDDEN_SUBSET, phrasing)(f, said))
      break
    case 'locked':
      parts.push(pickOf(f.direction === 'box-to-line' ? LOCKED_BOX_LINE : LOCKED_LINE_BOX, phrasing)(f, said))
      break
    case 'thermo-length':
      parts.push(pickOf(THERMO_LENGTH, phrasing)(f, said))
      break
    case 'thermo-bounds':
      parts.push(pickOf(THERMO_BOUNDS, phrasing)(f, said))
      break
    case 'contradiction':
      parts.push(pickOf(CONTRADICTION, phrasing)(f, said))
      break
  }
  // Subsets and locked candidates only matter through what they remove: say it.
  if (f.kind === 'subset' || f.kind === 'locked') {
    const elim = eliminationsWords(step, n)
    if (elim) parts.push(elim)
  }
  if (f.kind !== 'single-cell' && f.kind !== 'single-house' && step.placements.length > 0) {
    parts.push(`That gives us ${placementsWords(step.placements, n)}.`)
  }
  return withBreakIn(src, [index], parts.join(' '), phrasing)
}

function withBreakIn(src: ScriptSource, steps: number[], text: string, phrasing: number): string {
  const first = src.steps.findIndex((s) => s.placements.length > 0)
  if (!steps.includes(first)) return text
  return `${text} ${pickOf(BREAK_IN, phrasing + first)}`
}

function explanation(step: Step): string | null {
  const f = step.facts
  switch (f.kind) {
    case 'subset':
      return f.form === 'naked' ? EXPLAIN['subset-naked'](f.cells.length) : EXPLAIN['subset-hidden'](f.cells.length)
    case 'locked':
      return EXPLAIN.locked()
    case 'thermo-length':
      return EXPLAIN['thermo-length']()
    case 'thermo-bounds':
      return EXPLAIN['thermo-bounds']()
    case 'contradiction':
      return EXPLAIN.contradiction()
    default:
      return null
  }
}

function familyKey(step: Step): string {
  const f = step.facts
  if (f.kind === 'subset') return `subset-${f.form}`
  if (f.kind === 'locked') return `locked-${f.direction}`
  return f.kind
}

function familyPhrasings(step: Step): unknown[] {
  const f = step.facts
  switch (f.kind) {
    case 'single-cell':
      return SINGLE_CELL
    case 'single-house':
      return SINGLE_HOUSE
    case 'subset':
      return f.form === 'naked' ? NAKED_SUBSET : HIDDEN_SUBSET
    case 'locked':
      return f.direction === 'box-to-line' ? LOCKED_BOX_LINE : LOCKED_LINE_BOX
    case 'thermo-length':
      return THERMO_LENGTH
    case 'thermo-bounds':
      return THERMO_BOUNDS
    case 'contradiction':
      return CONTRADICTION
  }
}

function firstOfFamily(steps: Step[], index: number): boolean {
  const explainKey = (s: Step) => (s.facts.kind === 'subset' ? `subset-${s.facts.form}` : s.facts.kind)
  const key = explainKey(steps[index])
  for (let i = 0; i < index; i++) if (explainKey(steps[i]) === key) return false
  return true
}

/** The shared area of a run's placements, and whether the run fills it. */
function runOf(src: ScriptSource, steps: number[], n: Namer): Run {
  const placements = steps.flatMap((i) => src.steps[i].placements)
  const cells = placements.map((p) => p.cell)
  const after = digitsAfter(src.puzzle.givens, src.steps, steps[steps.length - 1] + 1)
  const filled = (area: Cell[]) => area.every((c) => after[c] !== 0)
  const thermo = src.puzzle.thermometers.findIndex((path) => cells.every((c) => path.includes(c)))
  if (thermo >= 0) return { placements, area: thermoWords(thermo, n), finishes: filled(src.puzzle.thermometers[thermo]), n }
  const houses = [
    { kind: 'box' as const, of: boxOf },
    { kind: 'row' as const, of: rowOf },
    { kind: 'column' as const, of: colOf },
  ]
  for (const h of houses) {
    const index = h.of(cells[0])
    if (cells.every((c) => h.of(c) === index)) {
      const area = Array.from({ length: 81 }, (_, c) => c).filter((c) => h.of(c) === index)
      return { placements, area: houseWords({ kind: h.kind, index }, n), finishes: filled(area), n }
    }
  }
  return { placements, area: null, finishes: false, n }
}

function usableRuns(run: Run): ((r: Run) => string | null)[] {
  return RUN.filter((p) => p(run) !== null)
}

function credits(src: ScriptSource): Credits {
  return { title: src.title, author: src.author, link: src.link, thermometers: src.puzzle.thermometers.length, status: src.status }
}

function pickOf<T>(list: readonly T[], phrasing: number): T {
  return list[phrasing % list.length]
}

