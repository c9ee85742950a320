/**
 * Fitting a script to a target length: fold runs of easy lines first (nothing is lost, it's just
 * said quicker), then hide the easiest lines, clean-up first. The break-in, chapter starts and
 * anything harder than a single are never touched.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import { checkTarget } from './build'
import { foldLines, hideLine } from './edits'
import { MAX_RUN } from './fold'
import { TRIVIAL } from './segments'
import { timeline } from './timing'

export interface FitSuggestion {
  action: 'fold' | 'hide'
  /** the lines to fold together, or the one line to hide */
  lineIds: number[]
  savesMs: number
}

export interface FitResult {
  targetMs: number
  currentMs: number
  /** the total once every suggestion is applied */
  newTotalMs: number
  reached: boolean
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
  const apply = (action: FitSuggestion['action'], lineIds: number[], next: Outline) => {
    const t = timeline(next).totalMs
    if (t >= total) return
    suggestions.push({ action, lineIds, savesMs: total - t })
    current = next
    total = t
  }

  // 1. Fold runs of easy lines, from the end of the solve backwards.
  for (const run of foldableRuns(current).reverse()) {
    if (total <= target) break
    apply('fold', run, foldLines(current, run))
  }
  // 2. Hide easy lines, latest first: the clean-up is what viewers miss least.
  const hideable = current.lines.filter((l) => isEasy(current, l) && !isProtected(current, l)).reverse()
  for (const line of hideable) {
    if (total <= target) break
    apply('hide', [line.id], hideLine(current, line.id))
  }
  return { targetMs: target, currentMs, newTotalMs: total, reached: total <= target, suggestions, outline: current }
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
