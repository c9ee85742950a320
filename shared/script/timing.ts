/**
 * The timing model: a line lasts as long as its words at the presenter's pace, plus the time
 * to put digits and pencil marks in, plus a short pause. Start times and totals are derived
 * here, never stored, so an edit can't leave them stale.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import { PACE_MAX, PACE_MIN } from '../schemas/outline'
import { wordCount } from './words'

/**
 * Constants of the model (our own estimates, to be calibrated by rehearsals; see docs/script-and-timing.md).
 * A digit is typed and watched landing in about a second; a pencil mark is a quick click;
 * the pause lets the viewer look at the grid before the next thought.
 */
export const TIMING = Object.freeze({
  /** words a minute when nothing else is known; presenters talk at about 150–190 (common practice) */
  defaultPace: 160,
  placementMs: 1000,
  markMs: 500,
  pauseMs: 800,
})

export interface LineActions {
  placements: number
  /** cells newly pencil-marked plus cells that lose candidates */
  marks: number
}

export function checkPace(pace: unknown): number {
  if (typeof pace !== 'number' || !Number.isFinite(pace)) throw new Error(`pace must be a number of words a minute (got ${String(pace)})`)
  if (pace < PACE_MIN || pace > PACE_MAX) {
    throw new Error(`pace must be between ${PACE_MIN} and ${PACE_MAX} words a minute (got ${pace})`)
  }
  return pace
}

/** What a presenter does with the mouse during a line's steps. */
export function lineActions(outline: Pick<Outline, 'steps'>, line: Pick<OutlineLine, 'steps'>): LineActions {
  let placements = 0
  let marks = 0
  for (const i of line.steps) {
    const step = outline.steps[i]
    const before = new Set(i > 0 ? outline.steps[i - 1].marks : [])
    placements += step.placements.length
    marks += step.marks.filter((c) => !before.has(c)).length
    marks += step.eliminations.filter((e) => e.digits.length > 0).length
    const f = step.facts
    // A what-if is played out on the grid: the assumed digit and every link's move, then undone.
    if (f.kind === 'contradiction') {
      placements += 1 + f.chain.filter((l) => l.kind === 'place').length
      marks += f.chain.filter((l) => l.kind === 'eliminate').length
    }
    // An either-way step plays out each side the same way, one after the other.
    if (f.kind === 'either-way') {
      for (const side of f.sides) {
        placements += 1 + side.chain.filter((l) => l.kind === 'place').length
        marks += side.chain.filter((l) => l.kind === 'eliminate').length
      }
    }
  }
  return { placements, marks }
}

/** Estimated duration of a spoken line, in whole milliseconds. */
export function estimateMs(text: string, pace: number, actions: LineActions): number {
  const speech = (wordCount(text) / checkPace(pace)) * 60_000
  return Math.round(speech + actions.placements * TIMING.placementMs + actions.marks * TIMING.markMs + TIMING.pauseMs)
}

export interface TimedLine {
  id: number
  kind: OutlineLine['kind']
  startMs: number
  durationMs: number
  endMs: number
  hidden: boolean
  /** true when the start comes from an aligned recording */
  aligned: boolean
}

interface TimedChapter {
  lineId: number
  title: string
  startMs: number
  endMs: number
}

export interface Timeline {
  lines: TimedLine[]
  chapters: TimedChapter[]
  totalMs: number
  /** where the times come from: all estimates, all aligned, or some of each */
  source: 'estimated' | 'aligned' | 'mixed'
}

/**
 * Start and duration of every line, and the total. Hidden lines take no time. Aligned starts
 * win over estimates; an estimated line that would run past the next aligned start is cut short.
 * With a trim, times count from the cut-in point (what the published video shows), and the video
 * ends at the cut-out point.
 */
export function timeline(outline: Pick<Outline, 'lines' | 'chapters' | 'trim'>): Timeline {
  const visible = outline.lines.filter((l) => !l.hidden)
  const cutIn = outline.trim?.inMs ?? 0
  const videoStart = (aligned: number) => Math.max(0, aligned - cutIn)
  const starts: number[] = []
  visible.forEach((l, i) => {
    starts.push(l.alignedStartMs !== undefined ? videoStart(l.alignedStartMs) : i === 0 ? 0 : starts[i - 1] + visible[i - 1].estMs)
  })
  // Estimated starts must not pass a later aligned one, or cues would run backwards.
  for (let i = visible.length - 2; i >= 0; i--) {
    if (visible[i].alignedStartMs === undefined && starts[i] > starts[i + 1]) starts[i] = starts[i + 1]
  }
  const cutOut = outline.trim?.outMs
  const totalMs =
    cutOut !== undefined ? cutOut - cutIn : visible.length === 0 ? 0 : starts[visible.length - 1] + visible[visible.length - 1].estMs
  const byId = new Map<number, { start: number; duration: number }>()
  visible.forEach((l, i) => {
    const start = Math.min(starts[i], totalMs)
    const end = i + 1 < visible.length ? Math.min(starts[i + 1], totalMs) : cutOut !== undefined ? totalMs : start + l.estMs
    byId.set(l.id, { start, duration: end - start })
  })

  const lines: TimedLine[] = []
  // A hidden line sits, with no length, where the next visible one starts.
  let pendingHidden: number[] = []
  outline.lines.forEach((l) => {
    const t = byId.get(l.id)
    if (!t) {
      pendingHidden.push(lines.length)
      lines.push({ id: l.id, kind: l.kind, startMs: 0, durationMs: 0, endMs: 0, hidden: true, aligned: false })
      return
    }
    for (const k of pendingHidden) lines[k] = { ...lines[k], startMs: t.start, endMs: t.start }
    pendingHidden = []
    lines.push({
      id: l.id,
      kind: l.kind,
      startMs: t.start,
      durationMs: t.duration,
      endMs: t.start + t.duration,
      hidden: false,
      aligned: l.alignedStartMs !== undefined,
    })
  })
  for (const k of pendingHidden) lines[k] = { ...lines[k], startMs: totalMs, endMs: totalMs }

  const startOf = new Map(lines.map((l) => [l.id, l.startMs]))
  const chapters = outline.chapters.map((c, i, all) => ({
    lineId: c.lineId,
    title: c.title,
    startMs: startOf.get(c.lineId) ?? 0,
    endMs: i + 1 < all.length ? (startOf.get(all[i + 1].lineId) ?? totalMs) : totalMs,
  }))
  const alignedCount = visible.filter((l) => l.alignedStartMs !== undefined).length
  const source = alignedCount === 0 ? 'estimated' : alignedCount === visible.length ? 'aligned' : 'mixed'
  return { lines, chapters, totalMs, source }
}
