import type { Peaks } from '../../shared/schemas/recording'
import type { Db } from './knex'
import type { RecordingRow } from './tables'

/** A recording without its peaks (they can be large), with whether they are ready and who uploaded it. */
export type RecordingListRow = Omit<RecordingRow, 'peaks'> & { has_peaks: boolean; uploader_name: string | null }

type RecordingFields = Pick<RecordingRow, 'outline_id' | 'storage_key' | 'original_name' | 'mime' | 'kind' | 'duration_ms' | 'facts' | 'uploaded_by'> & {
  size_bytes: number
  /** 'ready' when absent */
  playback?: RecordingRow['playback']
}

/** What a browser-playable copy changes in the row: the file and what was read from it. */
type PlayableCopy = Pick<RecordingRow, 'storage_key' | 'mime' | 'duration_ms' | 'facts'> & { size_bytes: number }

const LIST_COLUMNS = [
  'recordings.id',
  'recordings.outline_id',
  'recordings.storage_key',
  'recordings.original_name',
  'recordings.mime',
  'recordings.kind',
  'recordings.size_bytes',
  'recordings.duration_ms',
  'recordings.facts',
  'recordings.playback',
  'recordings.playback_note',
  'recordings.is_current',
  'recordings.uploaded_by',
  'recordings.created_at',
  'users.name as uploader_name',
] as const

const listed = (db: Db) =>
  db('recordings')
    .leftJoin('users', 'users.id', 'recordings.uploaded_by')
    .select<RecordingListRow[]>(...LIST_COLUMNS, db.raw('recordings.peaks is not null as has_peaks'))

/** A take's recordings, newest first. */
export function listRecordings(db: Db, outlineId: number): Promise<RecordingListRow[]> {
  return listed(db).where('recordings.outline_id', outlineId).orderBy('recordings.created_at', 'desc').orderBy('recordings.id', 'desc')
}

/** A recording only when it belongs to the take and the take to the channel, so other channels' ids read as missing. */
export function findRecording(db: Db, channelId: number, outlineId: number, recordingId: number): Promise<RecordingListRow | undefined> {
  return listed(db)
    .join('outlines', 'outlines.id', 'recordings.outline_id')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('recordings.id', recordingId)
    .andWhere('recordings.outline_id', outlineId)
    .andWhere('puzzles.channel_id', channelId)
    .first()
}

/** A recording's peaks: undefined when the recording is not there, null while they are not worked out yet. */
export async function findPeaks(db: Db, recordingId: number): Promise<Peaks | null | undefined> {
  const row = await db('recordings').where({ id: recordingId }).first('peaks')
  return row?.peaks
}

const UNIQUE_VIOLATION = '23505'

/** Stores a recording; the take's first becomes its current one. */
export async function insertRecording(db: Db, fields: RecordingFields): Promise<number> {
  const values = { ...fields, size_bytes: String(fields.size_bytes), facts: db.raw('?::jsonb', [JSON.stringify(fields.facts)]) }
  const noneCurrent = db.raw('not exists (select 1 from recordings where outline_id = ? and is_current)', [fields.outline_id])
  try {
    const [row] = await db('recordings').insert({ ...values, is_current: noneCurrent }).returning('id')
    return row!.id
  } catch (error) {
    // two first uploads at once: the one index allowing a single current recording took the other, so this one is not current
    if ((error as { code?: string }).code !== UNIQUE_VIOLATION) throw error
    const [row] = await db('recordings').insert({ ...values, is_current: false }).returning('id')
    return row!.id
  }
}

export async function renameRecording(db: Db, recordingId: number, name: string): Promise<void> {
  await db('recordings').where({ id: recordingId }).update({ original_name: name })
}

/** Moves the take's current mark to this recording. */
export function makeCurrent(db: Db, outlineId: number, recordingId: number): Promise<void> {
  // two statements: PostgreSQL checks the one-current index row by row, so the old mark must go first
  return db.transaction(async (trx) => {
    await trx('recordings').where({ outline_id: outlineId, is_current: true }).whereNot({ id: recordingId }).update({ is_current: false })
    await trx('recordings').where({ id: recordingId, outline_id: outlineId }).update({ is_current: true })
  })
}

/** Deletes a recording's row; when it was current, the newest remaining one becomes current. Answers its storage key. */
export function deleteRecording(db: Db, recordingId: number): Promise<string | undefined> {
  return db.transaction(async (trx) => {
    const [gone] = await trx('recordings').where({ id: recordingId }).delete().returning(['storage_key', 'outline_id', 'is_current'])
    if (gone?.is_current) {
      const newest = trx('recordings').where({ outline_id: gone.outline_id }).orderBy('created_at', 'desc').orderBy('id', 'desc').first('id')
      await trx('recordings').whereIn('id', newest).update({ is_current: true })
    }
    return gone?.storage_key
  })
}

/** Stores peaks worked out from the file at `storageKey`, only while the row still holds that file; false otherwise. */
export async function savePeaks(db: Db, recordingId: number, storageKey: string, peaks: Peaks): Promise<boolean> {
  return (await db('recordings').where({ id: recordingId, storage_key: storageKey }).update({ peaks: db.raw('?::jsonb', [JSON.stringify(peaks)]) })) > 0
}

/** Recordings whose browser-playable copy is still to be made (after a restart, those a stopped server was making). */
export function listPreparing(db: Db): Promise<RecordingListRow[]> {
  return listed(db).where('recordings.playback', 'preparing').orderBy('recordings.id')
}

/**
 * Points the row at its browser-playable copy, only while it still holds the uploaded file `fromKey`;
 * false when the recording was deleted meanwhile (the copy then belongs to nobody).
 */
export async function finishPlayback(db: Db, recordingId: number, fromKey: string, copy: PlayableCopy): Promise<boolean> {
  const changed = await db('recordings')
    .where({ id: recordingId, storage_key: fromKey })
    .update({ ...copy, size_bytes: String(copy.size_bytes), facts: db.raw('?::jsonb', [JSON.stringify(copy.facts)]), playback: 'ready', playback_note: null })
  return changed > 0
}

export async function failPlayback(db: Db, recordingId: number, fromKey: string, note: string): Promise<void> {
  await db('recordings').where({ id: recordingId, storage_key: fromKey }).update({ playback: 'failed', playback_note: note })
}
