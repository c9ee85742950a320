import { randomUUID } from 'node:crypto'
import type { AlignmentMethod, AlignmentRun } from '../../shared/schemas/recording'
import { captionWords, CaptionFileError } from '../captions/caption-words'
import { cancelRun, deleteRun, failSilentRuns, findRun, insertRun, listRuns, type AlignmentRunSummaryRow } from '../db/alignment-runs'
import type { Db } from '../db/knex'
import { findRecording } from '../db/recordings'
import { HttpError, notFound } from '../errors'
import type { AlignmentQueue } from '../jobs'

/** Where a recording sits: its channel, its take and its own id, as the route's path names them. */
export interface RecordingPath {
  channelId: number
  outlineId: number
  recordingId: number
}

export interface AlignmentRequest {
  method: AlignmentMethod
  /** the caption file's text, for the caption method */
  captionText: string | undefined
}

/** Queues a run for the recording; a caption file is read here first, so a file that isn't one is refused at once. */
export async function startAlignment(db: Db, queue: AlignmentQueue, path: RecordingPath, request: AlignmentRequest, user: Express.User): Promise<AlignmentRun> {
  await requireRecording(db, path)
  if (request.method === 'audio' && request.captionText !== undefined) {
    throw new HttpError(400, 'unexpected-file', 'An alignment from the audio takes no file: send only the method, "audio".')
  }
  const captionText = request.method === 'captions' ? checkedCaptions(request.captionText) : null
  const jobId = randomUUID()
  const run = await insertRun(db, { recording_id: path.recordingId, method: request.method, job_id: jobId, caption_text: captionText, created_by: user.id })
  try {
    await queue.enqueue(jobId, run.id)
  } catch (error) {
    // a run no job will ever work must not sit in the list as queued
    await deleteRun(db, run.id)
    throw error
  }
  return toAlignmentRun(run)
}

// A working job touches its run twice a second; a minute of silence means its worker is gone.
const SILENT_RUN_MS = 60_000
const WORKER_GONE = 'The alignment stopped: the process working on it ended unexpectedly. Start it again.'

/** The recording's runs, newest first. */
export async function alignmentsOf(db: Db, path: RecordingPath): Promise<AlignmentRun[]> {
  await requireRecording(db, path)
  await failSilentRuns(db, path.recordingId, SILENT_RUN_MS, WORKER_GONE)
  return (await listRuns(db, path.recordingId)).map(toAlignmentRun)
}

export async function alignmentOf(db: Db, path: RecordingPath, runId: number): Promise<AlignmentRun> {
  await requireRecording(db, path)
  await failSilentRuns(db, path.recordingId, SILENT_RUN_MS, WORKER_GONE)
  const run = await findRun(db, path.recordingId, runId)
  if (!run) throw notFound('Alignment run')
  return toAlignmentRun(run)
}

/**
 * Cancels a run that has not finished: a queued one never starts, a running one stops its recogniser
 * within about half a second (the job watches its row). A finished run is answered as it is.
 */
export async function cancelAlignment(db: Db, queue: AlignmentQueue, path: RecordingPath, runId: number): Promise<AlignmentRun> {
  await requireRecording(db, path)
  const cancelled = await cancelRun(db, path.recordingId, runId)
  if (cancelled) {
    await queue.drop(cancelled.job_id)
    return toAlignmentRun(cancelled)
  }
  return alignmentOf(db, path, runId)
}

async function requireRecording(db: Db, { channelId, outlineId, recordingId }: RecordingPath): Promise<void> {
  if (!(await findRecording(db, channelId, outlineId, recordingId))) throw notFound('Recording')
}

function checkedCaptions(text: string | undefined): string {
  if (text === undefined) throw new HttpError(400, 'caption-file-missing', 'Attach the caption file (WebVTT or SRT) in the form field "file".')
  let words
  try {
    words = captionWords(text)
  } catch (error) {
    if (error instanceof CaptionFileError) throw new HttpError(400, 'not-captions', error.message)
    throw error
  }
  if (words.length === 0) throw new HttpError(400, 'no-caption-words', 'The caption file has no spoken words in it, so there is nothing to align the lines to.')
  return text
}

function toAlignmentRun(row: AlignmentRunSummaryRow): AlignmentRun {
  return {
    id: row.id,
    recordingId: row.recording_id,
    method: row.method,
    state: row.state,
    progress: row.progress,
    proposals: row.proposals,
    unplaced: row.unplaced,
    error: row.error,
    createdAt: row.created_at.toISOString(),
  }
}
