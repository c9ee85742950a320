import PgBoss from 'pg-boss'
import type { AppLogger } from '../logger'

/** pg-boss's tables live in a schema of their own, beside the app's. */
const SCHEMA = 'pgboss'
const ALIGNMENT = 'alignment'

// A failed run is tried twice more, after about retryDelay and then twice that (pg-boss adds jitter).
const RETRY_LIMIT = 2
// An hour of recording takes about five minutes of recognition; past this a job is surely stuck, and
// pg-boss fails it (and retries) rather than leave it active for ever.
const EXPIRE_SECONDS = 3 * 3600

/** What the API needs of the queue: put a run's job on it, take a job off it. */
export interface AlignmentQueue {
  /** queues the job `jobId` for the run; the id is the caller's, so the run's row can name it before the job exists */
  enqueue(jobId: string, runId: number): Promise<void>
  /** the job will not start (a running one is stopped by its run's state, not here) */
  drop(jobId: string): Promise<void>
}

/** One attempt at a job, as a worker sees it. */
export interface JobAttempt {
  jobId: string
  runId: number
  /** no retry follows when this attempt fails */
  lastAttempt: boolean
}

export interface JobQueue extends AlignmentQueue {
  /** works alignment jobs, `count` at once, until `stopWorking`; a handler that throws has its job retried */
  work(count: number, handle: (attempt: JobAttempt) => Promise<void>): Promise<void>
  /** fetches no more jobs; jobs in hand go on until their handlers return */
  stopWorking(): Promise<void>
  /** waits (up to `graceMs`) for jobs in hand, then closes the connections */
  close(graceMs?: number): Promise<void>
}

export interface JobQueueOptions {
  url: string
  /** seconds before the first retry; each next waits about twice as long */
  retryDelaySeconds?: number
  /** how often an idle worker looks for jobs; a job queued by this process wakes its workers at once */
  pollingIntervalSeconds?: number
  logger: AppLogger
}

/**
 * The job queue on our PostgreSQL (pg-boss). Nothing connects until the first use, so an app that
 * never queues a job (a test that touches no recording) opens no connection for it.
 */
export function createJobQueue({ url, retryDelaySeconds = 10, pollingIntervalSeconds = 2, logger }: JobQueueOptions): JobQueue {
  const workerIds: string[] = []
  let opened: Promise<PgBoss> | undefined
  // a database that was away at the first use is tried again at the next, with a new instance: pg-boss
  // can't start again an instance whose start failed
  const ready = () =>
    (opened ??= open(url, logger).catch((error: unknown) => {
      opened = undefined
      throw error
    }))
  const ifOpened = async () => opened?.catch(() => undefined)

  return {
    async enqueue(jobId, runId) {
      const boss = await ready()
      await boss.send(ALIGNMENT, { runId }, { id: jobId, retryLimit: RETRY_LIMIT, retryDelay: retryDelaySeconds, retryBackoff: true, expireInSeconds: EXPIRE_SECONDS })
      for (const id of workerIds) boss.notifyWorker(id)
    },
    async drop(jobId) {
      await (await ready()).cancel(ALIGNMENT, jobId)
    },
    async work(count, handle) {
      const boss = await ready()
      for (let i = 0; i < count; i++) {
        const id = await boss.work<{ runId: number }>(ALIGNMENT, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds }, async ([job]) => {
          if (job) await handle({ jobId: job.id, runId: job.data.runId, lastAttempt: job.retryCount >= job.retryLimit })
        })
        workerIds.push(id)
      }
    },
    async stopWorking() {
      workerIds.length = 0
      await (await ifOpened())?.offWork(ALIGNMENT)
    },
    async close(graceMs = 10_000) {
      await (await ifOpened())?.stop({ graceful: true, timeout: graceMs, wait: true })
    },
  }
}

async function open(url: string, logger: AppLogger): Promise<PgBoss> {
  // schedule: false — no cron jobs here, so no clock-skew monitoring either
  const boss = new PgBoss({ connectionString: url, schema: SCHEMA, max: 4, schedule: false })
  boss.on('error', (error) => logger.error({ err: error }, 'job queue error'))
  try {
    await boss.start()
    await boss.createQueue(ALIGNMENT)
  } catch (error) {
    // closes the connection pool the failed start opened
    await boss.stop({ graceful: false }).catch(() => undefined)
    throw error
  }
  return boss
}
