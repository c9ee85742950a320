import { extname } from 'node:path'
import { fileURLToPath } from 'node:url'
import { MessageChannel } from 'node:worker_threads'
import { Piscina } from 'piscina'
import type { HttpError } from '../errors'
import type { AppLogger } from '../logger'
import type { TaskMessage, ThreadData } from './pool-thread'

/** A job module's tasks: each export takes one input and returns (or resolves with) the result. */
type Tasks<J> = { [K in keyof J]: (input: never) => unknown }

export interface TaskPool<J extends Tasks<J>> {
  /** Runs an export of the job module in a thread; refusals are the HttpErrors given in the options. */
  run<K extends keyof J & string>(name: K, input: Parameters<J[K]>[0]): Promise<Awaited<ReturnType<J[K]>>>
  /** Stops the threads; the pool starts again if used afterwards. */
  destroy(): Promise<void>
}

export interface TaskPoolOptions {
  /** the job module, whose exports are the tasks (see besideThis) */
  job: URL
  /** what the pool is for, in the logs */
  label: string
  threads: number
  /** a task working longer is stopped and its thread ended; time waiting in the queue doesn't count */
  timeoutMs: number
  /** a thread beyond the first ends after this long without work */
  idleTimeoutMs?: number
  /** added to the threads' nice value (Linux), so their work yields the cores to requests */
  niceIncrement?: number
  logger: AppLogger
  /** the answer when a task hit the time limit */
  tooSlow: () => HttpError
  /** the answer when the queue is full */
  busy: () => HttpError
}

/** A module beside `base` with base's extension: .ts under tsx or vitest, .js if the server is ever compiled. */
export const besideThis = (name: string, base: string): URL => new URL(`${name}${extname(fileURLToPath(base))}`, base)

const THREAD_FILE = besideThis('./pool-thread', import.meta.url)
const TSX_PRELOAD = new URL('./register-tsx.mjs', import.meta.url)

/**
 * A pool of worker threads (piscina) for one job module. No thread starts until the first task, so an
 * app (or a test) that never uses the pool pays nothing; from then on one thread stays warm, and a thread
 * ended at the time limit is replaced in the background.
 */
export function createTaskPool<J extends Tasks<J>>(options: TaskPoolOptions): TaskPool<J> {
  const { job, label, threads, timeoutMs, idleTimeoutMs = 60_000, niceIncrement = 0, logger, tooSlow, busy } = options
  // beyond this many waiting tasks a caller is told to retry rather than wait behind everyone
  const maxQueue = Math.max(8, threads * threads)
  let pool: Piscina | undefined
  const start = () => {
    const created = new Piscina({
      filename: THREAD_FILE.href,
      workerData: { job: job.href } satisfies ThreadData,
      minThreads: 1,
      maxThreads: threads,
      idleTimeout: idleTimeoutMs,
      niceIncrement,
      // a TypeScript thread file needs tsx's loader in its thread; compiled JavaScript inherits the defaults
      execArgv: THREAD_FILE.pathname.endsWith('.ts') ? ['--import', TSX_PRELOAD.href] : undefined,
    })
    // a thread that fails outside a task (e.g. its file doesn't load) would otherwise crash the process
    created.on('error', (err) => logger.error({ err, pool: label }, 'worker thread failed'))
    return created
  }

  async function run(name: string, input: unknown): Promise<unknown> {
    pool ??= start()
    // piscina's own maxQueue never applies to tasks that carry an abort signal (they wait in a queue it doesn't count)
    if (pool.queueSize >= maxQueue) throw busy()
    // the thread says when the task begins; only then does the clock start
    const { port1: begun, port2: started } = new MessageChannel()
    const deadline = new AbortController()
    let timer: NodeJS.Timeout | undefined
    begun.once('message', () => {
      timer = setTimeout(() => deadline.abort(), timeoutMs)
    })
    try {
      return await pool.run({ name, input, started } satisfies TaskMessage, { signal: deadline.signal, transferList: [started] })
    } catch (error) {
      if (deadline.signal.aborted) {
        logger.warn({ pool: label, task: name, timeoutMs }, 'task stopped at its time limit')
        throw tooSlow()
      }
      throw error
    } finally {
      clearTimeout(timer)
      begun.close()
    }
  }

  return {
    run: run as TaskPool<J>['run'],
    async destroy() {
      const running = pool
      pool = undefined
      await running?.destroy()
    },
  }
}
