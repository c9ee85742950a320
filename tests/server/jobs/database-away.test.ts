/**
 * The job queue when PostgreSQL is away at start (a server booted before its database): starting a run
 * answers 503 and leaves no run behind, the workers keep trying, and once the database answers they
 * start and work runs. "Away" is a TCP proxy in front of the test database that cuts every connection
 * until it is told to forward them.
 */
import { createServer, connect, type AddressInfo, type Server } from 'node:net'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { captionWords } from '../../../server/captions/caption-words'
import { insertRecording } from '../../../server/db/recordings'
import { startJobs, type Jobs } from '../../../server/jobs'
import type { OutlineRecord } from '../../../shared/schemas/studio'
import { useApiSuite } from '../../helpers/api'
import { testConfig } from '../../helpers/db'
import { draftOf } from '../../helpers/studio'

let databaseUp = false
let proxy: Server
let proxyPort = 0
const database = new URL(testConfig().db.url)

beforeAll(async () => {
  proxy = createServer((client) => {
    if (!databaseUp) return client.destroy()
    const upstream = connect(Number(database.port), database.hostname)
    client.pipe(upstream).pipe(client)
    client.on('error', () => upstream.destroy())
    upstream.on('error', () => client.destroy())
  })
  await new Promise<void>((resolve) => proxy.listen(0, '127.0.0.1', resolve))
  proxyPort = (proxy.address() as AddressInfo).port
})

const warnings: string[] = []
let jobs: Jobs
let outline: OutlineRecord
let recordingId: number
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    outline = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
    recordingId = await insertRecording(suite.db, {
      outline_id: outline.id, storage_key: `recordings/${outline.id}/take.wav`, original_name: 'take.wav', mime: 'audio/wav', kind: 'audio', size_bytes: 44, duration_ms: 60_000, facts: {}, uploaded_by: null,
    })
  },
  jobs: (db) => {
    const logger = pino<string>({ level: 'warn' }, { write: (line: string) => void warnings.push(JSON.parse(line).msg) })
    const url = Object.assign(new URL(database), { port: String(proxyPort) }).toString()
    jobs = startJobs({ url, workers: 1, db, logger, words: { captions: captionWords, audio: async () => [], explain: () => undefined }, pollingIntervalSeconds: 0.5 })
    return jobs.queue
  },
})
afterAll(async () => {
  await jobs?.stop()
  proxy?.close()
})

describe('the job queue while the database is away', () => {
  it('should answer 503 without leaving a run, then start its workers and work runs once the database answers', async () => {
    const runs = `/api/channels/${api.channelId}/outlines/${outline.id}/recordings/${recordingId}/alignments`
    const refused = await api.as('editor').post(runs).send({ method: 'audio' })
    expect(refused.status).toBe(503)
    expect(refused.body.code).toBe('database-unavailable')
    expect(await api.db('alignment_runs').count({ n: '*' })).toEqual([{ n: '0' }])
    expect(warnings).toContain('the job queue could not start; trying again shortly')

    databaseUp = true
    const posted = await api.as('editor').post(runs).send({ method: 'audio' })
    expect(posted.status).toBe(202)
    // the workers start at their next try (within 5 s) and take the run
    await expect.poll(async () => (await api.db('alignment_runs').where({ id: posted.body.id }).first())?.state, { timeout: 10_000, interval: 200 }).toBe('done')
  }, 20_000)
})
