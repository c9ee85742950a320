/**
 * The engine's worker pool as the API uses it, on real puzzles: the smallest time limit the config
 * allows (one second) holds for a burst of work on a cold pool, and a full queue is told to retry.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { HttpError } from '../../server/errors'
import { createLogger } from '../../server/logger'
import { createEnginePool, type EnginePool } from '../../server/workers/engine-pool'
import { fixture } from '../helpers/studio'

let engine: EnginePool | undefined
afterEach(async () => {
  await engine?.destroy()
  engine = undefined
})

// GT13: a generated thermometer puzzle whose single solution logic-solver confirmed (tests/fixtures/thermo-puzzles.json)
const puzzle = () => {
  const p = fixture('GT13')
  return { title: p.title, givens: p.givens, thermometers: p.thermometers ?? [] }
}

describe('createEnginePool', () => {
  it('should check a burst of puzzles on a cold one-thread pool within a one-second limit', async () => {
    engine = createEnginePool({ threads: 1, timeoutMs: 1000, logger: createLogger('silent') })
    // thread start-up and each check's wait behind the others come before its clock starts
    const verdicts = await Promise.all(Array.from({ length: 9 }, () => engine!.check(puzzle())))
    expect(verdicts.map((v) => v.check)).toEqual(Array(9).fill('unique'))
    expect(verdicts[0]?.solution).toBe(fixture('GT13').solution)
  })

  it('should tell callers beyond a full queue that the engine is busy', async () => {
    engine = createEnginePool({ threads: 1, timeoutMs: 30_000, logger: createLogger('silent') })
    // sent before the thread can answer any: one runs, eight wait, the rest are refused
    const outcomes = await Promise.all(
      Array.from({ length: 11 }, () =>
        engine!.check(puzzle()).then(
          (v) => v.check,
          (e: unknown) => (e instanceof HttpError ? `${e.status} ${e.code}` : String(e)),
        ),
      ),
    )
    expect(outcomes).toEqual([...Array(9).fill('unique'), '503 engine-busy', '503 engine-busy'])
  })
})
