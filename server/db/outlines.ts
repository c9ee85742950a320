import type { Db } from './knex'
import type { Outline } from '../../shared/schemas/outline'
import type { OutlineRow } from './tables'

export type OutlineFields = Pick<OutlineRow, 'name' | 'status' | 'step_count' | 'total_ms' | 'document'>
export type OutlineSummaryRow = Omit<OutlineRow, 'document'>

const SUMMARY_COLUMNS = ['id', 'puzzle_id', 'name', 'status', 'step_count', 'total_ms', 'version', 'created_by', 'created_at', 'updated_at'] as const

const toColumns = (db: Db, fields: OutlineFields) => ({ ...fields, document: db.raw('?::jsonb', [JSON.stringify(fields.document)]) })

/** Summaries without the documents, oldest first (the order the takes were made). */
export function listOutlines(db: Db, puzzleId: number): Promise<OutlineSummaryRow[]> {
  return db('outlines').where({ puzzle_id: puzzleId }).orderBy('id').select(...SUMMARY_COLUMNS)
}

export function countOutlines(db: Db, puzzleId: number): Promise<number> {
  return db('outlines').where({ puzzle_id: puzzleId }).count({ n: '*' }).then(([r]) => Number(r?.n ?? 0))
}

/** An outline only when its puzzle belongs to the channel. */
export function findOutline(db: Db, channelId: number, outlineId: number): Promise<OutlineRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first('outlines.*')
}

/** When an outline was last saved, for its ETag; one indexed look-up that also checks the channel. */
export function findOutlineStamp(db: Db, channelId: number, outlineId: number): Promise<Pick<OutlineRow, 'version' | 'updated_at'> | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first('outlines.version', 'outlines.updated_at')
}

/** An outline whose document is the JSON text PostgreSQL prints, not parsed, for whoever only passes it on. */
export type OutlineTextRow = OutlineSummaryRow & { document: string }

/** An outline with its document as JSON text, only when its puzzle belongs to the channel. */
export function findOutlineText(db: Db, channelId: number, outlineId: number): Promise<OutlineTextRow | undefined> {
  return db('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('outlines.id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first<OutlineTextRow | undefined>(...SUMMARY_COLUMNS.map((c) => `outlines.${c}`), db.raw('outlines.document::text as document'))
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
    .first<OutlineExportRow | undefined>('outlines.name', db.raw("outlines.document ->> 'title' as title"), db.raw('outlines.document::text as document'))
}

export async function insertOutline(db: Db, puzzleId: number, createdBy: number | null, fields: OutlineFields): Promise<OutlineRow> {
  const [row] = await db('outlines')
    .insert({ ...toColumns(db, fields), puzzle_id: puzzleId, created_by: createdBy })
    .returning('*')
  return row as OutlineRow
}

/** A save's new script: the document with the engine's part as the client sent it back, and what follows from it. */
export interface ScriptSave {
  /** a new name, or undefined to keep the stored one */
  name: string | undefined
  total_ms: number
  document: Outline
}

/**
 * Saves over `version` in one statement, only when the document's engine part (status, puzzle, steps)
 * equals the stored one. PostgreSQL compares them, so the stored document is never sent here or parsed,
 * and its steps are kept as stored. Undefined when nothing was written: the outline is missing or in
 * another channel, someone saved a newer version first, or the engine part differs.
 */
export async function saveScript(db: Db, channelId: number, outlineId: number, version: number, save: ScriptSave): Promise<OutlineSummaryRow | undefined> {
  const { steps, ...script } = save.document
  const [row] = await db('outlines')
    .where({ id: outlineId, version, status: script.status })
    .whereIn('puzzle_id', db('puzzles').select('id').where({ channel_id: channelId }))
    .whereRaw("document -> 'puzzle' = ?::jsonb", [JSON.stringify(script.puzzle)])
    .whereRaw("document -> 'steps' = ?::jsonb", [JSON.stringify(steps)])
    .update({
      document: db.raw("jsonb_set(?::jsonb, '{steps}', document -> 'steps')", [JSON.stringify(script)]),
      ...(save.name === undefined ? {} : { name: save.name }),
      total_ms: save.total_ms,
      version: version + 1,
      updated_at: db.fn.now(),
    })
    .returning(SUMMARY_COLUMNS)
  return row as OutlineSummaryRow | undefined
}

/** Saves over `version`; undefined when the row is gone or someone saved a newer version first. */
export async function updateOutline(db: Db, outlineId: number, version: number, fields: OutlineFields): Promise<OutlineRow | undefined> {
  const [row] = await db('outlines')
    .where({ id: outlineId, version })
    .update({ ...toColumns(db, fields), version: version + 1, updated_at: db.fn.now() })
    .returning('*')
  return row as OutlineRow | undefined
}

export async function deleteOutline(db: Db, outlineId: number): Promise<boolean> {
  return (await db('outlines').where({ id: outlineId }).delete()) > 0
}
