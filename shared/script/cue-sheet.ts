/**
 * Rows of the printable cue sheet: what the presenter holds while recording.
 */
import type { Cell } from '../engine/types'
import { gridString } from '../grid'
import type { Outline } from '../schemas/outline'
import { digitsAfter } from './replay-digits'
import { formatClock } from './timecode'
import { timeline } from './timing'

export interface CueSheetRow {
  /** 1-based among the lines that are shown */
  number: number
  lineId: number
  /** engine step numbers, 1-based: "12", "12–15", or "" for intro and outro */
  steps: string
  /** "m:ss" */
  time: string
  startMs: number
  /** set on the row a chapter starts at */
  chapter?: string
  text: string
  /** the grid before the line, 81 characters, '.' empty: for an optional thumbnail */
  grid: string
  /** cells to highlight on the thumbnail */
  focus: Cell[]
}

export function cueSheetRows(outline: Outline): CueSheetRow[] {
  const times = new Map(timeline(outline).lines.map((t) => [t.id, t]))
  const chapters = new Map(outline.chapters.map((c) => [c.lineId, c.title]))
  const rows: CueSheetRow[] = []
  let pendingChapter: string | undefined
  for (const line of outline.lines) {
    const chapter = chapters.get(line.id)
    if (line.hidden) {
      // A chapter starting on a hidden line shows on the next row that is printed.
      pendingChapter = pendingChapter ?? chapter
      continue
    }
    const t = times.get(line.id)
    const first = line.steps[0]
    const last = line.steps[line.steps.length - 1]
    const before = first ?? (line.kind === 'intro' ? 0 : outline.steps.length)
    rows.push({
      number: rows.length + 1,
      lineId: line.id,
      steps: first === undefined ? '' : first === last ? `${first + 1}` : `${first + 1}–${last + 1}`,
      time: formatClock(t?.startMs ?? 0),
      startMs: t?.startMs ?? 0,
      ...((chapter ?? pendingChapter) !== undefined ? { chapter: chapter ?? pendingChapter } : {}),
      text: line.text,
      grid: gridString(digitsAfter(outline.puzzle.givens, outline.steps, before)),
      focus: line.steps.flatMap((i) => outline.steps[i].focus),
    })
    pendingChapter = undefined
  }
  return rows
}
