import type { LineProposal } from '../../shared/schemas/recording'
import type { Db } from './knex'
import type { AlignmentRunRow } from './tables'

/** A run as the API shows it: the caption file stays in the database. */
export type AlignmentRunSummaryRow = Omit<AlignmentRunRow, 'caption_text'>

const SUMMARY_COLUMNS = ['id', 'recording_id', 'method', 'state', 'progress', 'proposals', 'unplaced', 'error', 'job_id', 'created_by', 'created_at', 'updated_at'] as const

type NewRun = Pick<AlignmentRunRow, 'recording_id' | 'method' | 'job_id' | 'caption_text' | 'created_by'>

export async function insertRun(db: Db, run: NewRun): Promise<AlignmentRunSummaryRow> {
  const [row] = await db('alignment_runs').insert(run).returning(SUMMARY_COLUMNS)
  return row as AlignmentRunSummaryRow
}

/** A recording's runs, newest first. */
export function listRuns(db: Db, recordingId: number): Promise<AlignmentRunSummaryRow[]> {
  return db('alignment_runs').where({ recording_id: recordingId }).orderBy('id', 'desc').select(...SUMMARY_COLUMNS)
}

/** A run only when it belongs to the recording. */
export function findRun(db: Db, recordingId: number, runId: number): Promise<AlignmentRunSummaryRow | undefined> {
  return db('alignment_runs').where({ id: runId, recording_id: recordingId }).first(...SUMMARY_COLUMNS)
}

/** A take's line as the aligner reads it. */
export interface SpokenLineRow {
  id: number
  text: string
  hidden: boolean
}

/** What a run aligns: its recording's stored file and the lines of the recording's take; undefined when the run is gone. */
export function findRunSubject(db: Db, runId: number): Promise<{ storage_key: string; lines: SpokenLineRow[] } | undefined> {
  return db('alignment_runs')
    .join('recordings', 'recordings.id', 'alignment_runs.recording_id')
    .join('outlines', 'outlines.id', 'recordings.outline_id')
    .where('alignment_runs.id', runId)
    .first<{ storage_key: string; lines: SpokenLineRow[] } | undefined>('recordings.storage_key', db.raw("outlines.script -> 'lines' as lines"))
}

export async function deleteRun(db: Db, runId: number): Promise<void> {
  await db('alignment_runs').where({ id: runId }).delete()
}

/** Cancels a run that has not finished; undefined when it had (or is not the recording's). */
export async function cancelRun(db: Db, recordingId: number, runId: number): Promise<AlignmentRunSummaryRow | undefined> {
  const [row] = await db('alignment_runs')
    .where({ id: runId, recording_id: recordingId })
    .whereIn('state', ['queued', 'running'])
    .update({ state: 'cancelled', updated_at: db.fn.now() })
    .returning(SUMMARY_COLUMNS)
  return row as AlignmentRunSummaryRow | undefined
}

/**
 * Marks a run as worked by `jobId`; undefined when the run is gone, cancelled, finished, or carried by
 * another job now. 'running' is claimable too: a worker that died mid-run leaves it so, and pg-boss retries.
 */
export async function claimRun(db: Db, runId: number, jobId: string): Promise<AlignmentRunRow | undefined> {
  const [row] = await db('alignment_runs')
    .where({ id: runId, job_id: jobId })
    .whereIn('state', ['queued', 'running'])
    .update({ state: 'running', progress: 0, error: null, updated_at: db.fn.now() })
    .returning('*')
  return row as AlignmentRunRow | undefined
}

/** Stores progress on a running run; false once it is no longer running (cancelled, or deleted with its recording). */
export async function reportProgress(db: Db, runId: number, progress: number): Promise<boolean> {
  const updated = await db('alignment_runs').where({ id: runId, state: 'running' }).update({ progress, updated_at: db.fn.now() })
  return updated > 0
}

/** The working job's sign of life on its run; false once the run is no longer running. */
export async function touchRun(db: Db, runId: number): Promise<boolean> {
  return (await db('alignment_runs').where({ id: runId, state: 'running' }).update({ updated_at: db.fn.now() })) > 0
}

/**
 * Fails the recording's running runs that gave no sign of life for `silentMs`: their worker died (a killed
 * process runs no handler, and pg-boss only retries the job hours later, when it expires).
 */
export async function failSilentRuns(db: Db, recordingId: number, silentMs: number, error: string): Promise<void> {
  await db('alignment_runs')
    .where({ recording_id: recordingId, state: 'running' })
    .andWhere('updated_at', '<', db.raw("now() - make_interval(secs => ?)", [silentMs / 1000]))
    .update({ state: 'failed', error, updated_at: db.fn.now() })
}

export async function finishRun(db: Db, runId: number, result: { proposals: LineProposal[]; unplaced: number[] }): Promise<void> {
  await db('alignment_runs')
    .where({ id: runId, state: 'running' })
    .update({
      state: 'done',
      progress: 1,
      proposals: db.raw('?::jsonb', [JSON.stringify(result.proposals)]),
      unplaced: db.raw('?::jsonb', [JSON.stringify(result.unplaced)]),
      updated_at: db.fn.now(),
    })
}

export async function failRun(db: Db, runId: number, error: string): Promise<void> {
  await db('alignment_runs').where({ id: runId, state: 'running' }).update({ state: 'failed', error, updated_at: db.fn.now() })
}

/** A running run waits again, from the start, for `jobId` (a retry of the same job, or a new job after a shutdown). */
export async function requeueRun(db: Db, runId: number, jobId: string): Promise<boolean> {
  const updated = await db('alignment_runs').where({ id: runId, state: 'running' }).update({ state: 'queued', progress: 0, job_id: jobId, updated_at: db.fn.now() })
  return updated > 0
}
