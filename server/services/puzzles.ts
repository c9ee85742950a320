import type { PuzzleDraft, PuzzleRecord, PuzzleSummary, PuzzleUpdate } from '../../shared/schemas/studio'
import type { Db } from '../db/knex'
import { countOutlines } from '../db/outlines'
import { deletePuzzle, findPuzzle, insertPuzzle, listPuzzles, updatePuzzle, type PuzzleFields, type PuzzleWithCount } from '../db/puzzles'
import type { PuzzleRow } from '../db/tables'
import { notFound, stale } from '../errors'
import type { Engine } from '../workers/engine-pool'

export async function puzzlesOf(db: Db, channelId: number): Promise<PuzzleSummary[]> {
  return (await listPuzzles(db, channelId)).map(toSummary)
}

export async function puzzleOf(db: Db, channelId: number, puzzleId: number): Promise<PuzzleRecord> {
  const row = await findPuzzle(db, channelId, puzzleId)
  if (!row) throw notFound('Puzzle')
  return toRecord(row, row.outline_count)
}

/** Saves a draft with the engine's verdict; a draft that is not (yet) unique is saved too. */
export async function addPuzzle(db: Db, engine: Engine, channelId: number, draft: PuzzleDraft, user: Express.User): Promise<PuzzleRecord> {
  const fields = await withVerdict(engine, draft)
  return toRecord(await insertPuzzle(db, channelId, user.id, fields), 0)
}

/** Replaces the puzzle if nobody saved since `version` was read; otherwise 409 with the current copy. */
export async function savePuzzle(db: Db, engine: Engine, channelId: number, puzzleId: number, update: PuzzleUpdate): Promise<PuzzleRecord> {
  const current = await findPuzzle(db, channelId, puzzleId)
  if (!current) throw notFound('Puzzle')
  if (current.version !== update.version) throw stale('puzzle', toRecord(current, current.outline_count))
  const fields = await withVerdict(engine, update)
  const row = await updatePuzzle(db, channelId, puzzleId, update.version, fields)
  if (row) return toRecord(row, await countOutlines(db, puzzleId))
  // someone saved while the engine was checking
  const now = await findPuzzle(db, channelId, puzzleId)
  if (!now) throw notFound('Puzzle')
  throw stale('puzzle', toRecord(now, now.outline_count))
}

export async function removePuzzle(db: Db, channelId: number, puzzleId: number): Promise<void> {
  if (!(await deletePuzzle(db, channelId, puzzleId))) throw notFound('Puzzle')
}

/** The stored form of a draft: '0' givens read as empty, cell names in lower case, plus the engine's verdict. */
async function withVerdict(engine: Engine, draft: PuzzleDraft): Promise<PuzzleFields> {
  const givens = draft.givens.replaceAll('0', '.')
  const thermometers = draft.thermometers.map((path) => path.map((cell) => cell.toLowerCase()))
  const author = draft.author ?? ''
  const verdict = await engine.check({ title: draft.title, author, givens, thermometers })
  return {
    title: draft.title,
    author,
    link: draft.link ?? '',
    published_on: draft.publishedOn ?? '',
    notes: draft.notes ?? '',
    givens,
    thermometers,
    ...verdict,
  }
}

const toSummary = (row: PuzzleWithCount): PuzzleSummary => ({
  id: row.id,
  channelId: row.channel_id,
  title: row.title,
  author: row.author,
  check: row.check,
  outlineCount: row.outline_count,
  version: row.version,
  updatedAt: row.updated_at.toISOString(),
})

const toRecord = (row: PuzzleRow, outlineCount: number): PuzzleRecord => ({
  ...toSummary({ ...row, outline_count: outlineCount }),
  givens: row.givens,
  thermometers: row.thermometers,
  link: row.link,
  publishedOn: row.published_on,
  notes: row.notes,
  problems: row.problems,
})
