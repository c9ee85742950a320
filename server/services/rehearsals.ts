import { calibrate, lineWork } from '../../shared/rehearsal/calibrate'
import { READ_ALOUD_MAX_LINES, BREAK_MS, type Calibration, type ReadAloudRequest, type RehearsalCreate, type RehearsalList, type RehearsalRun } from '../../shared/schemas/rehearsal'
import type { Outline } from '../../shared/schemas/outline'
import type { Db } from '../db/knex'
import { findOutline, outlineOf } from '../db/outlines'
import { deleteRehearsal, findRehearsal, insertRehearsal, listRehearsals, presenterLines, type RehearsalListRow } from '../db/rehearsals'
import { findUserById } from '../db/users'
import { HttpError, notFound } from '../errors'
import { MediaToolError } from '../media/run-tool'
import { speakToWav } from '../media/speak'

/** A take's runs, newest first, and the calibrated timing of its presenter. */
export async function rehearsalsOf(db: Db, channelId: number, outlineId: number, user: Express.User): Promise<RehearsalList> {
  await requireOutline(db, channelId, outlineId)
  const rows = await listRehearsals(db, outlineId)
  return { runs: rows.map(toRun), calibration: await calibrationFor(db, channelId, presenterOf(rows, user)) }
}

/**
 * Saves a run: each line's time as measured, marked a break when it ran past BREAK_MS, and what the line asked
 * of the presenter as the take stands now (so the calibration keeps meaning once the script is edited).
 */
export async function addRehearsal(db: Db, channelId: number, outlineId: number, body: RehearsalCreate, user: Express.User): Promise<RehearsalRun> {
  const outline = await requireOutline(db, channelId, outlineId)
  const byId = new Map(outline.lines.map((l) => [l.id, l]))
  const seen = new Set<number>()
  const lines = body.lines.map(({ lineId, ms }) => {
    const line = byId.get(lineId)
    if (!line) throw new HttpError(400, 'unknown-line', `Line ${lineId} is not in this take (it may have been removed since the run began). Nothing was saved.`)
    if (seen.has(lineId)) throw new HttpError(400, 'repeated-line', `Line ${lineId} is timed twice in this run; a run times each line once. Nothing was saved.`)
    seen.add(lineId)
    return { lineId, ms, isBreak: ms > BREAK_MS, work: lineWork(outline, line) }
  })
  const id = await insertRehearsal(db, {
    outline_id: outlineId,
    presenter_id: user.id,
    name: body.name,
    lines,
    speech_ms: lines.reduce((sum, l) => sum + (l.isBreak ? 0 : l.ms), 0),
  })
  return toRun((await findRehearsal(db, outlineId, id))!)
}

/** Discards a run. Anyone who rehearses the take may: the team shares its runs. */
export async function removeRehearsal(db: Db, channelId: number, outlineId: number, rehearsalId: number): Promise<void> {
  await requireOutline(db, channelId, outlineId)
  if (!(await deleteRehearsal(db, outlineId, rehearsalId))) throw notFound('Rehearsal run')
}

/**
 * A stretch of the script read aloud by espeak-ng at the presenter's pace, as a WAV file: for hearing the
 * rhythm of the lines, never a voice for the video. Hidden lines are left out, as in the video.
 */
export async function readAloud(db: Db, channelId: number, outlineId: number, body: ReadAloudRequest, user: Express.User): Promise<Buffer> {
  const outline = await requireOutline(db, channelId, outlineId)
  const from = outline.lines.findIndex((l) => l.id === body.fromLineId)
  const to = outline.lines.findIndex((l) => l.id === body.toLineId)
  if (from < 0 || to < 0) throw new HttpError(400, 'unknown-line', `Line ${from < 0 ? body.fromLineId : body.toLineId} is not in this take.`)
  if (from > to) throw new HttpError(400, 'backwards-range', 'The stretch must start at or before its last line.')
  if (to - from + 1 > READ_ALOUD_MAX_LINES) {
    throw new HttpError(400, 'range-too-long', `A preview reads at most ${READ_ALOUD_MAX_LINES} lines at a time; choose a shorter stretch.`)
  }
  const text = outline.lines
    .slice(from, to + 1)
    .filter((l) => !l.hidden)
    .map((l) => l.text)
    .join('\n\n')
  if (!text.trim()) throw new HttpError(400, 'nothing-to-read', 'Every line in that stretch is hidden, so there is nothing to read.')
  const pace = body.pace ?? (await calibrationFor(db, channelId, presenterOf(await listRehearsals(db, outlineId), user)))?.pace ?? outline.pace
  try {
    return await speakToWav(text, pace)
  } catch (error) {
    if (error instanceof MediaToolError) throw new HttpError(503, 'preview-unavailable', `The read-aloud preview can't be made on this server: ${error.message}`)
    if (error instanceof DOMException && error.name === 'TimeoutError') {
      throw new HttpError(503, 'preview-timeout', 'Making the read-aloud preview took too long. Try a shorter stretch.')
    }
    throw error
  }
}

/** Whose timing a take's estimates use: who saved its latest run; for a take nobody has rehearsed yet, the caller. */
function presenterOf(rows: RehearsalListRow[], user: Express.User): number {
  return rows.find((r) => r.presenter_id !== null)?.presenter_id ?? user.id
}

async function calibrationFor(db: Db, channelId: number, presenterId: number): Promise<Calibration | null> {
  const lines = (await presenterLines(db, channelId, presenterId)).filter((l) => !l.isBreak)
  const model = calibrate(lines)
  if (!model) return null
  const presenter = await findUserById(db, presenterId)
  return { presenterId, presenterName: presenter?.name ?? 'a former member', ...model, lineCount: lines.length }
}

async function requireOutline(db: Db, channelId: number, outlineId: number): Promise<Outline> {
  const row = await findOutline(db, channelId, outlineId)
  if (!row) throw notFound('Outline')
  return outlineOf(row)
}

function toRun(row: RehearsalListRow): RehearsalRun {
  return {
    id: row.id,
    outlineId: row.outline_id,
    name: row.name,
    presenterId: row.presenter_id,
    presenterName: row.presenter_name ?? 'a former member',
    lines: row.lines,
    speechMs: row.speech_ms,
    createdAt: row.created_at.toISOString(),
  }
}
