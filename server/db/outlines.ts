import type { Db } from './knex'
import { SCRIPT_KEYS, scriptOf, type Outline, type OutlineBase, type OutlineScript } from '../../shared/schemas/outline'
import type { OutlineRow } from './tables'

/** What a new outline row holds: the whole document goes in, split into its base and its script. */
export type OutlineFields = Pick<OutlineRow, 'name' | 'status' | 'step_count' | 'total_ms' | 'puzzle_version'> & { document: Outline }
export type OutlineSummaryRow = Omit<OutlineRow, 'document' | 'script'>

const SUMMARY_COLUMNS = ['id', 'puzzle_id', 'name', 'status', 'step_count', 'total_ms', 'version', 'puzzle_version', 'created_by', 'saved_by', 'created_at', 'updated_at'] as const

/** A take's grid beside its puzzle's grid now; the take's grid is read only when the puzzle's version has moved past it. */
export interface FreshnessColumns {
  /** the givens and thermometers (cell indices) the take was solved on; null while the take is on the puzzle's version */
  made_from: { givens: string; thermometers: number[][] } | null
  puzzle_givens: string
  puzzle_thermometers: string[][]
  /** the name of whoever saved last, null once they are gone */
  saved_by_name: string | null
}

// document -> 'puzzle' is a few hundred bytes, but reading it unpacks the whole document: only for takes behind their puzzle
const freshnessColumns = (db: Db) => [
  db.raw("case when outlines.puzzle_version <> puzzles.version then outlines.document -> 'puzzle' end as made_from"),
  'puzzles.givens as puzzle_givens',
  'puzzles.thermometers as puzzle_thermometers',
  savedByName(db, 'outlines'),
]

const savedByName = (db: Db, table: string) => db.raw(`(select u.name from users u where u.id = ${table}.saved_by) as saved_by_name`)

const toColumns = (db: Db, { document, ...fields }: OutlineFields) => ({
  ...fields,
  document: db.raw('?::jsonb', [JSON.stringify(baseOf(document))]),
  script: db.raw('?::jsonb', [JSON.stringify(scriptOf(document))]),
})

function baseOf(outline: Outline): OutlineBase {
  const base: Partial<Outline> = { ...outline }
  for (const key of SCRIPT_KEYS) delete base[key]
  return base as OutlineBase
}

/** The whole outline a row holds. */
export const outlineOf = (row: Pick<OutlineRow, 'document' | 'script'>): Outline => ({ ...row.document, ...row.script })

// The whole outline as JSON text from its two columns as PostgreSQL prints them: two objects with no key in common
// joined into one, so a 130 KB document is neither parsed nor merged by PostgreSQL's jsonb operators (which walk every step).
const OUTLINE_TEXT_SQL = "left(outlines.document::text, -1) || ', ' || substr(outlines.script::text, 2)"

/** Summaries without the documents, with what the puzzle's grid is now, oldest first (the order the takes were made). */
export function listOutlines(db: Db, puzzleId: number): Promise<(OutlineSummaryRow & FreshnessColumns)[]> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.puzzle_id', puzzleId)
    .orderBy('outlines.id')
    .select(...SUMMARY_COLUMNS.map((c) => `outlines.${c}`), ...freshnessColumns(db))
}

/** An outline only when its puzzle belongs to the channel. */
export function findOutline(db: Db, channelId: number, outlineId: number): Promise<OutlineRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first('outlines.*')
}

/**
 * When an outline was last saved and which version its puzzle is at (a changed grid changes what the take
 * reads), for its ETag; one indexed look-up that also checks the channel.
 */
export function findOutlineStamp(
  db: Db,
  channelId: number,
  outlineId: number,
): Promise<(Pick<OutlineRow, 'version' | 'updated_at'> & { puzzle_now_version: number }) | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first('outlines.version', 'outlines.updated_at', 'puzzles.version as puzzle_now_version')
}

/** An outline whose whole document is JSON text, not parsed, for whoever only passes it on. */
export type OutlineTextRow = OutlineSummaryRow & FreshnessColumns & { document: string }

/** An outline with its document as JSON text, only when its puzzle belongs to the channel. */
export function findOutlineText(db: Db, channelId: number, outlineId: number): Promise<OutlineTextRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first<OutlineTextRow | undefined>(...SUMMARY_COLUMNS.map((c) => `outlines.${c}`), ...freshnessColumns(db), db.raw(`${OUTLINE_TEXT_SQL} as document`))
}

/** What a cue sheet needs: the take's name, the puzzle's title and the document as JSON text, left unparsed. */
export interface OutlineExportRow {
  name: string
  title: string
  document: string
}

/** An outline's export fields, only when its puzzle belongs to the channel. */
export function findOutlineForExport(db: Db, channelId: number, outlineId: number): Promise<OutlineExportRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first<OutlineExportRow | undefined>('outlines.name', db.raw("outlines.document ->> 'title' as title"), db.raw(`${OUTLINE_TEXT_SQL} as document`))
}

export async function insertOutline(db: Db, puzzleId: number, createdBy: number | null, fields: OutlineFields): Promise<OutlineRow> {
  const [row] = await db('outlines')
    .insert({ ...toColumns(db, fields), puzzle_id: puzzleId, created_by: createdBy, saved_by: createdBy })
    .returning('*')
  return row as OutlineRow
}

/** A save's new script and what follows from it. */
export interface ScriptSave {
  /** a new name, or undefined to keep the stored one */
  name: string | undefined
  total_ms: number
  /** how many engine steps the script's lines cover: it must be the stored count */
  step_count: number
  script: OutlineScript
  /** who is saving */
  saved_by: number
}

/**
 * Writes a script over `version` in one statement, only when its lines cover the stored number of steps.
 * The outline's base (steps, puzzle) is neither sent nor read nor rewritten: the script has a column of its own.
 * Undefined when nothing was written: the outline is missing or in another channel, someone saved a
 * newer version first, or the lines don't fit the steps.
 */
export async function saveScript(
  db: Db,
  channelId: number,
  outlineId: number,
  version: number,
  save: ScriptSave,
): Promise<(OutlineSummaryRow & FreshnessColumns) | undefined> {
  const update = db('outlines')
    .where({ id: outlineId, version, step_count: save.step_count })
    .whereIn('puzzle_id', db('puzzles').select('id').where({ channel_id: channelId }))
    .update({
      script: db.raw('?::jsonb', [JSON.stringify(save.script)]),
      ...(save.name === undefined ? {} : { name: save.name }),
      total_ms: save.total_ms,
      saved_by: save.saved_by,
      version: version + 1,
      updated_at: db.fn.now(),
    })
    .returning(SUMMARY_COLUMNS)
  // the summary beside its puzzle's grid, as a read answers it; the document (which a save leaves alone) is
  // read from the table only for a take behind its puzzle, never carried through the update
  const row: unknown = await db
    .with('saved', update)
    .from('saved')
    .join('puzzles', 'puzzles.id', 'saved.puzzle_id')
    .first(
      ...SUMMARY_COLUMNS.map((c) => `saved.${c}`),
      db.raw("case when saved.puzzle_version <> puzzles.version then (select o.document -> 'puzzle' from outlines o where o.id = saved.id) end as made_from"),
      'puzzles.givens as puzzle_givens',
      'puzzles.thermometers as puzzle_thermometers',
      savedByName(db, 'saved'),
    )
  return row as (OutlineSummaryRow & FreshnessColumns) | undefined
}

/**
 * Puts a fresh path and its script (made from the puzzle version `fields` names) in place of the take's, only
 * when nobody saved since `version` was read; undefined otherwise.
 */
export async function replaceOutline(db: Db, outlineId: number, version: number, savedBy: number, fields: OutlineFields): Promise<OutlineRow | undefined> {
  const [row] = await db('outlines')
    .where({ id: outlineId, version })
    .update({ ...toColumns(db, fields), saved_by: savedBy, version: version + 1, updated_at: db.fn.now() })
    .returning('*')
  return row as OutlineRow | undefined
}

/** An outline's summary without its document, only when its puzzle belongs to the channel. */
export function findOutlineSummary(db: Db, channelId: number, outlineId: number): Promise<OutlineSummaryRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first(...SUMMARY_COLUMNS.map((c) => `outlines.${c}`))
}

export async function deleteOutline(db: Db, outlineId: number): Promise<boolean> {
  return (await db('outlines').where({ id: outlineId }).delete()) > 0
}
