import { scriptProblems, stepsCoveredBy, type Outline } from '../../shared/schemas/outline'
import { parseCellName } from '../../shared/grid/geometry'
import type { OutlineCreate, OutlineRecord, OutlineRefresh, OutlineRefreshed, OutlineSave, OutlineSummary, PuzzleCheck } from '../../shared/schemas/studio'
import { timeline } from '../../shared/script/index'
import { carryEdits } from '../../shared/takes/carry-edits'
import { puzzleChanges } from '../../shared/takes/puzzle-changes'
import type { Db } from '../db/knex'
import {
  deleteOutline,
  findOutline,
  findOutlineStamp,
  findOutlineSummary,
  findOutlineText,
  insertOutline,
  listOutlines,
  outlineOf,
  replaceOutline,
  saveScript,
  type FreshnessColumns,
  type OutlineFields,
  type OutlineSummaryRow,
} from '../db/outlines'
import { findPuzzle, type PuzzleWithCount } from '../db/puzzles'
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
  return (await listOutlines(db, puzzleId)).map(toSummaryWithChanges)
}

/** The ETag of an outline as stored now: it changes with every save (the version) and every restore (the time). */
export async function outlineTagOf(db: Db, channelId: number, outlineId: number): Promise<string> {
  const stamp = await findOutlineStamp(db, channelId, outlineId)
  if (!stamp) throw notFound('Outline')
  return `"outline-${outlineId}-${stamp.version}-${stamp.updated_at.getTime()}-p${stamp.puzzle_now_version}"`
}

/**
 * The outline as an OutlineRecord in JSON text. The stored document goes in as PostgreSQL prints it: a
 * 130 KB document is neither parsed nor serialised again on the request thread.
 */
export async function outlineJsonOf(db: Db, channelId: number, outlineId: number): Promise<string> {
  const row = await findOutlineText(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  const summary = JSON.stringify(toSummaryWithChanges(row))
  return `${summary.slice(0, -1)},"outline":${row.document}}`
}

/** The take as a read answers it (with what changed in its puzzle), for answers that are rare enough to parse it again (a 409, a copy). */
async function currentRecord(db: Db, channelId: number, outlineId: number): Promise<OutlineRecord> {
  return JSON.parse(await outlineJsonOf(db, channelId, outlineId)) as OutlineRecord
}

/** Runs the engine (in the worker pool) on a unique puzzle and stores its outline, even when the path gets stuck. */
export async function makeOutline(db: Db, engine: Engine, channelId: number, puzzleId: number, input: OutlineCreate, user: Express.User): Promise<OutlineRecord> {
  const puzzle = await findPuzzle(db, channelId, puzzleId)
  if (!puzzle) throw notFound('Puzzle')
  const document = await solvedOutline(engine, puzzle, input)
  const name = input.name ?? `Take ${puzzle.outline_count + 1}`
  // made from the puzzle as it is: current
  return toRecord(await insertOutline(db, puzzle.id, user.id, fieldsOf(name, document, puzzle.version)), user)
}

/** The engine's outline of a puzzle as it is stored now; 422 when the puzzle isn't ready or has no path. */
async function solvedOutline(engine: Engine, puzzle: PuzzleWithCount, input: Pick<OutlineCreate, 'pace' | 'names'>): Promise<Outline> {
  if (puzzle.check !== 'unique') throw new HttpError(422, 'puzzle-not-unique', NOT_READY[puzzle.check], puzzle.problems)
  const document = await engine.outline({
    puzzle: { title: puzzle.title, author: puzzle.author || undefined, givens: puzzle.givens, thermometers: puzzle.thermometers },
    pace: input.pace,
    names: input.names,
    link: puzzle.link || undefined,
  })
  if ('refused' in document) throw new HttpError(422, 'no-path', document.refused)
  return document
}

/**
 * "Find the path again": solves the puzzle as it is now and puts the fresh path in place of the take's, keeping
 * the take's name, pace, naming style and target, and its people's lines wherever their steps still happen.
 * 409 with the current copy when someone saved since `version` was read.
 */
export async function refreshOutline(
  db: Db,
  engine: Engine,
  channelId: number,
  outlineId: number,
  input: OutlineRefresh,
  user: Express.User,
): Promise<OutlineRefreshed> {
  const take = await existing(db, channelId, outlineId)
  if (take.version !== input.version) throw stale('outline', await currentRecord(db, channelId, outlineId))
  const puzzle = await findPuzzle(db, channelId, take.puzzle_id)
  if (!puzzle) throw notFound('Puzzle')
  const old = outlineOf(take)
  const fresh = await solvedOutline(engine, puzzle, { pace: old.pace, names: old.names })
  const carried = carryEdits(old, fresh)
  const row = await replaceOutline(db, outlineId, input.version, user.id, fieldsOf(take.name, carried.outline, puzzle.version))
  if (!row) throw stale('outline', await currentRecord(db, channelId, outlineId))
  return { take: toRecord(row, user), kept: carried.kept, lost: carried.lost.filter((line) => line.edited).map((line) => line.text) }
}

/**
 * Saves edited lines, chapters and timing if nobody saved since `version` was read (otherwise 409 with the
 * current copy). Answers the summary: the client already holds the document it sent.
 */
export async function saveOutline(db: Db, channelId: number, outlineId: number, save: OutlineSave, user: Pick<Express.User, 'id'>): Promise<OutlineSummary> {
  const saved = await saveScript(db, channelId, outlineId, save.version, {
    saved_by: user.id,
    name: save.name,
    total_ms: Math.round(timeline(save.script).totalMs),
    step_count: stepsCoveredBy(save.script),
    script: save.script,
  })
  if (saved) return toSummaryWithChanges(saved)
  return whyNotSaved(db, channelId, outlineId, save)
}

/** After the one-statement save wrote nothing, reads the outline's summary to say why: 404, 409 with the current copy, or 400. */
async function whyNotSaved(db: Db, channelId: number, outlineId: number, save: OutlineSave): Promise<never> {
  const current = await findOutlineSummary(db, channelId, outlineId)
  if (!current) throw notFound('Outline')
  if (current.version !== save.version) throw stale('outline', await currentRecord(db, channelId, outlineId))
  const problems = scriptProblems(save.script, current.step_count)
  // version and lines fit now: the row changed between the two statements, so show the copy it holds
  if (problems.length === 0) throw stale('outline', await currentRecord(db, channelId, outlineId))
  // the schema checked everything else, so what is left is how many steps the lines cover
  throw new HttpError(400, 'invalid-input', `body.script.lines: ${problems[0]}`, problems.map((message) => ({ path: 'body.script.lines', message })))
}

/** A new outline with the same document, to try another take without losing this one. */
export async function duplicateOutline(db: Db, channelId: number, outlineId: number, user: Express.User): Promise<OutlineRecord> {
  const source = await existing(db, channelId, outlineId)
  const name = `${source.name.slice(0, NAME_MAX - ' (copy)'.length)} (copy)`
  const copy = await insertOutline(db, source.puzzle_id, user.id, fieldsOf(name, outlineOf(source), source.puzzle_version))
  // read back for what changed in the puzzle since the source was made: the copy is as current as its source
  return currentRecord(db, channelId, copy.id)
}

export async function removeOutline(db: Db, channelId: number, outlineId: number): Promise<void> {
  await existing(db, channelId, outlineId)
  if (!(await deleteOutline(db, outlineId))) throw notFound('Outline')
}

async function existing(db: Db, channelId: number, outlineId: number): Promise<OutlineRow> {
  const row = await findOutline(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  return row
}

const totalMsOf = (document: Outline) => Math.round(timeline(document).totalMs)

const fieldsOf = (name: string, document: Outline, puzzleVersion: number): OutlineFields => ({
  name,
  puzzle_version: puzzleVersion,
  status: document.status,
  step_count: document.steps.length,
  total_ms: totalMsOf(document),
  document,
})

const toSummary = (row: OutlineSummaryRow): Omit<OutlineSummary, 'puzzleChanges' | 'savedBy'> => ({
  id: row.id,
  puzzleId: row.puzzle_id,
  name: row.name,
  status: row.status,
  stepCount: row.step_count,
  totalMs: row.total_ms,
  version: row.version,
  puzzleVersion: row.puzzle_version,
  updatedAt: row.updated_at.toISOString(),
})

const toSummaryWithChanges = (row: OutlineSummaryRow & FreshnessColumns): OutlineSummary => ({
  ...toSummary(row),
  savedBy: row.saved_by !== null && row.saved_by_name !== null ? { id: row.saved_by, name: row.saved_by_name } : null,
  puzzleChanges: row.made_from && puzzleChanges(row.made_from, { givens: row.puzzle_givens, thermometers: row.puzzle_thermometers.map(cellsOf) }),
})

/** Stored thermometers are checked cell names, so every one parses. */
const cellsOf = (path: string[]): number[] => path.map((name) => parseCellName(name) ?? -1)

/** A take just made or remade by `user` from the puzzle as it is: current, and saved by them. */
const toRecord = (row: OutlineRow, user: Express.User): OutlineRecord => ({
  ...toSummary(row),
  savedBy: { id: user.id, name: user.name },
  puzzleChanges: null,
  outline: outlineOf(row),
})
