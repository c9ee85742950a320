/**
 * Wire contract of rehearsals: timed runs through a take, the presenter's calibrated timing, and the
 * read-aloud preview. Routes (under /api/channels/:channelId/outlines/:outlineId), each with the action it needs:
 *   GET    /rehearsals              rehearsal.read  → RehearsalList (runs newest first, and the take's calibration)
 *   POST   /rehearsals              rehearsal.run   body RehearsalCreate → RehearsalRun (201)
 *   DELETE /rehearsals/:rehearsalId rehearsal.run   → 204
 *   POST   /read-aloud              rehearsal.run   body ReadAloudRequest → a short WAV preview
 */
import { z } from 'zod'
import { PACE_MAX, PACE_MIN } from './outline'
import { text } from './text'

/** A line that took longer than this, advance to advance, was a break (a drink, a phone call), not speech. */
export const BREAK_MS = 60_000
/** Longest a single line may be recorded as: a run left open overnight is a mistake, not a measurement. */
const LINE_MAX_MS = 6 * 60 * 60 * 1000

const timedLineSchema = z.object({
  lineId: z.int().min(0),
  ms: z.int().min(0).max(LINE_MAX_MS, { message: 'a line can be timed at most six hours' }),
})

export const rehearsalCreateSchema = z.object({
  name: text({ label: 'name', max: 80, required: 'Give the run a name', trim: true }),
  /** the lines in the order they were said, each timed from its advance to the next */
  lines: z.array(timedLineSchema).min(1, 'a run times at least one line').max(2000),
})
export type RehearsalCreate = z.infer<typeof rehearsalCreateSchema>

/** What a line asked of the presenter, counted from the take when the run was saved: the calibration's inputs. */
const lineWorkSchema = z.object({
  words: z.int().min(0),
  placements: z.int().min(0),
  /** cells newly pencil-marked plus cells that lose candidates (as the timing model counts them) */
  marks: z.int().min(0),
  /** links of what-if chains said in the line */
  whatIfMoves: z.int().min(0),
})
export type LineWork = z.infer<typeof lineWorkSchema>

const rehearsedLineSchema = timedLineSchema.extend({
  /** longer than BREAK_MS: left out of speech totals and of the calibration */
  isBreak: z.boolean(),
  work: lineWorkSchema,
})
export type RehearsedLine = z.infer<typeof rehearsedLineSchema>

export const rehearsalRunSchema = z.object({
  id: z.int(),
  outlineId: z.int(),
  name: z.string(),
  presenterId: z.int().nullable(),
  presenterName: z.string(),
  lines: z.array(rehearsedLineSchema),
  /** the run's time without its breaks */
  speechMs: z.int(),
  createdAt: z.iso.datetime({ offset: true }),
})
export type RehearsalRun = z.infer<typeof rehearsalRunSchema>

/** A presenter's own timing, fitted from their saved runs; the model's constants where a run shows nothing of one. */
const calibrationSchema = z.object({
  presenterId: z.int(),
  presenterName: z.string(),
  /** words a minute */
  pace: z.number().min(PACE_MIN).max(PACE_MAX),
  placementMs: z.number().min(0),
  markMs: z.number().min(0),
  whatIfMoveMs: z.number().min(0),
  pauseMs: z.number().min(0),
  /** how many timed lines (breaks left out) the fit used */
  lineCount: z.int(),
})
export type Calibration = z.infer<typeof calibrationSchema>

export const rehearsalListSchema = z.object({
  runs: z.array(rehearsalRunSchema),
  /** for the take's presenter (who saved its latest run; for a take without runs, the caller); null until they have enough lines */
  calibration: calibrationSchema.nullable(),
})
export type RehearsalList = z.infer<typeof rehearsalListSchema>

/** At most this many lines go into one preview: it is for hearing the rhythm, not for the whole video. */
export const READ_ALOUD_MAX_LINES = 12

export const readAloudSchema = z.object({
  /** the first and last line of the stretch, in the take's order (the same id twice for one line) */
  fromLineId: z.int().min(0),
  toLineId: z.int().min(0),
  /** words a minute; the take's presenter's calibrated pace (or the take's own) when absent */
  pace: z.number().min(PACE_MIN).max(PACE_MAX).optional(),
})
export type ReadAloudRequest = z.infer<typeof readAloudSchema>
