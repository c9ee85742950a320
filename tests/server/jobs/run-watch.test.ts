/**
 * The watch a running job keeps on its run: however often the recogniser reports, progress reaches the
 * database at most once a tick, and a cancel made by anyone shows as an aborted signal.
 */
import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { claimRun, insertRun } from '../../../server/db/alignment-runs'
import { insertRecording } from '../../../server/db/recordings'
import { watchRun } from '../../../server/jobs/run-watch'
import type { OutlineRecord } from '../../../shared/schemas/studio'
import { useApiSuite } from '../../helpers/api'
import { draftOf } from '../../helpers/studio'

let outline: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    outline = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
  },
})

/** A run as a worker holds it: claimed, so 'running'. */
async function runningRun(): Promise<number> {
  const recordingId = await insertRecording(api.db, {
    outline_id: outline.id, storage_key: `recordings/${outline.id}/watch.wav`, original_name: 'watch.wav', mime: 'audio/wav', kind: 'audio', size_bytes: 44, duration_ms: 1000, facts: {}, uploaded_by: null,
  })
  const jobId = randomUUID()
  const run = await insertRun(api.db, { recording_id: recordingId, method: 'audio', job_id: jobId, caption_text: null, created_by: null })
  await claimRun(api.db, run.id, jobId)
  return run.id
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms))

describe('watchRun', () => {
  it('should write progress at most once a tick however often it is reported, the last value winning', async () => {
    const runId = await runningRun()
    const writes: string[] = []
    const count = (query: { sql: string }) => {
      if (/^update "alignment_runs" set "progress"/.test(query.sql)) writes.push(query.sql)
    }
    api.db.on('query', count)
    const watch = watchRun(api.db, runId, { intervalMs: 200, onError: (error) => expect.fail(String(error)) })
    const started = Date.now()
    for (let i = 1; Date.now() - started < 1000; i++) {
      watch.progress(Math.min(1, i / 2000))
      await sleep(1)
    }
    watch.progress(0.75)
    await sleep(300)
    await watch.stop()
    api.db.off('query', count)
    // about 1.3 s at one tick each 200 ms: six or seven ticks, each writing at most once
    expect(writes.length).toBeGreaterThanOrEqual(3)
    expect(writes.length).toBeLessThanOrEqual(7)
    expect((await api.db('alignment_runs').where({ id: runId }).first())!.progress).toBe(0.75)
    expect(watch.signal.aborted).toBe(false)
  })

  it('should abort its signal within a tick of the run being cancelled elsewhere', async () => {
    const runId = await runningRun()
    const watch = watchRun(api.db, runId, { intervalMs: 100, onError: (error) => expect.fail(String(error)) })
    await api.db('alignment_runs').where({ id: runId }).update({ state: 'cancelled' })
    await expect.poll(() => watch.signal.aborted, { timeout: 500, interval: 20 }).toBe(true)
    await watch.stop()
  })
})
