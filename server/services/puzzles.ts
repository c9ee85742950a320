import type { PuzzleDraft, PuzzleRecord, PuzzleSummary, PuzzleUpdate } from '../../shared/schemas/studio'
import type { Db } from '../db/knex'
import { deletePuzzle, findPuzzle, insertPuzzle, keepTakesCurrent, listPuzzles, updatePuzzle, type PuzzleFields, type PuzzleWithCount } from '../db/puzzles'
import type { PuzzleRow } from '../db/tables'
import { notFound, stale } from '../errors'
import type { Engine } from '../workers/engine-pool'

export async function puzzlesOf(db: Db, channelId: number): Promise<PuzzleSummary[]> {
  return (await listPuzzles(db, channelId)).map(toSummary)
}

export async function puzzleOf(db: Db, channelId: number, puzzleId: number): Promise<PuzzleRecord> {
  const row = await findPuzzle(db, channelId, puzzleId)
  if (!row) throw notFound('Puzzle')
  return toRecord(row)
}

/** Saves a draft with the engine's verdict; a draft that is not (yet) unique is saved too. */
export async function addPuzzle(db: Db, engine: Engine, channelId: number, draft: PuzzleDraft, user: Express.User): Promise<PuzzleRecord> {
  const fields = await withVerdict(engine, draft)
  return toRecord({ ...(await insertPuzzle(db, channelId, user.id, fields)), outline_count: 0, stale_outline_count: 0 })
}

/** Replaces the puzzle if nobody saved since `version` was read; otherwise 409 with the current copy. */
export async function savePuzzle(db: Db, engine: Engine, channelId: number, puzzleId: number, update: PuzzleUpdate): Promise<PuzzleRecord> {
  const current = await findPuzzle(db, channelId, puzzleId)
  if (!current) throw notFound('Puzzle')
  if (current.version !== update.version) throw stale('puzzle', toRecord(current))
  // saving what is stored changes nothing: the version stays, so takes and other editors see no change
  if (sameAsStored(current, update)) return toRecord(current)
  const fields = await withVerdict(engine, update)
  const row = await db.transaction(async (trx) => {
    const saved = await updatePuzzle(trx, channelId, puzzleId, update.version, fields)
    if (saved && sameGrid(current, fields)) await keepTakesCurrent(trx, puzzleId, current.version, saved.version)
    return saved
  })
  // read again for the take counts, which the grid change may have made stale
  if (row) return puzzleOf(db, channelId, puzzleId)
  // someone saved while the engine was checking
  const now = await findPuzzle(db, channelId, puzzleId)
  if (!now) throw notFound('Puzzle')
  throw stale('puzzle', toRecord(now))
}

export async function removePuzzle(db: Db, channelId: number, puzzleId: number): Promise<void> {
  if (!(await deletePuzzle(db, channelId, puzzleId))) throw notFound('Puzzle')
}

const sameGrid = (a: Pick<PuzzleRow, 'givens' | 'thermometers'>, b: Pick<PuzzleRow, 'givens' | 'thermometers'>) =>
  a.givens === b.givens && JSON.stringify(a.thermometers) === JSON.stringify(b.thermometers)

function sameAsStored(row: PuzzleRow, update: PuzzleUpdate): boolean {
  const stored = storedForm(update)
  return (
    sameGrid(row, stored) &&
    row.title === stored.title &&
    row.author === stored.author &&
    row.link === stored.link &&
    row.published_on === stored.published_on &&
    row.notes === stored.notes
  )
}

/** The stored form of a draft: '0' givens read as empty, cell names in lower case, plus the engine's verdict. */
async function withVerdict(engine: Engine, draft: PuzzleDraft): Promise<PuzzleFields> {
  const stored = storedForm(draft)
  const verdict = await engine.check({ title: stored.title, author: stored.author, givens: stored.givens, thermometers: stored.thermometers })
  return { ...stored, ...verdict }
}

function storedForm(draft: PuzzleDraft): Omit<PuzzleFields, 'check' | 'problems' | 'solution'> {
  return {
    title: draft.title,
    author: draft.author ?? '',
    link: draft.link ?? '',
    published_on: draft.publishedOn ?? '',
    notes: draft.notes ?? '',
    givens: draft.givens.replaceAll('0', '.'),
    thermometers: draft.thermometers.map((path) => path.map((cell) => cell.toLowerCase())),
  }
}

const toSummary = (row: PuzzleWithCount): PuzzleSummary => ({
  id: row.id,
  channelId: row.channel_id,
  title: row.title,
  author: row.author,
  check: row.check,
  outlineCount: row.outline_count,
  staleOutlineCount: row.stale_outline_count,
  version: row.version,
  updatedAt: row.updated_at.toISOString(),
})

const toRecord = (row: PuzzleWithCount): PuzzleRecord => ({
  ...toSummary(row),
  givens: row.givens,
  thermometers: row.thermometers,
  link: row.link,
  publishedOn: row.published_on,
  notes: row.notes,
  problems: row.problems,
})
