/**
 * Wire contract of the studio API: puzzles under a channel and their outlines (several takes each).
 * Routes (all JSON, all under /api/channels/:channelId), each with the action (shared/permissions.ts) it needs:
 *   GET    /puzzles                           puzzle.read     → PuzzleSummary[]
 *   POST   /puzzles                           puzzle.edit     → PuzzleRecord (201)
 *   GET    /puzzles/:puzzleId                 puzzle.read     → PuzzleRecord
 *   PUT    /puzzles/:puzzleId                 puzzle.edit     body PuzzleUpdate → PuzzleRecord; stale version → 409 StaleBody
 *   DELETE /puzzles/:puzzleId                 puzzle.edit     → 204
 *   GET    /puzzles/:puzzleId/outlines        outline.read    → OutlineSummary[]
 *   POST   /puzzles/:puzzleId/outlines        outline.create  body OutlineCreate → OutlineRecord (201); engine runs in a worker pool
 *   GET    /outlines/:outlineId               outline.read    → OutlineRecord
 *   PATCH  /outlines/:outlineId               outline.edit    body OutlineSave → OutlineSummary; stale version → 409 StaleBody (whole record)
 *   GET    /outlines/:outlineId/cue-sheet.pdf outline.read    ?thumbnails=1 → the printable cue sheet (PDF)
 *   POST   /outlines/:outlineId/duplicate     outline.create  → OutlineRecord (201)
 *   POST   /outlines/:outlineId/refresh       outline.create  body OutlineRefresh → OutlineRefreshed: the path found again on the puzzle as it is now
 *   DELETE /outlines/:outlineId               outline.create  → 204
 */
import { z } from 'zod'
import { puzzleFileShape } from './puzzle'
import { namingStyleSchema, outlineSchema, outlineScriptSchema, PACE_MAX, PACE_MIN } from './outline'
import { text, webAddress } from './text'

/** What the puzzle form sends. Structure only: a draft may still be invalid or not yet unique. */
export const puzzleDraftSchema = puzzleFileShape.extend({
  givens: z.string().regex(/^[1-9.0]{81}$/, "givens must be 81 characters, each 1-9 or '.'"),
  thermometers: z.array(z.array(z.string().regex(/^[rR][1-9][cC][1-9]$/, 'cells are named like r3c4')).max(81)).max(81).default([]),
  link: webAddress('link').optional(),
  publishedOn: z.union([z.iso.date({ message: 'publication date must be YYYY-MM-DD' }), z.literal('')]).optional(),
  notes: text({ label: 'notes', max: 5000 }).optional(),
})
export type PuzzleDraft = z.infer<typeof puzzleDraftSchema>

export const puzzleUpdateSchema = puzzleDraftSchema.extend({ version: z.int().min(1) })
export type PuzzleUpdate = z.infer<typeof puzzleUpdateSchema>

/** The engine's verdict on the saved givens and thermometers. */
const puzzleCheckSchema = z.enum(['unique', 'no-solution', 'multiple-solutions', 'invalid'])
export type PuzzleCheck = z.infer<typeof puzzleCheckSchema>

export const puzzleSummarySchema = z.object({
  id: z.int(),
  channelId: z.int(),
  title: z.string(),
  author: z.string(),
  check: puzzleCheckSchema,
  outlineCount: z.int(),
  /** takes solved on an earlier version of the grid: they no longer show the puzzle as it is */
  staleOutlineCount: z.int(),
  version: z.int(),
  updatedAt: z.string(),
})
export type PuzzleSummary = z.infer<typeof puzzleSummarySchema>

export const puzzleRecordSchema = puzzleSummarySchema.extend({
  givens: z.string(),
  thermometers: z.array(z.array(z.string())),
  link: z.string(),
  publishedOn: z.string(),
  notes: z.string(),
  /** the engine's messages when check is not 'unique' */
  problems: z.array(z.object({ code: z.string(), message: z.string(), cells: z.array(z.int()) })),
})
export type PuzzleRecord = z.infer<typeof puzzleRecordSchema>

/** A take's name, e.g. "Take 2" or "short version". */
const takeName = text({ label: 'name', max: 100, required: true, trim: true })

export const outlineCreateSchema = z.object({
  name: takeName.optional(),
  pace: z.number().min(PACE_MIN, `pace must be at least ${PACE_MIN} words a minute`).max(PACE_MAX, `pace must be at most ${PACE_MAX} words a minute`).optional(),
  names: namingStyleSchema.optional(),
})
export type OutlineCreate = z.infer<typeof outlineCreateSchema>

const countSchema = z.int().min(0)

/** What changed in the puzzle's grid since a take was made from it (shared/takes/puzzle-changes). */
const puzzleChangesSchema = z.object({
  givens: z.object({ added: countSchema, removed: countSchema, changed: countSchema }),
  thermometers: z.object({ added: countSchema, removed: countSchema }),
})

export const outlineSummarySchema = z.object({
  id: z.int(),
  puzzleId: z.int(),
  name: z.string(),
  status: z.enum(['solved', 'stuck']),
  stepCount: z.int(),
  totalMs: z.int(),
  version: z.int(),
  /** the puzzle version the take was solved on */
  puzzleVersion: z.int(),
  /**
   * On reads (the list and the take): how the puzzle's grid differs from the one the take was solved on, null
   * when it doesn't (the take is current). A save's answer leaves it out: a save doesn't change it.
   */
  puzzleChanges: puzzleChangesSchema.nullable().optional(),
  /** who saved last (null once they are gone), so a person shown a newer copy knows whose it is */
  savedBy: z.object({ id: z.int(), name: z.string() }).nullable(),
  updatedAt: z.string(),
})
export type OutlineSummary = z.infer<typeof outlineSummarySchema>

export const outlineRecordSchema = outlineSummarySchema.extend({
  /** the whole script document: engine steps, lines, chapters, pace (see ./outline) */
  outline: outlineSchema,
})
export type OutlineRecord = z.infer<typeof outlineRecordSchema>

export const outlineSaveSchema = z.object({
  /** the version the client read; a different current version answers 409 */
  version: z.int().min(1),
  name: takeName.optional(),
  /** only what a person edits: the client already holds the rest, and the server keeps it as stored */
  script: outlineScriptSchema,
})
export type OutlineSave = z.infer<typeof outlineSaveSchema>

/** "Find the path again": the version read, so a refresh never overwrites a save it didn't see. */
export const outlineRefreshSchema = z.object({ version: z.int().min(1) })
export type OutlineRefresh = z.infer<typeof outlineRefreshSchema>

export const outlineRefreshedSchema = z.object({
  take: outlineRecordSchema,
  /** lines whose words, hiding or chapter title carried over to the fresh path */
  kept: countSchema,
  /** the words of edited lines whose steps the fresh path no longer has, so a person can reuse them */
  lost: z.array(z.string()),
})
export type OutlineRefreshed = z.infer<typeof outlineRefreshedSchema>

export const cueSheetQuerySchema = z.object({
  /** draw the grid before each line beside it */
  thumbnails: z
    .enum(['0', '1'], { message: 'thumbnails must be 0 or 1' })
    .optional()
    .transform((v) => v === '1'),
})

/** Body of a 409: the copy now on the server, so the client can show both versions. */
export interface StaleBody<T> {
  code: 'stale'
  message: string
  details: { current: T }
}
