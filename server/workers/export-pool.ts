import { HttpError } from '../errors'
import type { AppLogger } from '../logger'
import type * as ExportJob from './export-task'
import type { CueSheetTask } from './export-task'
import type { GridPictureRequest } from '../pictures/grid-picture'
import { besideThis, createTaskPool } from './task-pool'

/** Heavy exports, made off the request thread. */
export interface Exports {
  /** The printable cue sheet (PDF bytes) of a stored outline document. */
  cueSheet(task: CueSheetTask): Promise<Buffer>
  /** A grid picture (PNG bytes); a step out of range is the caller's 400. */
  gridPicture(request: GridPictureRequest): Promise<Buffer>
}

interface ExportPoolOptions {
  threads: number
  /** an export working longer is stopped (its thread is ended) and the caller asked to try again */
  timeoutMs: number
  idleTimeoutMs?: number
  logger: AppLogger
}

/** The exports' worker pool: a cue sheet whose layout runs long, or a picture being drawn, holds up one of its threads, never a request. */
export function createExportPool({ threads, timeoutMs, idleTimeoutMs, logger }: ExportPoolOptions): Exports & { destroy(): Promise<void> } {
  const pool = createTaskPool<typeof ExportJob>({
    job: besideThis('./export-task', import.meta.url),
    label: 'exports',
    threads,
    timeoutMs,
    idleTimeoutMs,
    // a person waits for a cue sheet less keenly than for the studio's reads and saves
    niceIncrement: 10,
    logger,
    tooSlow: () => new HttpError(503, 'export-timeout', 'The cue sheet took too long to make; please try again'),
    busy: () => new HttpError(503, 'export-busy', 'Cue sheets and pictures are being made for others right now; please try again in a moment'),
  })
  return {
    async cueSheet(task) {
      const bytes: Uint8Array = await pool.run('cueSheet', task)
      return asBuffer(bytes)
    },
    async gridPicture(request) {
      return asBuffer(await pool.run('gridPicture', request))
    },
    destroy: () => pool.destroy(),
  }
}

// a Buffer crosses the thread boundary as a plain Uint8Array: view the same bytes as a Buffer again
const asBuffer = (bytes: Uint8Array): Buffer => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)
