import type { Db } from './knex'
import type { PuzzleRow } from './tables'

/** The columns a person edits plus the engine's verdict; the rest is set by the database. */
export type PuzzleFields = Pick<
  PuzzleRow,
  'title' | 'author' | 'link' | 'published_on' | 'notes' | 'givens' | 'thermometers' | 'check' | 'problems' | 'solution'
>

export interface PuzzleWithCount extends PuzzleRow {
  outline_count: number
  /** takes solved on an earlier version of the grid */
  stale_outline_count: number
}

// jsonb columns take JSON text: pg would send a JS array as a PostgreSQL array
const toColumns = (db: Db, fields: PuzzleFields) => ({
  ...fields,
  thermometers: db.raw('?::jsonb', [JSON.stringify(fields.thermometers)]),
  problems: db.raw('?::jsonb', [JSON.stringify(fields.problems)]),
})

const withOutlineCount = (db: Db) =>
  db('puzzles').select(
    'puzzles.*',
    db.raw('(select count(*)::int from outlines o where o.puzzle_id = puzzles.id) as outline_count'),
    db.raw('(select count(*)::int from outlines o where o.puzzle_id = puzzles.id and o.puzzle_version <> puzzles.version) as stale_outline_count'),
  )

export function listPuzzles(db: Db, channelId: number): Promise<PuzzleWithCount[]> {
  return withOutlineCount(db).where('puzzles.channel_id', channelId).orderBy('puzzles.updated_at', 'desc').orderBy('puzzles.id', 'desc')
}

/** A puzzle only when it belongs to the channel, so ids from other channels read as missing. */
export function findPuzzle(db: Db, channelId: number, puzzleId: number): Promise<PuzzleWithCount | undefined> {
  return withOutlineCount(db).where('puzzles.id', puzzleId).andWhere('puzzles.channel_id', channelId).first()
}

export function countPuzzles(db: Db, channelId: number): Promise<number> {
  return db('puzzles').where({ channel_id: channelId }).count({ n: '*' }).then(([r]) => Number(r?.n ?? 0))
}

export async function insertPuzzle(db: Db, channelId: number, createdBy: number | null, fields: PuzzleFields): Promise<PuzzleRow> {
  const [row] = await db('puzzles')
    .insert({ ...toColumns(db, fields), channel_id: channelId, created_by: createdBy })
    .returning('*')
  return row as PuzzleRow
}

/** Saves over `version`; undefined when the row is gone or someone saved a newer version first. */
export async function updatePuzzle(db: Db, channelId: number, puzzleId: number, version: number, fields: PuzzleFields): Promise<PuzzleRow | undefined> {
  const [row] = await db('puzzles')
    .where({ id: puzzleId, channel_id: channelId, version })
    .update({ ...toColumns(db, fields), version: version + 1, updated_at: db.fn.now() })
    .returning('*')
  return row as PuzzleRow | undefined
}

/**
 * After a save that left the grid as it was (a new title, say), the takes that were current stay current:
 * they move from the old version to the new one. Takes already behind stay behind.
 */
export async function keepTakesCurrent(db: Db, puzzleId: number, from: number, to: number): Promise<void> {
  await db('outlines').where({ puzzle_id: puzzleId, puzzle_version: from }).update({ puzzle_version: to })
}

/** True when a row was deleted; its outlines go with it. */
export async function deletePuzzle(db: Db, channelId: number, puzzleId: number): Promise<boolean> {
  return (await db('puzzles').where({ id: puzzleId, channel_id: channelId }).delete()) > 0
}
