/**
 * Turns one outline line (intro, a step, or several folded steps) into spoken text, and picks
 * the phrasing a new line gets. Text depends only on the steps' structured facts, the stored
 * phrasing index and the naming style, so re-rendering is exact.
 */
import { byFactsKind, type FactsTable } from '../engine/facts-table'
import type { Cell, FactsKind, FactsOf, Step } from '../engine/types'
import { boxOf, colOf, houseCells, rowOf } from '../grid'
import type { Outline, OutlineLine } from '../schemas/outline'
import { INTRO, OUTRO, type Credits } from './intro'
import { hashNumbers, hashString, openerOf, rotation } from './pick'
import {
  BREAK_IN,
  CONTRADICTION,
  EITHER_WAY,
  EXPLAIN,
  FISH,
  HIDDEN_SUBSET,
  LOCKED_BOX_LINE,
  LOCKED_LINE_BOX,
  NAKED_SUBSET,
  RUN,
  SEGUES,
  SINGLE_CELL,
  SINGLE_HOUSE,
  THERMO_BOUNDS,
  THERMO_EITHER,
  THERMO_ENDS,
  THERMO_LENGTH,
  THERMO_LENGTHS,
  THERMO_POINTING,
  W_WING,
  XY_WING,
  XYZ_WING,
  briefContradiction,
  eliminationsWords,
  placementsWords,
  type Phrasing,
  type Run,
  type Said,
} from './phrasings'
import { digitsAfter } from './replay-digits'
import { segmentSteps, TRIVIAL } from './segments'
import { houseWords, thermoWords, type Namer } from './words'

/** The parts of an outline that text is rendered from. */
export type ScriptSource = Pick<Outline, 'title' | 'author' | 'link' | 'names' | 'status' | 'puzzle' | 'steps'>
type LineShape = Pick<OutlineLine, 'kind' | 'steps'>

/** The text of a line with the given phrasing. */
export function renderLine(src: ScriptSource, line: LineShape, phrasing: number, style = src.names): string {
  const n: Namer = { style, thermometers: src.puzzle.thermometers }
  if (line.kind === 'intro') return pickOf(INTRO, phrasing)(credits(src))
  if (line.kind === 'outro') return pickOf(OUTRO, phrasing)(credits(src))
  const lead = leadOf(src, line)
  const body = withSegue(renderSteps(src, line, phrasing, n), segueOf(src, line, phrasing))
  return lead ? `${lead} ${body}` : body
}

/**
 * A phrasing number past the line's count of phrasings also picks a segue ("Moving on,") said in
 * front: how a line opens differently when every phrasing it has opens like a recent line.
 */
function segueOf(src: ScriptSource, line: LineShape, phrasing: number): string | undefined {
  if (line.kind !== 'step' || leadOf(src, line)) return undefined
  const k = Math.floor(phrasing / phrasingCount(src, line))
  return k > 0 ? SEGUES[(k - 1) % SEGUES.length] : undefined
}

function withSegue(body: string, segue: string | undefined): string {
  if (!segue) return body
  if (segue.endsWith('.')) return `${segue} ${body}`
  // "Moving on, where does…": the sentence carries on, so its first word loses its capital
  return `${segue} ${/^[A-Z][a-z']/.test(body) ? body[0].toLowerCase() + body.slice(1) : body}`
}

function leadOf(src: ScriptSource, line: LineShape): string | undefined {
  if (line.kind !== 'step') return undefined
  return segmentSteps(src.steps, src.puzzle.thermometers).find((s) => s.start === line.steps[0])?.lead
}

function renderSteps(src: ScriptSource, line: LineShape, phrasing: number, n: Namer): string {
  if (line.steps.length === 1) return renderStep(src, line.steps[0], phrasing, n)
  if (isLengthsLine(src, line)) return lengthsLine(src, line.steps, phrasing, n)
  if (line.steps.every((i) => TRIVIAL.has(src.steps[i].technique))) {
    const run = runOf(src, line.steps, n)
    const text = usableRuns(run)[phrasing % usableRuns(run).length](run) as string
    return withBreakIn(src, line.steps, text, phrasing)
  }
  // A presenter folded steps that aren't a simple run: say each, in order.
  return line.steps.map((i, k) => renderStep(src, i, phrasing + k, n)).join(' ')
}

/** How many phrasings a line can take. */
function phrasingCount(src: ScriptSource, line: LineShape): number {
  if (line.kind === 'intro') return INTRO.length
  if (line.kind === 'outro') return OUTRO.length
  if (line.steps.length === 1) return narrationOf(src.steps[line.steps[0]]).phrasings().length
  if (isLengthsLine(src, line)) return THERMO_LENGTHS.length
  if (line.steps.every((i) => TRIVIAL.has(src.steps[i].technique))) {
    return usableRuns(runOf(src, line.steps, { style: 'words', thermometers: src.puzzle.thermometers })).length
  }
  return 3
}

/** Lines whose phrasings should not repeat back to back share a family. */
export function familyOf(src: ScriptSource, line: LineShape): string {
  if (line.kind !== 'step') return line.kind
  if (isLengthsLine(src, line)) return 'thermo-lengths'
  if (line.steps.length > 1) return 'run'
  return narrationOf(src.steps[line.steps[0]]).family
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
  // a stored phrasing may carry a segue (a multiple of count on top); the phrasing itself is the rest
  const last = lastOfFamily === undefined ? undefined : lastOfFamily % count
  const fresh = order.find((p) => p !== last && !openers.has(opens(p))) ?? order.find((p) => !openers.has(opens(p)))
  if (fresh !== undefined) return fresh
  const base = order.find((p) => p !== last) ?? order[0]
  // Every phrasing opens like a recent line: a segue no recent line opened with goes in front.
  if (line.kind === 'step' && !lead) {
    for (let k = 0; k < SEGUES.length; k++) {
      const segue = (seed + k) % SEGUES.length
      if (!openers.has(openerOf(SEGUES[segue]))) return base + count * (segue + 1)
    }
  }
  return base
}

function renderStep(src: ScriptSource, index: number, phrasing: number, n: Namer): string {
  const step = src.steps[index]
  const told = narrationOf(step)
  const parts: string[] = []
  if (told.explain && firstWithIdea(src.steps, index, told.explain.idea)) parts.push(told.explain.words())
  const gridBefore = () => digitsAfter(src.puzzle.givens, src.steps, index)
  parts.push(pickOf(told.phrasings(), phrasing)({ n, step, steps: src.steps, index, gridBefore }))
  if (told.sayAlso.eliminations) {
    const elim = eliminationsWords(step, n)
    if (elim) parts.push(elim)
  }
  if (told.sayAlso.placements && step.placements.length > 0) {
    parts.push(`That gives us ${placementsWords(step.placements, n)}.`)
  }
  return withBreakIn(src, [index], parts.join(' '), phrasing)
}

/** Several thermometer-length steps in one line: the lengths said together, once, at the start. */
function isLengthsLine(src: ScriptSource, line: LineShape): boolean {
  return line.kind === 'step' && line.steps.length > 1 && line.steps.every((i) => src.steps[i].facts.kind === 'thermo-length')
}

function lengthsLine(src: ScriptSource, steps: number[], phrasing: number, n: Namer): string {
  const byLength = new Map<number, string[]>()
  for (const i of steps) {
    const f = src.steps[i].facts
    if (f.kind !== 'thermo-length') continue
    byLength.set(f.length, [...(byLength.get(f.length) ?? []), thermoWords(f.thermometer, n)])
  }
  const groups = [...byLength.entries()].sort((a, b) => b[0] - a[0]).map(([length, names]) => ({ length, names }))
  const text = pickOf(THERMO_LENGTHS, phrasing)({ groups })
  const explain = firstWithIdea(src.steps, steps[0], 'thermo-length') ? `${EXPLAIN['thermo-length']()} ` : ''
  return withBreakIn(src, steps, `${explain}${text}`, phrasing)
}

function withBreakIn(src: ScriptSource, steps: number[], text: string, phrasing: number): string {
  const first = src.steps.findIndex((s) => s.placements.length > 0)
  if (!steps.includes(first)) return text
  return `${text} ${pickOf(BREAK_IN, phrasing + first)}`
}

function firstWithIdea(steps: Step[], index: number, idea: string): boolean {
  for (let i = 0; i < index; i++) if (narrationOf(steps[i]).explain?.idea === idea) return false
  return true
}

/**
 * A what-if line said briefly, for fitting a script to a length: the assumption, where it breaks and
 * what that gives, with the links left for the grid to show. A folded line says each step in order.
 */
export function briefWhatIf(src: ScriptSource, line: LineShape): string {
  const n: Namer = { style: src.names, thermometers: src.puzzle.thermometers }
  return line.steps
    .map((i) => {
      const step = src.steps[i]
      const f = step.facts
      if (f.kind !== 'contradiction') return renderStep(src, i, 0, n)
      const gives = step.placements.length > 0 ? ` That gives us ${placementsWords(step.placements, n)}.` : ''
      return `${briefContradiction(f, n)}${gives}`
    })
    .join(' ')
}

/** How a kind of step is said. Fields that cost something are functions, read only when needed. */
interface Narration {
  /** lines of one family never repeat a phrasing back to back */
  family: string
  /** the idea behind the step, explained once, before the first step of a script that relies on it */
  explain?: { idea: string; words: () => string }
  /** the step's phrasings, its facts filled in */
  phrasings: () => ((s: Said) => string)[]
  /** what the line says after the phrasing */
  sayAlso: { eliminations: boolean; placements: boolean }
}

// A single's phrasing already says its placement; subsets and locked candidates only matter
// through what they remove, so they say it; the rest say any placement they lead to.
const NOTHING_MORE = { eliminations: false, placements: false }
const PLACEMENTS = { eliminations: false, placements: true }
const ELIMINATIONS_AND_PLACEMENTS = { eliminations: true, placements: true }

const NARRATION: FactsTable<Narration> = {
  'single-cell': (f) => ({ family: f.kind, phrasings: () => withFacts(SINGLE_CELL, f), sayAlso: NOTHING_MORE }),
  'single-house': (f) => ({ family: f.kind, phrasings: () => withFacts(SINGLE_HOUSE, f), sayAlso: NOTHING_MORE }),
  subset: (f) => ({
    family: `subset-${f.form}`,
    explain: { idea: `subset-${f.form}`, words: () => EXPLAIN[`subset-${f.form}`](f.cells.length) },
    phrasings: () => withFacts(f.form === 'naked' ? NAKED_SUBSET : HIDDEN_SUBSET, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  locked: (f) => ({
    family: `locked-${f.direction}`,
    // both directions rest on one idea, explained once
    explain: { idea: 'locked', words: EXPLAIN.locked },
    phrasings: () => withFacts(f.direction === 'box-to-line' ? LOCKED_BOX_LINE : LOCKED_LINE_BOX, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  'thermo-length': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['thermo-length'] },
    phrasings: () => withFacts(THERMO_LENGTH, f),
    sayAlso: PLACEMENTS,
  }),
  'thermo-bounds': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['thermo-bounds'] },
    phrasings: () => withFacts(THERMO_BOUNDS, f),
    sayAlso: PLACEMENTS,
  }),
  'thermo-pointing': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['thermo-pointing'] },
    phrasings: () => withFacts(THERMO_POINTING, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  // the phrasings end on the digits the cell loses, so nothing more is said
  'thermo-either': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['thermo-either'] },
    phrasings: () => withFacts(THERMO_EITHER, f),
    sayAlso: NOTHING_MORE,
  }),
  'thermo-ends': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['thermo-ends'] },
    phrasings: () => withFacts(THERMO_ENDS, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  fish: (f) => ({
    family: f.kind,
    // an X-wing and a swordfish rest on one idea, explained once
    explain: { idea: f.kind, words: () => EXPLAIN.fish(f.baseLines.length, f.baseLines[0]?.kind ?? 'row', f.coverLines[0]?.kind ?? 'column') },
    phrasings: () => withFacts(FISH, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  wing: (f) => ({
    family: `wing-${f.form}`,
    explain: { idea: `wing-${f.form}`, words: EXPLAIN[`wing-${f.form}`] },
    phrasings: () => withFacts(f.form === 'xy' ? XY_WING : XYZ_WING, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  'w-wing': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['w-wing'] },
    phrasings: () => withFacts(W_WING, f),
    sayAlso: ELIMINATIONS_AND_PLACEMENTS,
  }),
  'either-way': (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN['either-way'] },
    phrasings: () => withFacts(EITHER_WAY, f),
    sayAlso: NOTHING_MORE,
  }),
  contradiction: (f) => ({
    family: f.kind,
    explain: { idea: f.kind, words: EXPLAIN.contradiction },
    phrasings: () => withFacts(CONTRADICTION, f),
    sayAlso: PLACEMENTS,
  }),
}

function narrationOf(step: Step): Narration {
  return byFactsKind(NARRATION, step.facts)
}

function withFacts<K extends FactsKind>(phrasings: readonly Phrasing<K>[], f: FactsOf<K>): ((s: Said) => string)[] {
  return phrasings.map((p) => (s) => p(f, s))
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
      const house = { kind: h.kind, index }
      return { placements, area: houseWords(house, n), finishes: filled(houseCells(house)), line: h.kind === 'box' ? undefined : h.kind, n }
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

