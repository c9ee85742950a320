import type { Db } from '../db/knex'
import { reportProgress, touchRun } from '../db/alignment-runs'

/** How often a running job writes its progress (or a sign of life) and looks whether its run was cancelled. */
const WATCH_INTERVAL_MS = 500

export interface RunWatch {
  /** fires when the run stops running under the job: cancelled, or deleted with its recording */
  readonly signal: AbortSignal
  /** the latest progress, 0..1; written at the next tick, so a chatty recogniser costs no more writes */
  progress(fraction: number): void
  /** ends the ticks; resolves once the last write is done */
  stop(): Promise<void>
}

/**
 * Watches a running run from the job working it. A cancel is a row change made by any process (the
 * request that cancels may reach another machine than the worker), so the job learns it by looking.
 */
export function watchRun(db: Db, runId: number, { intervalMs = WATCH_INTERVAL_MS, onError }: { intervalMs?: number; onError: (error: unknown) => void }): RunWatch {
  const controller = new AbortController()
  let latest = 0
  let written = 0
  let stopped = false
  let tick: Promise<void> = Promise.resolve()
  let timer: NodeJS.Timeout | undefined

  const look = async () => {
    const fraction = latest
    // every tick touches the row, so a run whose worker died shows it by going silent (see failSilentRuns)
    const running = fraction === written ? await touchRun(db, runId) : await reportProgress(db, runId, fraction)
    written = fraction
    if (!running) controller.abort(new Error('the run was cancelled'))
  }
  const schedule = () => {
    timer = setTimeout(() => {
      tick = look()
        .catch(onError)
        .finally(() => {
          if (!stopped && !controller.signal.aborted) schedule()
        })
    }, intervalMs)
  }
  schedule()

  return {
    signal: controller.signal,
    progress(fraction) {
      latest = Math.min(1, Math.max(0, fraction))
    },
    async stop() {
      stopped = true
      clearTimeout(timer)
      await tick
    },
  }
}
