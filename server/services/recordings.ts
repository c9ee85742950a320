import type { Readable } from 'node:stream'
import type { MediaLink, Peaks, Recording, RecordingUpdate } from '../../shared/schemas/recording'
import { requireChannelAccess } from '../auth/channel-access'
import type { MediaTokens } from '../auth/media-tokens'
import type { Db } from '../db/knex'
import { findOutlineStamp } from '../db/outlines'
import { findUserById } from '../db/users'
import { deleteRecording, findPeaks, findRecording, insertRecording, listPreparing, listRecordings, makeCurrent, renameRecording, savePeaks, type RecordingListRow } from '../db/recordings'
import { HttpError, notFound } from '../errors'
import type { AppLogger } from '../logger'
import { computePeaks } from '../media/peaks'
import { probeMedia } from '../media/probe'
import { MediaToolError } from '../media/run-tool'
import type { ByteRange, Storage } from '../storage'
import type { StoredUpload } from '../uploads/receiver'
import { playbackOnUpload, preparePlayback } from './playback'
import { takeRecorded } from './pipeline'

export interface RecordingDeps {
  db: Db
  storage: Storage
  logger: AppLogger
}

// 25 slices a second: a word's shape shows when zoomed in, and an hour is 90,000 numbers (about half a MB of JSON)
const PEAKS_PER_SECOND = 25

/** The file a recording plays from. */
interface RecordingFile {
  mime: string
  sizeBytes: number
  open: (range?: ByteRange) => Promise<Readable>
}

/** A take's recordings, newest first. */
export async function recordingsOf({ db }: RecordingDeps, channelId: number, outlineId: number): Promise<Recording[]> {
  await requireOutline(db, channelId, outlineId)
  return (await listRecordings(db, outlineId)).map(toRecording)
}

/**
 * Files an uploaded recording under the take: reads its duration and streams, makes a browser-playable
 * copy when a quick one will do (a transcode is made after the answer: see ./playback), and stores the row;
 * whatever fails, the stored files go again. The waveform peaks are worked out after the answer too.
 */
export async function addRecording(deps: RecordingDeps, channelId: number, outlineId: number, upload: StoredUpload | undefined, user: Express.User): Promise<Recording> {
  if (!upload) throw new HttpError(400, 'no-file', 'Attach the recording as the form field "file".')
  let copyKey: string | undefined
  try {
    await requireOutline(deps.db, channelId, outlineId)
    const { facts, playback } = await deps.storage.withLocalFile(upload.key, async (path) => {
      const facts = await probeMedia(path)
      return { facts, playback: await playbackOnUpload(deps.storage, path, upload.key, facts) }
    })
    const kept = playback.kind === 'copied' ? playback.copy : { key: upload.key, mime: upload.mime, sizeBytes: upload.sizeBytes, facts }
    copyKey = playback.kind === 'copied' ? kept.key : undefined
    const id = await insertRecording(deps.db, {
      outline_id: outlineId,
      storage_key: kept.key,
      original_name: upload.originalName.slice(0, 255),
      mime: kept.mime,
      kind: facts.kind,
      size_bytes: kept.sizeBytes,
      duration_ms: kept.facts.durationMs,
      facts: kept.facts.facts,
      uploaded_by: user.id,
      playback: playback.kind === 'transcode-later' ? 'preparing' : 'ready',
    })
    if (copyKey) await upload.discard()
    const row = (await findRecording(deps.db, channelId, outlineId, id))!
    void afterUpload(deps, row)
    // the recording is kept whatever happens to the take's stage: a failed move is only logged
    await takeRecorded(deps.db, channelId, outlineId, user).catch((error: unknown) => deps.logger.warn({ err: error, outlineId }, 'the take could not be marked recorded'))
    return toRecording(row)
  } catch (error) {
    await Promise.all([upload.discard(), copyKey !== undefined && deps.storage.remove(copyKey)])
    throw error instanceof MediaToolError && !error.message.includes('not installed')
      ? new HttpError(415, 'unreadable-media', `"${upload.originalName}" could not be read as audio or video. Nothing was kept.`)
      : error
  }
}

/** What follows an upload's answer: the transcoded copy when one is due, then the waveform from the file that stays. */
async function afterUpload(deps: RecordingDeps, row: RecordingListRow): Promise<void> {
  const playable = row.playback === 'preparing' ? await preparePlayback(deps, row) : row
  if (playable) await workOutPeaks(deps, playable)
}

/** Goes on with the copies a stopped server was making; called once as the server starts. */
export async function resumePlaybackPreparation(deps: RecordingDeps): Promise<void> {
  for (const row of await listPreparing(deps.db)) await afterUpload(deps, row)
}

/** Computes and stores a recording's peaks; a failure is logged, and the waveform stays "being worked out". */
async function workOutPeaks({ db, storage, logger }: RecordingDeps, row: RecordingListRow): Promise<void> {
  try {
    const peaks = hasSound(row)
      ? await storage.withLocalFile(row.storage_key, (path) => computePeaks(path, { perSecond: PEAKS_PER_SECOND }))
      : silentPeaks(row.duration_ms ?? 0)
    // a recording deleted meanwhile has nowhere to keep them, and needs none; checked by file, not by id
    // alone, so peaks worked out late never land on another recording that came to have the same id
    await savePeaks(db, row.id, row.storage_key, peaks)
  } catch (error) {
    logger.warn({ err: error, recordingId: row.id }, 'waveform peaks could not be worked out')
  }
}

// the probe names an audio codec for every file with a sound track; audio recordings have one by definition
const hasSound = (row: RecordingListRow): boolean => row.kind === 'audio' || typeof row.facts.audioCodec === 'string'

/** A flat waveform as long as the recording: a video without sound still gets one, so the screen stops waiting for it. */
function silentPeaks(durationMs: number): Peaks {
  return { durationMs, perSecond: PEAKS_PER_SECOND, peaks: new Array<number>(Math.ceil((durationMs * PEAKS_PER_SECOND) / 1000)).fill(0) }
}

/** Renames a recording or makes it the take's current one. */
export async function updateRecording({ db }: RecordingDeps, channelId: number, outlineId: number, recordingId: number, update: RecordingUpdate): Promise<Recording> {
  await existing(db, channelId, outlineId, recordingId)
  if (update.name !== undefined) await renameRecording(db, recordingId, update.name)
  if (update.current) await makeCurrent(db, outlineId, recordingId)
  return toRecording(await existing(db, channelId, outlineId, recordingId))
}

/** Deletes the row first, then the file: a failure in between leaves a file nobody points at, never a row without its file. */
export async function removeRecording({ db, storage }: RecordingDeps, channelId: number, outlineId: number, recordingId: number): Promise<void> {
  await existing(db, channelId, outlineId, recordingId)
  const key = await deleteRecording(db, recordingId)
  if (key === undefined) throw notFound('Recording')
  await storage.remove(key)
}

/** The stored file to play, read in whatever range the player asks for. */
export async function recordingFileOf({ db, storage }: RecordingDeps, channelId: number, outlineId: number, recordingId: number): Promise<RecordingFile> {
  return fileOf(storage, await existing(db, channelId, outlineId, recordingId))
}

/**
 * A playback link to the recording for a media element, which can't send the session's token: it names the
 * recording and the user, and is good while that user stays signed in and may read the recording, for a few hours.
 */
export async function mediaLinkOf({ db }: RecordingDeps, tokens: MediaTokens, channelId: number, outlineId: number, recordingId: number, user: Express.User): Promise<MediaLink> {
  await existing(db, channelId, outlineId, recordingId)
  const tokenVersion = (await findUserById(db, user.id))?.token_version ?? 0
  const { token, expiresAt } = tokens.issue({ userId: user.id, tokenVersion, channelId, outlineId, recordingId })
  return { url: `/api/media/${token}`, expiresAt: expiresAt.toISOString() }
}

/** The stored file a playback link names, when the link still holds: unexpired, its user still signed in and still allowed. */
export async function recordingFileByLink({ db, storage }: RecordingDeps, tokens: MediaTokens, token: string): Promise<RecordingFile> {
  const reading = tokens.read(token)
  if ('problem' in reading) {
    throw reading.problem === 'expired'
      ? new HttpError(401, 'media-link-expired', 'This playback link has expired. Open the recording in Gridcue again for a new one.')
      : new HttpError(404, 'not-found', 'This playback link is not valid. Open the recording in Gridcue again for a new one.')
  }
  const { userId, tokenVersion, channelId, outlineId, recordingId } = reading.grant
  if ((await findUserById(db, userId))?.token_version !== tokenVersion) {
    throw new HttpError(401, 'media-link-ended', 'This playback link ended when its owner signed out. Sign in and open the recording again.')
  }
  await requireChannelAccess(db, userId, channelId, 'recording.read')
  return fileOf(storage, await existing(db, channelId, outlineId, recordingId))
}

async function fileOf(storage: Storage, row: RecordingListRow): Promise<RecordingFile> {
  if (row.playback === 'preparing') {
    throw new HttpError(409, 'playback-preparing', 'This recording is still being converted into a file browsers can play. Try again in a few minutes.')
  }
  if (row.playback === 'failed') throw new HttpError(409, 'playback-failed', row.playback_note ?? "Browsers can't play this recording, and converting it failed.")
  // asked before the reply starts: a lost file (a store emptied by hand, a restore without its files) is a plain 404
  if ((await storage.size(row.storage_key)) === null) {
    throw new HttpError(404, 'file-missing', "The recording's file is missing from storage. Upload the recording again, or delete this entry.")
  }
  return { mime: row.mime, sizeBytes: Number(row.size_bytes), open: (range) => storage.get(row.storage_key, range) }
}

export async function peaksOf({ db }: RecordingDeps, channelId: number, outlineId: number, recordingId: number): Promise<Peaks> {
  await existing(db, channelId, outlineId, recordingId)
  const peaks = await findPeaks(db, recordingId)
  if (!peaks) throw new HttpError(404, 'peaks-not-ready', "This recording's waveform is still being worked out. Try again in a moment.")
  return peaks
}

async function requireOutline(db: Db, channelId: number, outlineId: number): Promise<void> {
  if (!(await findOutlineStamp(db, channelId, outlineId))) throw notFound('Outline')
}

async function existing(db: Db, channelId: number, outlineId: number, recordingId: number): Promise<RecordingListRow> {
  const row = await findRecording(db, channelId, outlineId, recordingId)
  if (!row) throw notFound('Recording')
  return row
}

const toRecording = (row: RecordingListRow): Recording => ({
  id: row.id,
  outlineId: row.outline_id,
  name: row.original_name,
  mime: row.mime,
  kind: row.kind,
  sizeBytes: Number(row.size_bytes),
  durationMs: row.duration_ms,
  current: row.is_current,
  hasPeaks: row.has_peaks,
  playback: row.playback,
  ...(row.playback_note ? { playbackNote: row.playback_note } : {}),
  uploadedBy: row.uploader_name ?? 'a former member',
  uploadedAt: row.created_at.toISOString(),
})
