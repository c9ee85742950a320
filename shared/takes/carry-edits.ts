/**
 * "Find the path again": a fresh outline of the changed puzzle keeps what a person did to the old take
 * wherever the old steps still happen. A step still happens when the fresh path has a step with the same
 * technique, the same placements and the same eliminations (cells and digits); a line carries over when its
 * whole run of steps appears in the fresh path, in order, after the run the previous line matched.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import type { Step } from '../schemas/step'
import { editLineText, foldLines, hideLine, renameChapter, startChapterAt } from '../script/edits'

interface CarriedEdits {
  outline: Outline
  /** lines whose words, folding or hiding were kept */
  kept: number
  /** edited or hidden lines of the old take whose steps the fresh path no longer has, in order */
  lost: OutlineLine[]
}

/** The identity of a step for matching: technique, placements and eliminations, order-free. */
export function stepKey(step: Step): string {
  const placements = step.placements.map((p) => `${p.cell}=${p.digit}`).sort()
  const eliminations = step.eliminations.map((e) => `${e.cell}-${[...e.digits].sort().join('')}`).sort()
  return `${step.technique}|${placements.join(',')}|${eliminations.join(',')}`
}

/** `fresh` (a new outline of the changed puzzle, as the engine made it) with the people's work on `old` carried over. */
export function carryEdits(old: Outline, fresh: Outline): CarriedEdits {
  const freshKeys = fresh.steps.map(stepKey)
  let outline: Outline = { ...fresh, ...(old.targetMs === undefined ? {} : { targetMs: old.targetMs }) }
  let kept = 0
  const lost: OutlineLine[] = []
  let searchFrom = 0
  for (const line of old.lines) {
    const touched = line.edited || line.hidden || startsEditedChapter(old, line)
    if (!touched) continue
    const target = line.kind === 'step' ? matchRun(outline, old, line, freshKeys, searchFrom) : endLine(outline, line.kind)
    const carried = target && carryLine(outline, old, line, target)
    if (!carried) {
      lost.push(line)
      continue
    }
    outline = carried.outline
    kept++
    if (line.kind === 'step') searchFrom = target.lastStep + 1
  }
  return { outline, kept, lost }
}

interface Target {
  /** the fresh lines covering the matched run, in order */
  lineIds: number[]
  lastStep: number
}

function matchRun(outline: Outline, old: Outline, line: OutlineLine, freshKeys: string[], from: number): Target | undefined {
  const run = line.steps.map((i) => stepKey(old.steps[i]))
  for (let start = from; start + run.length <= freshKeys.length; start++) {
    if (!run.every((key, k) => freshKeys[start + k] === key)) continue
    const last = start + run.length - 1
    const covering = outline.lines.filter((l) => l.steps.some((s) => s >= start && s <= last))
    // the run must be whole lines of the fresh outline: no line may reach outside it
    if (covering.every((l) => l.steps[0] >= start && l.steps[l.steps.length - 1] <= last)) {
      return { lineIds: covering.map((l) => l.id), lastStep: last }
    }
  }
  return undefined
}

function endLine(outline: Outline, kind: 'intro' | 'outro' | 'step'): Target | undefined {
  const line = outline.lines.find((l) => l.kind === kind)
  return line && { lineIds: [line.id], lastStep: -1 }
}

function startsEditedChapter(old: Outline, line: OutlineLine): boolean {
  return old.chapters.some((c) => c.lineId === line.id && c.edited)
}

/** The fresh outline with one old line's work applied to its matched lines; undefined when an edit can't stand there. */
function carryLine(outline: Outline, old: Outline, line: OutlineLine, target: Target): { outline: Outline } | undefined {
  try {
    let next = target.lineIds.length > 1 ? foldLines(outline, target.lineIds) : outline
    const lineId = target.lineIds[0]
    if (line.edited) next = editLineText(next, lineId, line.text)
    if (line.hidden && !next.lines.find((l) => l.id === lineId)?.hidden) next = hideLine(next, lineId)
    const chapter = old.chapters.find((c) => c.lineId === line.id && c.edited)
    if (chapter) {
      next = next.chapters.some((c) => c.lineId === lineId) ? renameChapter(next, lineId, chapter.title) : startChapterAt(next, lineId, chapter.title)
    }
    return { outline: next }
  } catch {
    // e.g. folding across a chapter the fresh outline starts, or hiding its last showing line: the line is reported lost
    return undefined
  }
}
