/**
 * A process that stops while it works an alignment (a deploy, Ctrl-C): the recogniser's child process is
 * killed, the run goes back on the queue under a new job, and the next worker process finishes it.
 */
import { spawn } from 'node:child_process'
import { afterAll, describe, expect, it } from 'vitest'
import { captionWords } from '../../../server/captions/caption-words'
import { insertRecording } from '../../../server/db/recordings'
import { startJobs, type Jobs, type WordSources } from '../../../server/jobs'
import { createLogger } from '../../../server/logger'
import type { OutlineRecord } from '../../../shared/schemas/studio'
import { useApiSuite } from '../../helpers/api'
import { testConfig } from '../../helpers/db'
import { draftOf } from '../../helpers/studio'

let outline: OutlineRecord
let recordingId: number
const running: Jobs[] = []

/** Jobs worked by "a process": its own queue connection and one worker, the audio source given. */
function workerProcess(db: typeof api.db, audio: WordSources['audio']): Jobs {
  const jobs = startJobs({
    url: testConfig().db.url,
    workers: 1,
    db,
    logger: createLogger('silent'),
    words: { captions: captionWords, audio, explain: () => undefined },
    pollingIntervalSeconds: 0.5,
    watchIntervalMs: 100,
  })
  running.push(jobs)
  return jobs
}

const pids: number[] = []
const sleepingChild: WordSources['audio'] = (_key, _texts, { signal }) =>
  new Promise((resolve, reject) => {
    const child = spawn('sleep', ['60'], { signal })
    pids.push(child.pid!)
    child.on('error', reject)
    child.on('exit', () => resolve([]))
  })

let first: Jobs
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    outline = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
    recordingId = await insertRecording(suite.db, {
      outline_id: outline.id, storage_key: `recordings/${outline.id}/take.wav`, original_name: 'take.wav', mime: 'audio/wav', kind: 'audio', size_bytes: 44, duration_ms: 60_000, facts: {}, uploaded_by: null,
    })
  },
  jobs: (db) => (first = workerProcess(db, sleepingChild)).queue,
})
afterAll(async () => {
  for (const jobs of running) await jobs.stop()
})

const alive = (pid: number) => {
  try {
    process.kill(pid, 0)
    return true
  } catch {
    return false
  }
}

describe('stopping a process that works jobs', () => {
  it('should kill the running recogniser, queue the run again under a new job, and let the next worker finish it', async () => {
    const runs = `/api/channels/${api.channelId}/outlines/${outline.id}/recordings/${recordingId}/alignments`
    const posted = await api.as('editor').post(runs).send({ method: 'audio' })
    expect(posted.status).toBe(202)
    const row = () => api.db('alignment_runs').where({ id: posted.body.id }).first()
    await expect.poll(async () => (await row())?.state, { timeout: 5000 }).toBe('running')
    const before = (await row())!.job_id

    await first.stop()
    expect(pids).toHaveLength(1)
    expect(alive(pids[0]!)).toBe(false)
    const requeued = (await row())!
    expect(requeued).toMatchObject({ state: 'queued', progress: 0 })
    expect(requeued.job_id).not.toBe(before)

    workerProcess(api.db, async () => [])
    await expect.poll(async () => (await row())?.state, { timeout: 5000 }).toBe('done')
    expect(pids).toHaveLength(1)
  })
})
