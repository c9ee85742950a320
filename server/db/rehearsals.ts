import type { RehearsedLine } from '../../shared/schemas/rehearsal'
import type { Db } from './knex'
import type { RehearsalRow } from './tables'

/** A run with its presenter's name (null once they have left). */
export type RehearsalListRow = RehearsalRow & { presenter_name: string | null }

const listed = (db: Db) => db('rehearsals').leftJoin('users', 'users.id', 'rehearsals.presenter_id').select<RehearsalListRow[]>('rehearsals.*', 'users.name as presenter_name')

/** A take's runs, newest first. */
export function listRehearsals(db: Db, outlineId: number): Promise<RehearsalListRow[]> {
  return listed(db).where('rehearsals.outline_id', outlineId).orderBy('rehearsals.created_at', 'desc').orderBy('rehearsals.id', 'desc')
}

export function findRehearsal(db: Db, outlineId: number, rehearsalId: number): Promise<RehearsalListRow | undefined> {
  return listed(db).where('rehearsals.outline_id', outlineId).andWhere('rehearsals.id', rehearsalId).first()
}

export async function insertRehearsal(db: Db, fields: Pick<RehearsalRow, 'outline_id' | 'presenter_id' | 'name' | 'speech_ms'> & { lines: RehearsedLine[] }): Promise<number> {
  const [row] = await db('rehearsals')
    .insert({ ...fields, lines: db.raw('?::jsonb', [JSON.stringify(fields.lines)]) })
    .returning('id')
  return row!.id
}

export async function deleteRehearsal(db: Db, outlineId: number, rehearsalId: number): Promise<boolean> {
  return (await db('rehearsals').where({ id: rehearsalId, outline_id: outlineId }).delete()) > 0
}

/** Every timed line one presenter saved in a channel's takes, breaks included (the caller leaves them out). */
export async function presenterLines(db: Db, channelId: number, presenterId: number): Promise<RehearsedLine[]> {
  const rows = await db('rehearsals')
    .join('outlines', 'outlines.id', 'rehearsals.outline_id')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('rehearsals.presenter_id', presenterId)
    .andWhere('puzzles.channel_id', channelId)
    .select('rehearsals.lines')
  return rows.flatMap((r) => r.lines)
}
