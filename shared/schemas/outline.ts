/**
 * Wire contract of a timed outline (the script, its timing inputs and chapters) and of the
 * edit operations the studio sends. Client, server and shared/script use these one copies;
 * the steps inside an outline follow the step contract in ./step.
 */
import { z } from 'zod'
import { puzzleAuthorSchema, puzzleTitleSchema } from './puzzle'
import { cellSchema, stepSchema } from './step'
import { text, webAddress } from './text'

export const namingStyleSchema = z.enum(['words', 'coords'])
export type NamingStyle = z.infer<typeof namingStyleSchema>

/** Words a minute a narration may be set to; outside this it is a typo, not a pace. */
export const PACE_MIN = 60
export const PACE_MAX = 400
const pace = z.number().min(PACE_MIN).max(PACE_MAX)

/** Longest text of one spoken line: about two minutes of speech, far more than a line ever needs. */
export const LINE_TEXT_MAX = 2000
const CHAPTER_TITLE_MAX = 100

// A grid has 729 candidates and every step removes at least one, so no path is longer; a line covers at
// least one step (intro and outro aside) and a chapter starts at a line. The bounds keep a 1 MB body of
// tiny items from making the checks below walk an unbounded list.
const STEPS_MAX = 1000
const LINES_MAX = STEPS_MAX + 2

const HOUR_MS = 3_600_000
/** Longest target length or aligned time an outline takes. */
export const DAY_MS = 24 * HOUR_MS

const outlineLineSchema = z.object({
  id: z.int().min(1),
  kind: z.enum(['intro', 'step', 'outro']),
  /** indices into `steps`, consecutive and ascending; empty for intro and outro */
  steps: z.array(z.int().min(0)).max(STEPS_MAX),
  text: text({ label: 'line text', max: LINE_TEXT_MAX, required: true }),
  /** true once a person changed the text: re-rendering (e.g. a new naming style) leaves it alone */
  edited: z.boolean(),
  hidden: z.boolean(),
  /** which of the technique's phrasings the text was rendered with, so re-rendering keeps it */
  phrasing: z.int().min(0),
  /** estimated duration, kept in step with text and pace by every edit; no spoken line runs an hour */
  estMs: z.int().min(0).max(HOUR_MS, 'a line can be at most an hour long'),
  /** start time in the aligned recording */
  alignedStartMs: z.int().min(0).max(DAY_MS, 'an aligned time must be within 24 hours').optional(),
})
export type OutlineLine = z.infer<typeof outlineLineSchema>

/**
 * The stretch of the recording that becomes the video: the editor cuts the recording at `inMs` (and at `outMs`
 * when set). Aligned starts stay in recording time; the timeline and every export count from the cut.
 */
const trimSchema = z
  .object({
    inMs: z.int().min(0).max(DAY_MS, 'a trim point must be within 24 hours'),
    outMs: z.int().min(1).max(DAY_MS, 'a trim point must be within 24 hours').optional(),
  })
  .refine((t) => t.outMs === undefined || t.outMs > t.inMs, { message: 'the video must end after it starts (out after in)' })

const chapterSchema = z.object({
  /** the line the chapter starts at */
  lineId: z.int().min(1),
  title: text({ label: 'chapter title', max: CHAPTER_TITLE_MAX, required: true, trim: true }),
  edited: z.boolean(),
})
export type Chapter = z.infer<typeof chapterSchema>

/** The part of an outline a person edits in the studio; the rest (steps, puzzle, status, title) comes from the engine and the puzzle. */
const scriptShape = {
  pace,
  names: namingStyleSchema,
  targetMs: z.int().min(1).max(DAY_MS, 'a target length must be under 24 hours').optional(),
  trim: trimSchema.optional(),
  lines: z.array(outlineLineSchema).min(1).max(LINES_MAX),
  chapters: z.array(chapterSchema).min(1).max(LINES_MAX),
}
export const SCRIPT_KEYS = ['pace', 'names', 'targetMs', 'trim', 'lines', 'chapters'] as const

/**
 * What a save sends: the script alone. Checks that need no steps run here; whether the lines cover
 * every step is checked by whoever knows how many there are (`scriptProblems` with the step count).
 */
export const outlineScriptSchema = z
  .object(scriptShape)
  // only on a script whose every field passed: the checks read lines[0] and walk the lists
  .superRefine((s, ctx) => {
    for (const message of scriptProblems(s)) ctx.addIssue({ code: 'custom', message })
  }, { when: (payload) => payload.issues.length === 0 })
export type OutlineScript = z.infer<typeof outlineScriptSchema>

export const outlineSchema = z
  .object({
    version: z.literal(1),
    title: puzzleTitleSchema,
    author: puzzleAuthorSchema.optional(),
    link: webAddress('link').optional(),
    // in the order documents have always been written in
    pace: scriptShape.pace,
    names: scriptShape.names,
    targetMs: scriptShape.targetMs,
    trim: scriptShape.trim,
    status: z.enum(['solved', 'stuck']),
    puzzle: z.object({
      givens: z.string().regex(/^[1-9.]{81}$/, 'givens must be 81 characters, 1-9 or "."'),
      thermometers: z.array(z.array(cellSchema).min(2).max(9)).max(81),
    }),
    steps: z.array(stepSchema).min(1).max(STEPS_MAX),
    lines: scriptShape.lines,
    chapters: scriptShape.chapters,
  })
  // only on an outline whose every field passed: the checks read lines[0] and walk the lists
  .superRefine((o, ctx) => {
    for (const message of scriptProblems(o, o.steps.length)) ctx.addIssue({ code: 'custom', message })
  }, { when: (payload) => payload.issues.length === 0 })
export type Outline = z.infer<typeof outlineSchema>

/** An outline without its script: the part the engine and the puzzle give, which saves never touch. */
export type OutlineBase = Omit<Outline, (typeof SCRIPT_KEYS)[number]>

/** The editable part of an outline, as a save sends it. */
export function scriptOf(outline: Outline): OutlineScript {
  const script: Partial<Record<keyof OutlineScript, unknown>> = {}
  for (const key of SCRIPT_KEYS) if (outline[key] !== undefined) script[key] = outline[key]
  return script as OutlineScript
}

/** How many engine steps the lines cover: the step count of the outline they belong to, when they are in order. */
export function stepsCoveredBy(script: Pick<OutlineScript, 'lines'>): number {
  return script.lines.reduce((sum, line) => sum + line.steps.length, 0)
}

/**
 * Why a script can't stand (empty when it can): line ids, kinds and step order, chapters starting at lines in
 * order, aligned times ascending; with `stepCount`, also that the lines cover exactly that many steps.
 * Server and client run this one check: the server against the stored step count, without the steps.
 */
export function scriptProblems(s: Pick<OutlineScript, 'lines' | 'chapters'>, stepCount?: number): string[] {
  const problems: string[] = []
  const issue = (message: string) => problems.push(message)
  const ids = new Set<number>()
  let nextStep = 0
  s.lines.forEach((line, i) => {
    if (ids.has(line.id)) issue(`line ${line.id} appears twice`)
    ids.add(line.id)
    if (line.kind === 'intro' && i !== 0) issue('the intro must be the first line')
    if (line.kind === 'outro' && i !== s.lines.length - 1) issue('the outro must be the last line')
    if (line.kind !== 'step' && line.steps.length > 0) issue(`line ${line.id} is an ${line.kind} and covers no steps`)
    if (line.kind === 'step' && line.steps.length === 0) issue(`line ${line.id} covers no steps`)
    for (const step of line.steps) {
      if (step !== nextStep) {
        issue(`line ${line.id} covers step ${step + 1}, expected step ${nextStep + 1}`)
        return
      }
      nextStep++
    }
  })
  if (stepCount !== undefined && nextStep !== stepCount) issue(`the lines cover ${nextStep} of ${stepCount} steps`)
  const seen = new Set<number>()
  for (const ch of s.chapters) {
    if (!ids.has(ch.lineId)) issue(`chapter "${ch.title}" starts at line ${ch.lineId}, which does not exist`)
    if (seen.has(ch.lineId)) issue(`two chapters start at line ${ch.lineId}`)
    seen.add(ch.lineId)
  }
  if (s.chapters.length > 0 && s.chapters[0].lineId !== s.lines[0].id) issue('the first chapter must start at the first line')
  const order = new Map(s.lines.map((l, i) => [l.id, i]))
  for (let i = 1; i < s.chapters.length; i++) {
    if ((order.get(s.chapters[i].lineId) ?? -1) <= (order.get(s.chapters[i - 1].lineId) ?? -1)) {
      issue('chapters must be in line order')
      break
    }
  }
  let lastAligned = -1
  for (const line of s.lines) {
    if (line.alignedStartMs === undefined) continue
    if (line.alignedStartMs < lastAligned) issue(`line ${line.id} is aligned before the line above it`)
    lastAligned = line.alignedStartMs
  }
  return problems
}

const lineId = z.int().min(1)
// as typed: the edits themselves tidy white space and say what is wrong with an empty text or title
const typedLineText = text({ label: 'line text', max: LINE_TEXT_MAX })
const typedChapterTitle = text({ label: 'chapter title', max: CHAPTER_TITLE_MAX })

/** One edit the studio can make; `applyEdit` in shared/script runs it. */
export const outlineEditSchema = z.discriminatedUnion('op', [
  z.object({ op: z.literal('editLineText'), lineId, text: typedLineText }),
  z.object({ op: z.literal('revertLineText'), lineId }),
  z.object({ op: z.literal('foldLines'), lineIds: z.array(lineId).min(2).max(LINES_MAX) }),
  z.object({ op: z.literal('splitLine'), lineId }),
  z.object({ op: z.literal('hideLine'), lineId }),
  z.object({ op: z.literal('showLine'), lineId }),
  z.object({ op: z.literal('startChapterAt'), lineId, title: typedChapterTitle.optional() }),
  z.object({ op: z.literal('renameChapter'), lineId, title: typedChapterTitle }),
  z.object({ op: z.literal('removeChapter'), lineId }),
  z.object({ op: z.literal('setPace'), pace: z.number() }),
  z.object({ op: z.literal('setNames'), names: namingStyleSchema }),
  z.object({ op: z.literal('setTarget'), targetMs: z.number().nullable() }),
  z.object({ op: z.literal('alignLine'), lineId, startMs: z.number().nullable() }),
  z.object({ op: z.literal('setTrim'), inMs: z.number().nullable(), outMs: z.number().nullable() }),
])
export type OutlineEdit = z.infer<typeof outlineEditSchema>
