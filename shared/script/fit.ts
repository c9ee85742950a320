/**
 * Fitting a script to a target length: fold runs of easy lines first (nothing is lost, it's just
 * said quicker), then hide the easiest lines, clean-up first, then say what-ifs briefly (the
 * assumption and where it breaks). The break-in, chapter starts and other harder steps are never
 * touched. When the target stays out of reach, the result says why, in a sentence.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import { checkTarget } from './build'
import { editLineText, foldLines, hideLine } from './edits'
import { MAX_RUN } from './fold'
import { briefWhatIf } from './narrate'
import { TRIVIAL } from './segments'
import { formatClock } from './timecode'
import { timeline } from './timing'

export interface FitSuggestion {
  action: 'fold' | 'hide' | 'shorten'
  /** the lines to fold together, or the one line to hide or shorten */
  lineIds: number[]
  savesMs: number
  /** for 'shorten': the line's new words */
  text?: string
}

export interface FitResult {
  targetMs: number
  currentMs: number
  /** the total once every suggestion is applied */
  newTotalMs: number
  reached: boolean
  /** when the target is out of reach: why, in a sentence a presenter understands */
  why?: string
  suggestions: FitSuggestion[]
  /** the outline with every suggestion applied (the studio may offer it as one undoable step) */
  outline: Outline
}

/** Suggestions that bring the outline down to the target (or its own stored target). */
export function fitToTarget(outline: Outline, targetMs: number | undefined = outline.targetMs): FitResult {
  if (targetMs === undefined) throw new Error('no target length: pass one or set the outline\'s target first')
  const target = checkTarget(outline, targetMs)
  const currentMs = timeline(outline).totalMs
  let current = outline
  let total = currentMs
  const suggestions: FitSuggestion[] = []
  const apply = (action: FitSuggestion['action'], lineIds: number[], next: Outline, text?: string) => {
    const t = timeline(next).totalMs
    if (t >= total) return
    suggestions.push({ action, lineIds, savesMs: total - t, ...(text === undefined ? {} : { text }) })
    current = next
    total = t
  }

  // 1. Fold runs of easy lines, from the end of the solve backwards.
  for (const run of foldableRuns(current).reverse()) {
    if (total <= target) break
    apply('fold', run, foldLines(current, run))
  }
  // 2. Hide easy lines, latest first: the clean-up is what viewers miss least. A line just joined
  // stays: one suggestion list never both joins and hides a line.
  const joined = new Set(suggestions.map((s) => s.lineIds[0]))
  const hideable = current.lines.filter((l) => isEasy(current, l) && !isProtected(current, l) && !joined.has(l.id)).reverse()
  for (const line of hideable) {
    if (total <= target) break
    apply('hide', [line.id], hideLine(current, line.id))
  }
  // 3. Say what-ifs briefly, longest first: the assumption and where it breaks, the links left to the grid.
  const whatIfs = current.lines.filter((l) => isWhatIf(current, l) && !l.edited && !l.hidden).sort((a, b) => b.estMs - a.estMs)
  for (const line of whatIfs) {
    if (total <= target) break
    const text = briefWhatIf(current, line)
    if (text.length < line.text.length) apply('shorten', [line.id], editLineText(current, line.id, text), text)
  }
  const reached = total <= target
  return { targetMs: target, currentMs, newTotalMs: total, reached, ...(reached ? {} : { why: whyNot(current, target) }), suggestions, outline: current }
}

/** What keeps a fitted script over its target: the what-ifs, the other harder steps, the parts never cut. */
function whyNot(outline: Outline, target: number): string {
  const t = timeline(outline)
  const ms = new Map(t.lines.map((l) => [l.id, l.durationMs]))
  let whatIfMs = 0
  let hardMs = 0
  for (const line of outline.lines) {
    if (line.hidden) continue
    if (isWhatIf(outline, line)) whatIfMs += ms.get(line.id) ?? 0
    else if (line.kind === 'step' && !isEasy(outline, line)) hardMs += ms.get(line.id) ?? 0
  }
  if (whatIfMs >= target) return `What-ifs alone take ${formatClock(whatIfMs)}, more than the whole ${formatClock(target)} target, even said briefly.`
  const parts = [whatIfMs > 0 ? `what-ifs take ${formatClock(whatIfMs)}` : '', hardMs > 0 ? `other harder steps ${formatClock(hardMs)}` : ''].filter(Boolean)
  const kept = parts.length > 0 ? ` ${parts.join(' and ')},` : ''
  return `The shortest this script gets is ${formatClock(t.totalMs)}:${kept} and the introduction, the break-in and chapter starts are never cut.`
}

function isWhatIf(outline: Outline, line: OutlineLine): boolean {
  return line.kind === 'step' && line.steps.some((i) => outline.steps[i].facts.kind === 'contradiction')
}

function isEasy(outline: Outline, line: OutlineLine): boolean {
  return line.kind === 'step' && !line.hidden && line.steps.every((i) => TRIVIAL.has(outline.steps[i].technique))
}

/** The break-in and chapter starts carry the story; fitting never folds or hides them. */
function isProtected(outline: Outline, line: OutlineLine): boolean {
  const breakIn = outline.steps.findIndex((s) => s.placements.length > 0)
  return line.steps.includes(breakIn) || outline.chapters.some((c) => c.lineId === line.id)
}

/** Maximal groups of adjacent easy, unedited lines that a fold could merge (a chapter may only start the group). */
function foldableRuns(outline: Outline): number[][] {
  const runs: number[][] = []
  let run: OutlineLine[] = []
  const close = () => {
    if (run.length >= 2) runs.push(run.map((l) => l.id))
    run = []
  }
  for (const line of outline.lines) {
    const ok = isEasy(outline, line) && !line.edited && !line.steps.includes(outline.steps.findIndex((s) => s.placements.length > 0))
    const startsChapter = outline.chapters.some((c) => c.lineId === line.id)
    const steps = run.reduce((n, l) => n + l.steps.length, 0) + line.steps.length
    if (!ok || startsChapter || steps > MAX_RUN) close()
    if (ok) run.push(line)
  }
  close()
  return runs
}
