/**
 * Browser-playable copies of uploaded recordings. A copy that only moves the streams into a fresh container
 * takes a fraction of a second and is made before the upload is answered; one that must transcode runs
 * about as long as the recording, so it is made after the answer while the row says 'preparing', and the
 * uploaded file goes once the copy is in its place.
 */
import { createReadStream } from 'node:fs'
import { mkdtemp, rm, stat } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Db } from '../db/knex'
import { failPlayback, finishPlayback, type RecordingListRow } from '../db/recordings'
import type { AppLogger } from '../logger'
import { probeMedia, type MediaFacts } from '../media/probe'
import { planWebCopy, writeWebCopy, type WebCopyPlan } from '../media/remux'
import type { Storage } from '../storage'

interface PlayableCopy {
  facts: MediaFacts
  key: string
  mime: string
  sizeBytes: number
}

/** What the upload needs before it is answered: nothing, a quick copy (made here), or a transcode (made later). */
export type UploadPlayback = { kind: 'plays' } | { kind: 'copied'; copy: PlayableCopy } | { kind: 'transcode-later' }

export async function playbackOnUpload(storage: Storage, path: string, key: string, facts: MediaFacts): Promise<UploadPlayback> {
  if (!facts.needsRemux) return { kind: 'plays' }
  const plan = await planWebCopy(path)
  if (plan.transcoded) return { kind: 'transcode-later' }
  return { kind: 'copied', copy: await storeCopy(storage, path, key, plan) }
}

/**
 * Makes and stores the transcoded copy of a 'preparing' recording and points its row at it. Answers the row
 * as it now is, or null when the copy failed (the row then says why) or the recording was deleted meanwhile.
 */
export async function preparePlayback({ db, storage, logger }: { db: Db; storage: Storage; logger: AppLogger }, row: RecordingListRow): Promise<RecordingListRow | null> {
  const fromKey = row.storage_key
  let copy: PlayableCopy
  try {
    copy = await storage.withLocalFile(fromKey, async (path) => storeCopy(storage, path, fromKey, await planWebCopy(path)))
  } catch (error) {
    logger.warn({ err: error, recordingId: row.id }, 'a browser-playable copy could not be made')
    const reason = error instanceof Error ? error.message : String(error)
    await failPlayback(db, row.id, fromKey, `Browsers can't play this file as it was uploaded, and converting it failed: ${reason}`.slice(0, 1000))
    return null
  }
  const update = { storage_key: copy.key, mime: copy.mime, size_bytes: copy.sizeBytes, duration_ms: copy.facts.durationMs, facts: copy.facts.facts }
  if (!(await finishPlayback(db, row.id, fromKey, update))) {
    await storage.remove(copy.key)
    return null
  }
  await storage.remove(fromKey)
  return { ...row, ...update, size_bytes: String(copy.sizeBytes), playback: 'ready', playback_note: null }
}

async function storeCopy(storage: Storage, path: string, key: string, plan: WebCopyPlan): Promise<PlayableCopy> {
  const dir = await mkdtemp(join(tmpdir(), 'gridcue-remux-'))
  try {
    const out = join(dir, 'web')
    await writeWebCopy(path, out, plan)
    const copyKey = key.replace(/\.[^./]+$/, `-web.${EXTENSIONS[plan.mime] ?? 'bin'}`)
    await storage.put(copyKey, createReadStream(out), { contentType: plan.mime })
    return { facts: { ...(await probeMedia(out)), needsRemux: false }, key: copyKey, mime: plan.mime, sizeBytes: (await stat(out)).size }
  } finally {
    await rm(dir, { recursive: true, force: true })
  }
}

const EXTENSIONS: Record<string, string> = {
  'video/webm': 'webm',
  'video/mp4': 'mp4',
  'audio/webm': 'webm',
  'audio/mp4': 'm4a',
  'audio/mpeg': 'mp3',
  'audio/flac': 'flac',
}
