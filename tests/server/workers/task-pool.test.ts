/**
 * The worker pools' time limit counts a task's work, not its wait: neither the queue nor a thread's
 * start-up. The job here keeps its thread busy for as long as it is told, so the timings are known.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { HttpError } from '../../../server/errors'
import { createLogger } from '../../../server/logger'
import { createTaskPool, type TaskPool } from '../../../server/workers/task-pool'

// a job module of its own, so the timing doesn't depend on how fast the engine is
const SPIN_JOB = new URL(`data:text/javascript,${encodeURIComponent('export function spin(ms) { const end = Date.now() + ms; while (Date.now() < end); return ms }')}`)
type SpinJob = { spin: (ms: number) => number }

const LIMIT_MS = 1000
let pool: TaskPool<SpinJob> | undefined

function spinPool(threads = 1): TaskPool<SpinJob> {
  pool = createTaskPool<SpinJob>({
    job: SPIN_JOB,
    label: 'test',
    threads,
    timeoutMs: LIMIT_MS,
    logger: createLogger('silent'),
    tooSlow: () => new HttpError(503, 'too-slow', 'took too long'),
    busy: () => new HttpError(503, 'busy', 'queue full'),
  })
  return pool
}

const codeOf = (error: unknown) => (error instanceof HttpError ? error.code : String(error))

afterEach(async () => {
  await pool?.destroy()
  pool = undefined
})

describe('createTaskPool', () => {
  it('should stop a task that works past the limit, answering the pool’s time-out error', async () => {
    const spin = spinPool()
    const started = performance.now()
    await expect(spin.run('spin', 5 * LIMIT_MS)).rejects.toMatchObject({ status: 503, code: 'too-slow' })
    const waited = performance.now() - started
    expect(waited).toBeGreaterThanOrEqual(LIMIT_MS)
    expect(waited).toBeLessThan(4 * LIMIT_MS)
  })

  it('should not count a thread’s start-up: a cold pool finishes a task of nine tenths of the limit', async () => {
    expect(await spinPool().run('spin', 0.9 * LIMIT_MS)).toBe(0.9 * LIMIT_MS)
  })

  it('should run the next tasks normally after one was stopped, while its thread is replaced', async () => {
    const spin = spinPool()
    await expect(spin.run('spin', 5 * LIMIT_MS)).rejects.toMatchObject({ code: 'too-slow' })
    // sent at once: this task waits for the new thread to start, and that wait isn't counted either
    for (const ms of [0.9 * LIMIT_MS, 100, 100]) expect(await spin.run('spin', ms)).toBe(ms)
  })

  it('should not count time in the queue: four half-limit tasks on one thread all finish', async () => {
    const spin = spinPool()
    const started = performance.now()
    const results = await Promise.allSettled([1, 2, 3, 4].map(() => spin.run('spin', LIMIT_MS / 2)))
    expect(results.map((r) => (r.status === 'fulfilled' ? r.value : codeOf(r.reason)))).toEqual([500, 500, 500, 500])
    // one after another on the one thread: the last waited three tasks' work, longer than the limit
    expect(performance.now() - started).toBeGreaterThanOrEqual(4 * (LIMIT_MS / 2))
  })

  it('should tell callers beyond a full queue to try again instead of queueing them', async () => {
    const spin = spinPool()
    // one thread: one task runs and eight wait (the queue holds max(8, threads²))
    const results = await Promise.allSettled(Array.from({ length: 12 }, () => spin.run('spin', 20)))
    const outcomes = results.map((r) => (r.status === 'fulfilled' ? 'done' : codeOf(r.reason)))
    expect(outcomes).toEqual([...Array(9).fill('done'), 'busy', 'busy', 'busy'])
  })

  it('should leave the calling thread free while a task works', async () => {
    const spin = spinPool()
    await spin.run('spin', 1) // the thread is up
    let ticks = 0
    const ticker = setInterval(() => ticks++, 10)
    await spin.run('spin', 600)
    clearInterval(ticker)
    // a blocked thread would tick once at most; allow a loaded machine to lose most ticks
    expect(ticks).toBeGreaterThan(10)
  })
})
