import { extname } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Piscina } from 'piscina'
import type { Outline } from '../../shared/schemas/outline'
import { HttpError } from '../errors'
import type { AppLogger } from '../logger'
import type { NoOutline, OutlineTask, PuzzleInput, PuzzleVerdict } from './engine-task'

/** What services need from the engine: the same calls as engine-task.ts, asynchronous. */
export interface Engine {
  check(puzzle: PuzzleInput): Promise<PuzzleVerdict>
  outline(task: OutlineTask): Promise<Outline | NoOutline>
}

export interface EnginePool extends Engine {
  /** Stops the threads; the pool starts again if used afterwards. */
  destroy(): Promise<void>
}

export interface EnginePoolOptions {
  threads: number
  /** a task running longer is stopped (its thread is ended) */
  timeoutMs: number
  /** an idle thread ends after this long; the next task starts a new one */
  idleTimeoutMs?: number
  logger: AppLogger
}

// same extension as this file: .ts under tsx or vitest, .js if the server is ever compiled
const TASK_FILE = new URL(`./engine-task${extname(fileURLToPath(import.meta.url))}`, import.meta.url)
const TSX_PRELOAD = new URL('./register-tsx.mjs', import.meta.url)

/**
 * The engine's worker pool. No thread starts until the first task, so an app (or a test) that
 * never asks for the engine pays nothing.
 */
export function createEnginePool({ threads, timeoutMs, idleTimeoutMs = 60_000, logger }: EnginePoolOptions): EnginePool {
  let pool: Piscina | undefined
  const start = () => {
    const created = new Piscina({
      filename: TASK_FILE.href,
      minThreads: 0,
      maxThreads: threads,
      idleTimeout: idleTimeoutMs,
      // beyond this many waiting tasks a caller is told to retry rather than wait behind everyone
      maxQueue: Math.max(8, threads * threads),
      // a TypeScript task file needs tsx's loader in its thread; compiled JavaScript inherits the defaults
      execArgv: TASK_FILE.pathname.endsWith('.ts') ? ['--import', TSX_PRELOAD.href] : undefined,
    })
    // a thread that fails outside a task (e.g. its file doesn't load) would otherwise crash the process
    created.on('error', (err) => logger.error({ err }, 'engine thread failed'))
    return created
  }

  async function run<T>(name: 'check' | 'outline', input: unknown): Promise<T> {
    pool ??= start()
    try {
      return await pool.run(input, { name, signal: AbortSignal.timeout(timeoutMs) })
    } catch (error) {
      const e = error as Error
      if (e.name === 'AbortError' || e.name === 'TimeoutError') {
        throw new HttpError(503, 'engine-timeout', `The engine gave up after ${Math.round(timeoutMs / 1000)} seconds on this puzzle. Please try again; if it keeps happening, the puzzle may be too hard for the engine.`)
      }
      if (/queue is at limit/i.test(e.message)) {
        throw new HttpError(503, 'engine-busy', 'The engine is busy with other puzzles right now. Please try again in a moment.')
      }
      throw error
    }
  }

  return {
    check: (puzzle) => run('check', puzzle),
    outline: (task) => run('outline', task),
    async destroy() {
      const running = pool
      pool = undefined
      await running?.destroy()
    },
  }
}
