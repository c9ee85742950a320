import type { Outline } from '../../shared/schemas/outline'
import { HttpError } from '../errors'
import type { AppLogger } from '../logger'
import type * as EngineJob from './engine-task'
import type { NoOutline, OutlineTask, PuzzleInput, PuzzleVerdict } from './engine-task'
import { createExportPool, type Exports } from './export-pool'
import { besideThis, createTaskPool } from './task-pool'

/** What services need from the engine: the same calls as engine-task.ts, asynchronous. */
export interface Engine {
  check(puzzle: PuzzleInput): Promise<PuzzleVerdict>
  outline(task: OutlineTask): Promise<Outline | NoOutline>
}

/**
 * The server's worker threads: the engine's pool, and a pool of its own for heavy exports, so a burst
 * of cue sheets never makes the engine busy (or the other way round).
 */
export interface EnginePool extends Engine, Exports {
  /** Stops the threads; the pools start again if used afterwards. */
  destroy(): Promise<void>
}

export interface EnginePoolOptions {
  /** threads of each pool */
  threads: number
  /** an engine task working longer is stopped (its thread is ended); waiting in the queue doesn't count */
  timeoutMs: number
  /** the same for an export such as a cue-sheet PDF */
  exportTimeoutMs?: number
  /** a thread beyond the first ends after this long without work */
  idleTimeoutMs?: number
  logger: AppLogger
}

/** The engine's and the exports' worker pools; no thread starts until a pool's first task. */
export function createEnginePool({ threads, timeoutMs, exportTimeoutMs = 10_000, idleTimeoutMs, logger }: EnginePoolOptions): EnginePool {
  const engine = createTaskPool<typeof EngineJob>({
    job: besideThis('./engine-task', import.meta.url),
    label: 'engine',
    threads,
    timeoutMs,
    idleTimeoutMs,
    logger,
    tooSlow: () =>
      new HttpError(503, 'engine-timeout', `The engine gave up after ${Math.round(timeoutMs / 1000)} seconds on this puzzle. Please try again; if it keeps happening, the puzzle may be too hard for the engine.`),
    busy: () => new HttpError(503, 'engine-busy', 'The engine is busy with other puzzles right now. Please try again in a moment.'),
  })
  const exports = createExportPool({ threads, timeoutMs: exportTimeoutMs, idleTimeoutMs, logger })
  return {
    check: (puzzle) => engine.run('check', puzzle),
    outline: (task) => engine.run('outline', task),
    cueSheet: exports.cueSheet,
    gridPicture: exports.gridPicture,
    async destroy() {
      await Promise.all([engine.destroy(), exports.destroy()])
    },
  }
}
