import { isDeepStrictEqual } from 'node:util'
import { z } from 'zod'
import { stepSchema, type Outline } from '../../shared/schemas/outline'
import type { OutlineCreate, OutlineRecord, OutlineSave, OutlineSummary, PuzzleCheck } from '../../shared/schemas/studio'
import { timeline } from '../../shared/script/index'
import type { Db } from '../db/knex'
import { deleteOutline, findOutline, findOutlineStamp, findOutlineText, insertOutline, listOutlines, saveScript, updateOutline, type OutlineFields, type OutlineSummaryRow } from '../db/outlines'
import { findPuzzle } from '../db/puzzles'
import type { OutlineRow } from '../db/tables'
import { HttpError, notFound, stale } from '../errors'
import type { Engine } from '../workers/engine-pool'

const NAME_MAX = 100

const NOT_READY: Record<Exclude<PuzzleCheck, 'unique'>, string> = {
  'multiple-solutions': 'Fix the puzzle first: it has more than one solution',
  'no-solution': 'Fix the puzzle first: it has no solution',
  invalid: 'Fix the puzzle first: the engine found problems with its givens or thermometers',
}

export async function outlinesOf(db: Db, channelId: number, puzzleId: number): Promise<OutlineSummary[]> {
  if (!(await findPuzzle(db, channelId, puzzleId))) throw notFound('Puzzle')
  return (await listOutlines(db, puzzleId)).map(toSummary)
}

/** The ETag of an outline as stored now: it changes with every save (the version) and every restore (the time). */
export async function outlineTagOf(db: Db, channelId: number, outlineId: number): Promise<string> {
  const stamp = await findOutlineStamp(db, channelId, outlineId)
  if (!stamp) throw notFound('Outline')
  return `"outline-${outlineId}-${stamp.version}-${stamp.updated_at.getTime()}"`
}

/**
 * The outline as an OutlineRecord in JSON text. The stored document goes in as PostgreSQL prints it: a
 * 130 KB document is neither parsed nor serialised again on the request thread.
 */
export async function outlineJsonOf(db: Db, channelId: number, outlineId: number): Promise<string> {
  const row = await findOutlineText(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  const summary = JSON.stringify(toSummary(row))
  return `${summary.slice(0, -1)},"outline":${row.document}}`
}

/** Runs the engine (in the worker pool) on a unique puzzle and stores its outline, even when the path gets stuck. */
export async function makeOutline(db: Db, engine: Engine, channelId: number, puzzleId: number, input: OutlineCreate, user: Express.User): Promise<OutlineRecord> {
  const puzzle = await findPuzzle(db, channelId, puzzleId)
  if (!puzzle) throw notFound('Puzzle')
  if (puzzle.check !== 'unique') throw new HttpError(422, 'puzzle-not-unique', NOT_READY[puzzle.check], puzzle.problems)
  const document = await engine.outline({
    puzzle: { title: puzzle.title, author: puzzle.author || undefined, givens: puzzle.givens, thermometers: puzzle.thermometers },
    pace: input.pace,
    names: input.names,
    link: puzzle.link || undefined,
  })
  if ('refused' in document) throw new HttpError(422, 'no-path', document.refused)
  const name = input.name ?? `Take ${puzzle.outline_count + 1}`
  return toRecord(await insertOutline(db, puzzle.id, user.id, fieldsOf(name, document)))
}

/**
 * Saves edited lines, chapters and timing if nobody saved since `version` was read (otherwise 409
 * with the current copy). The engine's part (steps, puzzle, status) must come back unchanged.
 */
export async function saveOutline(db: Db, channelId: number, outlineId: number, save: OutlineSave): Promise<OutlineRecord> {
  const saved = await saveScript(db, channelId, outlineId, save.version, { name: save.name, total_ms: totalMsOf(save.outline), document: save.outline })
  // the stored steps equal the ones sent back, so the saved document is the one sent
  if (saved) return { ...toSummary(saved), outline: save.outline }
  return saveAfterReading(db, channelId, outlineId, save)
}

/**
 * The careful save, after the one-statement save wrote nothing: it reads the stored outline to say why
 * (404, 409 with the current copy, or 400), and saves a document whose stored steps carry fields the
 * schema drops (the request can't send those back, so PostgreSQL's comparison found a difference).
 */
async function saveAfterReading(db: Db, channelId: number, outlineId: number, save: OutlineSave): Promise<OutlineRecord> {
  const current = await existing(db, channelId, outlineId)
  if (current.version !== save.version) throw stale('outline', toRecord(current))
  // the stored steps go through the same schema as the request, so fields it drops don't count as changes
  if (!isDeepStrictEqual(save.outline.steps, stepsSchema.parse(current.document.steps))) {
    throw new HttpError(400, 'steps-changed', "The engine steps of an outline can't be changed; edit the lines instead")
  }
  if (save.outline.status !== current.document.status || !isDeepStrictEqual(save.outline.puzzle, current.document.puzzle)) {
    throw new HttpError(400, 'puzzle-changed', "The puzzle and status of an outline come from the engine and can't be changed; make a new outline instead")
  }
  // keep the stored steps byte for byte, including any fields the engine added that the schema doesn't know
  const document: Outline = { ...save.outline, steps: current.document.steps }
  const row = await updateOutline(db, outlineId, save.version, fieldsOf(save.name ?? current.name, document))
  if (row) return toRecord(row)
  throw stale('outline', toRecord(await existing(db, channelId, outlineId)))
}

/** A new outline with the same document, to try another take without losing this one. */
export async function duplicateOutline(db: Db, channelId: number, outlineId: number, user: Express.User): Promise<OutlineRecord> {
  const source = await existing(db, channelId, outlineId)
  const name = `${source.name.slice(0, NAME_MAX - ' (copy)'.length)} (copy)`
  return toRecord(await insertOutline(db, source.puzzle_id, user.id, fieldsOf(name, source.document)))
}

export async function removeOutline(db: Db, channelId: number, outlineId: number): Promise<void> {
  await existing(db, channelId, outlineId)
  if (!(await deleteOutline(db, outlineId))) throw notFound('Outline')
}

const stepsSchema = z.array(stepSchema)

async function existing(db: Db, channelId: number, outlineId: number): Promise<OutlineRow> {
  const row = await findOutline(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  return row
}

const totalMsOf = (document: Outline) => Math.round(timeline(document).totalMs)

const fieldsOf = (name: string, document: Outline): OutlineFields => ({
  name,
  status: document.status,
  step_count: document.steps.length,
  total_ms: totalMsOf(document),
  document,
})

const toSummary = (row: OutlineSummaryRow): OutlineSummary => ({
  id: row.id,
  puzzleId: row.puzzle_id,
  name: row.name,
  status: row.status,
  stepCount: row.step_count,
  totalMs: row.total_ms,
  version: row.version,
  updatedAt: row.updated_at.toISOString(),
})

const toRecord = (row: OutlineRow): OutlineRecord => ({ ...toSummary(row), outline: row.document })
