import { randomUUID } from 'node:crypto'
import { alignLines, type TimedWord } from '../../shared/align'
import type { LineProposal } from '../../shared/schemas/recording'
import { claimRun, failRun, findRunSubject, finishRun, requeueRun } from '../db/alignment-runs'
import type { Db } from '../db/knex'
import type { AlignmentRunRow } from '../db/tables'
import type { AppLogger } from '../logger'
import type { AlignmentQueue, JobAttempt } from './queue'
import { takeAlignedByRun } from '../services/pipeline'
import { watchRun } from './run-watch'

/** Where a run's timed words come from, one source per method. */
export interface WordSources {
  /** the words of a caption file's text */
  captions(captionText: string): TimedWord[]
  /** the words recognised in a stored recording, biased to the take's lines */
  audio(storageKey: string, lineTexts: string[], options: Progress): Promise<TimedWord[]>
  /** a sentence for people about a source's error, when it has one (a recording the recogniser could not read) */
  explain(error: unknown): string | undefined
}

interface Progress {
  signal: AbortSignal
  onProgress: (fraction: number) => void
}

export interface AlignmentJobDeps {
  db: Db
  queue: AlignmentQueue
  words: WordSources
  logger: AppLogger
  /** how often a running job writes progress and looks for a cancel; tests shorten it */
  watchIntervalMs?: number
}

// Recognition is nearly all of an audio run; matching the words to the lines is the rest.
const RECOGNITION_SHARE = 0.95

const FAILED = 'The alignment stopped because of a problem on our side, and trying again did not help. Start it again later; if it fails again, let us know.'

/**
 * Works one attempt at a run: words from the run's source, matched to the take's visible lines, stored
 * as proposals. A cancelled run stops within a watch interval, its recogniser aborted; a failure is thrown
 * for pg-boss to retry, and the last one marks the run failed with a sentence. A shutdown puts the run
 * back on the queue under a new job, so it costs no retry.
 */
export async function alignmentJob(deps: AlignmentJobDeps, attempt: JobAttempt, shutdown: AbortSignal): Promise<void> {
  const { db, logger } = deps
  const run = await claimRun(db, attempt.runId, attempt.jobId)
  if (!run) return
  const watch = watchRun(db, run.id, { intervalMs: deps.watchIntervalMs, onError: (error) => logger.warn({ err: error, runId: run.id }, 'alignment progress not written') })
  const signal = AbortSignal.any([watch.signal, shutdown])
  let result: Awaited<ReturnType<typeof proposalsFor>>
  try {
    result = await proposalsFor(deps, run, { signal, onProgress: (f) => watch.progress(f * RECOGNITION_SHARE) })
  } catch (error) {
    await watch.stop()
    // cancelled, or deleted with its recording: the row already says so (or is gone)
    if (watch.signal.aborted) return
    if (shutdown.aborted) return requeueAfterShutdown(deps, run.id)
    if (attempt.lastAttempt) {
      logger.error({ err: error, runId: run.id }, 'alignment failed')
      await failRun(db, run.id, deps.words.explain(error) ?? FAILED)
      return
    }
    logger.warn({ err: error, runId: run.id }, 'alignment attempt failed; pg-boss retries it')
    await requeueRun(db, run.id, attempt.jobId)
    throw error
  }
  await watch.stop()
  if (!result) return
  await finishRun(db, run.id, result)
  // the proposals are kept whatever happens to the take's stage: a failed move is only logged
  await takeAlignedByRun(db, run.id).catch((error: unknown) => logger.warn({ err: error, runId: run.id }, 'the take could not be marked aligned'))
}

/** The run's proposals; undefined when the run went away with its recording. */
async function proposalsFor({ db, words }: AlignmentJobDeps, run: AlignmentRunRow, progress: Progress): Promise<{ proposals: LineProposal[]; unplaced: number[] } | undefined> {
  const subject = await findRunSubject(db, run.id)
  if (!subject) return undefined
  // hidden lines are not spoken; the intro and the outro are
  const lines = subject.lines.filter((line) => !line.hidden).map(({ id, text }) => ({ lineId: id, text }))
  const timed = run.caption_text !== null ? words.captions(run.caption_text) : await words.audio(subject.storage_key, lines.map((line) => line.text), progress)
  progress.signal.throwIfAborted()
  return alignLines(lines, timed)
}

async function requeueAfterShutdown({ db, queue, logger }: AlignmentJobDeps, runId: number): Promise<void> {
  const jobId = randomUUID()
  if (await requeueRun(db, runId, jobId)) await queue.enqueue(jobId, runId)
  logger.info({ runId }, 'alignment interrupted by shutdown; queued again')
}
