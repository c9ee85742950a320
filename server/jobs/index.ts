import type { Db } from '../db/knex'
import type { AppLogger } from '../logger'
import { alignmentJob, type WordSources } from './alignment-job'
import { createJobQueue, type AlignmentQueue, type JobAttempt } from './queue'

export type { WordSources } from './alignment-job'
export type { AlignmentQueue } from './queue'

export interface JobsOptions {
  url: string
  /** alignment jobs this process works at once; 0 when it only queues them (separate workers do the rest) */
  workers: number
  db: Db
  logger: AppLogger
  words: WordSources
  /** tests shorten these three; the defaults suit production */
  retryDelaySeconds?: number
  pollingIntervalSeconds?: number
  watchIntervalMs?: number
}

export interface Jobs {
  queue: AlignmentQueue
  /** takes no more jobs, stops the ones in hand (they are queued again) and closes the queue's connections */
  stop(): Promise<void>
}

// the database may be away when the process starts; the workers start when it answers
const START_RETRY_MS = 5000

/** The job queue, and this process's workers on it when `workers` > 0. Returns at once. */
export function startJobs({ url, workers, db, logger, words, retryDelaySeconds, pollingIntervalSeconds, watchIntervalMs }: JobsOptions): Jobs {
  const queue = createJobQueue({ url, retryDelaySeconds, pollingIntervalSeconds, logger })
  const deps = { db, queue, words, logger, watchIntervalMs }
  const shutdown = new AbortController()
  const inHand = new Set<Promise<void>>()
  let retry: NodeJS.Timeout | undefined

  const handle = (attempt: JobAttempt) => {
    const job = alignmentJob(deps, attempt, shutdown.signal)
    const done = () => void inHand.delete(job)
    inHand.add(job)
    job.then(done, done)
    return job
  }
  const begin = (): void =>
    void queue.work(workers, handle).catch((error: unknown) => {
      if (shutdown.signal.aborted) return
      logger.warn({ err: error }, 'the job queue could not start; trying again shortly')
      retry = setTimeout(begin, START_RETRY_MS)
    })
  if (workers > 0) begin()

  return {
    queue,
    async stop() {
      clearTimeout(retry)
      await queue.stopWorking()
      shutdown.abort()
      await Promise.allSettled(inHand)
      await queue.close()
    },
  }
}
