import { scriptProblems, stepsCoveredBy, type Outline } from '../../shared/schemas/outline'
import type { OutlineCreate, OutlineRecord, OutlineSave, OutlineSummary, PuzzleCheck } from '../../shared/schemas/studio'
import { timeline } from '../../shared/script/index'
import type { Db } from '../db/knex'
import { deleteOutline, findOutline, findOutlineStamp, findOutlineSummary, findOutlineText, insertOutline, listOutlines, outlineOf, saveScript, type OutlineFields, type OutlineSummaryRow } from '../db/outlines'
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
 * Saves edited lines, chapters and timing if nobody saved since `version` was read (otherwise 409 with the
 * current copy). Answers the summary: the client already holds the document it sent.
 */
export async function saveOutline(db: Db, channelId: number, outlineId: number, save: OutlineSave): Promise<OutlineSummary> {
  const saved = await saveScript(db, channelId, outlineId, save.version, {
    name: save.name,
    total_ms: Math.round(timeline(save.script).totalMs),
    step_count: stepsCoveredBy(save.script),
    script: save.script,
  })
  if (saved) return toSummary(saved)
  return whyNotSaved(db, channelId, outlineId, save)
}

/** After the one-statement save wrote nothing, reads the outline's summary to say why: 404, 409 with the current copy, or 400. */
async function whyNotSaved(db: Db, channelId: number, outlineId: number, save: OutlineSave): Promise<never> {
  const current = await findOutlineSummary(db, channelId, outlineId)
  if (!current) throw notFound('Outline')
  if (current.version !== save.version) throw stale('outline', toRecord(await existing(db, channelId, outlineId)))
  const problems = scriptProblems(save.script, current.step_count)
  // version and lines fit now: the row changed between the two statements, so show the copy it holds
  if (problems.length === 0) throw stale('outline', toRecord(await existing(db, channelId, outlineId)))
  // the schema checked everything else, so what is left is how many steps the lines cover
  throw new HttpError(400, 'invalid-input', `body.script.lines: ${problems[0]}`, problems.map((message) => ({ path: 'body.script.lines', message })))
}

/** A new outline with the same document, to try another take without losing this one. */
export async function duplicateOutline(db: Db, channelId: number, outlineId: number, user: Express.User): Promise<OutlineRecord> {
  const source = await existing(db, channelId, outlineId)
  const name = `${source.name.slice(0, NAME_MAX - ' (copy)'.length)} (copy)`
  return toRecord(await insertOutline(db, source.puzzle_id, user.id, fieldsOf(name, outlineOf(source))))
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

const toRecord = (row: OutlineRow): OutlineRecord => ({ ...toSummary(row), outline: outlineOf(row) })
