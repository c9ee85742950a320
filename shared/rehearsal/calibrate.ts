/**
 * A presenter's own timing from their rehearsals. Each timed line is one equation of the timing model
 *   ms = words × msPerWord + placements × placementMs + marks × markMs + whatIfMoves × whatIfMoveMs + pauseMs
 * and the five unknowns are fitted over all their lines by Huber-weighted least squares, so a line where they
 * stopped to think (but not long enough to count as a break) doesn't drag the rest.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import { PACE_MAX, PACE_MIN } from '../schemas/outline'
import type { LineWork } from '../schemas/rehearsal'
import { lineActions, TIMING } from '../script/timing'
import { wordCount } from '../script/words'
import { huberFit } from './least-squares'

/** The timing model's numbers for one presenter. */
export interface TimingModel {
  /** words a minute */
  pace: number
  placementMs: number
  markMs: number
  whatIfMoveMs: number
  pauseMs: number
}

/** The model before any rehearsal: the script's constants (shared/script/timing.ts), which count no time for what-if moves. */
export const DEFAULT_MODEL: TimingModel = Object.freeze({
  pace: TIMING.defaultPace,
  placementMs: TIMING.placementMs,
  markMs: TIMING.markMs,
  whatIfMoveMs: 0,
  pauseMs: TIMING.pauseMs,
})

/** Fewer timed lines than this say too little about a presenter to replace the constants. */
const MIN_CALIBRATION_LINES = 5

export interface TimedWork {
  work: LineWork
  ms: number
}

/** What a line asks of the presenter: its words, and the moves on the grid its steps make. */
export function lineWork(outline: Pick<Outline, 'steps'>, line: Pick<OutlineLine, 'steps' | 'text'>): LineWork {
  const { placements, marks } = lineActions(outline, line)
  let whatIfMoves = 0
  for (const i of line.steps) {
    const facts = outline.steps[i].facts
    if (facts?.kind === 'contradiction') whatIfMoves += facts.chain.length
  }
  return { words: wordCount(line.text), placements, marks, whatIfMoves }
}

/** A line's duration under a presenter's model, in whole milliseconds. */
export function estimateWith(model: TimingModel, work: LineWork): number {
  return Math.round(
    (work.words / model.pace) * 60_000 + work.placements * model.placementMs + work.marks * model.markMs + work.whatIfMoves * model.whatIfMoveMs + model.pauseMs,
  )
}

type ActionKey = 'placementMs' | 'markMs' | 'whatIfMoveMs' | 'pauseMs'
interface Column {
  key: 'msPerWord' | ActionKey
  of: (w: LineWork) => number
}
const COLUMNS: readonly Column[] = [
  { key: 'msPerWord', of: (w) => w.words },
  { key: 'placementMs', of: (w) => w.placements },
  { key: 'markMs', of: (w) => w.marks },
  { key: 'whatIfMoveMs', of: (w) => w.whatIfMoves },
  { key: 'pauseMs', of: () => 1 },
]

/**
 * Fits a presenter's model to their timed lines (breaks already left out); null with fewer than
 * MIN_CALIBRATION_LINES lines or when the words can't be told apart from the rest. An action the lines never
 * show (no what-if in any run) keeps the default; one the fit makes negative is held at 0 and the rest fitted
 * again; the pace is kept within the take's allowed 60–400 words a minute.
 */
export function calibrate(lines: readonly TimedWork[]): TimingModel | null {
  if (lines.length < MIN_CALIBRATION_LINES) return null
  const fixed = new Map<Column['key'], number>()
  for (const c of COLUMNS) if (c.key !== 'msPerWord' && c.key !== 'pauseMs' && lines.every((l) => c.of(l.work) === 0)) fixed.set(c.key, DEFAULT_MODEL[c.key])

  for (;;) {
    const free = COLUMNS.filter((c) => !fixed.has(c.key))
    const x = lines.map((l) => free.map((c) => c.of(l.work)))
    // what the fixed parts of the model explain comes off the measured time first
    const y = lines.map((l) => l.ms - [...fixed].reduce((sum, [key, v]) => sum + v * COLUMNS.find((c) => c.key === key)!.of(l.work), 0))
    const fit = huberFit(x, y)
    if (!fit) {
      // columns that move together (every line with a mark also places a digit): the last action joins the fixed ones
      const last = free.filter((c) => c.key !== 'msPerWord' && c.key !== 'pauseMs').at(-1)
      if (!last) return null
      fixed.set(last.key, DEFAULT_MODEL[last.key as ActionKey])
      continue
    }
    const values = new Map(free.map((c, j) => [c.key, fit.beta[j]]))
    const negative = free.find((c) => c.key !== 'msPerWord' && values.get(c.key)! < 0)
    if (negative) {
      fixed.set(negative.key, 0)
      continue
    }
    const get = (key: ActionKey) => values.get(key) ?? fixed.get(key)!
    const msPerWord = values.get('msPerWord')!
    const pace = msPerWord > 0 ? 60_000 / msPerWord : PACE_MAX
    return {
      pace: Math.min(PACE_MAX, Math.max(PACE_MIN, pace)),
      placementMs: get('placementMs'),
      markMs: get('markMs'),
      whatIfMoveMs: get('whatIfMoveMs'),
      pauseMs: get('pauseMs'),
    }
  }
}
