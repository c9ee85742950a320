/**
 * Alignment runs through the API and the job queue (pg-boss on the test database): a caption run end to
 * end, retries, cancels (queued and running, the child process gone), refusals. The caption files are
 * written by hand to the WebVTT format (W3C WebVTT §4: "WEBVTT" header, cues of `start --> end` and text).
 */
import { randomUUID } from 'node:crypto'
import { spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { afterAll, beforeEach, describe, expect, it } from 'vitest'
import { captionWords, CaptionFileError } from '../../server/captions/caption-words'
import { insertRecording } from '../../server/db/recordings'
import { startJobs, type Jobs, type WordSources } from '../../server/jobs'
import { wordSources } from '../../server/jobs/word-sources'
import { createLogger } from '../../server/logger'
import { createStorage } from '../../server/storage'
import { spokenWords, type TimedWord } from '../../shared/align'
import { scriptOf, type OutlineLine } from '../../shared/schemas/outline'
import type { AlignmentRun } from '../../shared/schemas/recording'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { draftOf } from '../helpers/studio'
import { speak } from '../../scripts/test-recordings/speak'

let outline: OutlineRecord
let recordingId: number
let jobs: Jobs

/** What the audio source does in the current test; the caption source is the real parser. */
let recognise: WordSources['audio']
const audioCalls: string[] = []
const sources: WordSources = {
  captions: captionWords,
  audio: (key, texts, options) => {
    audioCalls.push(key)
    return recognise(key, texts, options)
  },
  explain: (error) => (error instanceof CaptionFileError ? error.message : undefined),
}

const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13', { title: 'Lantern Steps', author: 'Oskar Lindqvist' }))
    outline = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})).body
    // the row alone: these runs never read the file, except through the test's own audio source
    recordingId = await insertRecording(suite.db, {
      outline_id: outline.id,
      storage_key: `recordings/${outline.id}/take.wav`,
      original_name: 'take.wav',
      mime: 'audio/wav',
      kind: 'audio',
      size_bytes: 44,
      duration_ms: 60_000,
      facts: {},
      uploaded_by: null,
    })
  },
  jobs: (db) => {
    jobs = startJobs({ url: testConfig().db.url, workers: 1, db, logger: createLogger('silent'), words: sources, retryDelaySeconds: 1, pollingIntervalSeconds: 0.5, watchIntervalMs: 100 })
    return jobs.queue
  },
})
afterAll(() => jobs?.stop())

beforeEach(() => {
  audioCalls.length = 0
  recognise = async () => []
})

const runsPath = (recording = recordingId) => `/api/channels/${api.channelId}/outlines/${outline.id}/recordings/${recording}/alignments`
const visibleLines = (): OutlineLine[] => outline.outline.lines.filter((line) => !line.hidden)

/** Polls the run until `done(run)`, at most `withinMs`. */
async function waitFor(runId: number, done: (run: AlignmentRun) => boolean, withinMs = 10_000, recording = recordingId): Promise<AlignmentRun> {
  const until = Date.now() + withinMs
  for (;;) {
    const res = await api.as('editor').get(`${runsPath(recording)}/${runId}`)
    expect(res.status).toBe(200)
    if (done(res.body)) return res.body
    if (Date.now() > until) throw new Error(`run ${runId} is still ${res.body.state} after ${withinMs} ms`)
    await new Promise((resolve) => setTimeout(resolve, 100))
  }
}
const finished = (run: AlignmentRun) => ['done', 'failed', 'cancelled'].includes(run.state)

const vttTime = (ms: number) => new Date(ms).toISOString().slice(11, 23)

/** A WebVTT file saying each line's text from its start, in cues of at most 42 characters (common practice for caption lines). */
function webVtt(said: { text: string; startMs: number }[]): string {
  const cues: string[] = []
  for (const { text, startMs } of said) {
    const pieces = text.match(/.{1,42}(\s|$)/g) ?? [text]
    pieces.forEach((piece, i) => {
      const from = startMs + i * 1500
      cues.push(`${vttTime(from)} --> ${vttTime(from + 1400)}\n${piece.trim()}`)
    })
  }
  return `WEBVTT\n\n${cues.join('\n\n')}\n`
}

const postCaptions = (content: string | Buffer, as: 'owner' | 'editor' = 'editor') =>
  api
    .as(as)
    .post(runsPath())
    .field('method', 'captions')
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), { filename: 'take.vtt', contentType: 'text/vtt' })

/** A child process like the recogniser's, killed through the job's signal; its pid is kept to check it is gone. */
function sleepingChild(pids: number[]): WordSources['audio'] {
  return (_key, _texts, { signal, onProgress }) =>
    new Promise<TimedWord[]>((resolve, reject) => {
      const child = spawn('sleep', ['60'], { signal })
      pids.push(child.pid!)
      onProgress(0.25)
      child.on('error', reject)
      child.on('exit', () => resolve([]))
    })
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0)
    return true
  } catch {
    return false
  }
}

describe('POST …/recordings/:recordingId/alignments (captions)', () => {
  it('should queue a run (202) and end with a proposal near each captioned line\'s start, the uncaptioned line unplaced', async () => {
    const lines = visibleLines().slice(0, 5)
    const skipped = lines[2]!
    const said = lines.filter((line) => line !== skipped).map((line, i) => ({ lineId: line.id, text: line.text, startMs: 2000 + i * 20_000 }))
    const res = await postCaptions(webVtt(said))
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    expect(res.body).toMatchObject({ recordingId, method: 'captions', state: 'queued', progress: 0, proposals: [], unplaced: [], error: null })

    const run = await waitFor(res.body.id, finished)
    expect(run.state).toBe('done')
    expect(run.progress).toBe(1)
    const startOf = new Map(run.proposals.map((p) => [p.lineId, p.startMs]))
    for (const { lineId, startMs } of said) expect(Math.abs((startOf.get(lineId) ?? -1e9) - startMs), `line ${lineId}`).toBeLessThanOrEqual(1000)
    expect(run.unplaced).toContain(skipped.id)
    expect(audioCalls).toEqual([])
  })

  it('should read a file with a byte-order mark and CRLF line ends (as Windows tools write them)', async () => {
    const [line] = visibleLines()
    const res = await postCaptions(Buffer.from(`\uFEFF${webVtt([{ text: line!.text, startMs: 3000 }]).replace(/\n/g, '\r\n')}`))
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    const run = await waitFor(res.body.id, finished)
    expect(run.proposals.find((p) => p.lineId === line!.id)?.startMs).toBeGreaterThanOrEqual(2000)
  })

  it('should refuse a file that is not WebVTT or SRT with 400 and the parser\'s sentence, and queue nothing', async () => {
    const res = await postCaptions('Dear editor,\nhere are my notes for the take.\n')
    expect(res.status).toBe(400)
    expect(res.body.code).toBe('not-captions')
    expect(res.body.message).toMatch(/isn't a WebVTT or SRT caption file/)
    expect(await api.db('alignment_runs').count({ n: '*' })).toEqual([{ n: '0' }])
  })

  it('should refuse a caption file over 2 MB with 413 naming the limit', async () => {
    const cue = '00:00:01.000 --> 00:00:02.000\nplace a seven in the top row\n\n'
    const res = await postCaptions(`WEBVTT\n\n${cue.repeat(Math.ceil((2 * 1024 ** 2) / cue.length) + 10)}`)
    expect(res.status).toBe(413)
    expect(res.body.message).toBe('The caption file is larger than the 2 MB limit for caption files.')
  })

  it('should ask for the file when the caption method comes without one', async () => {
    const res = await api.as('editor').post(runsPath()).field('method', 'captions')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('Attach the caption file (WebVTT or SRT) in the form field "file".')
  })

  it('should answer 404 for a recording that is not the take\'s', async () => {
    const res = await api.as('editor').post(runsPath(recordingId + 1000)).send({ method: 'audio' })
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Recording not found')
  })
})

describe('alignment jobs: retry and failure', () => {
  it('should retry a job that fails once, then store its proposals', async () => {
    const [first, second] = visibleLines()
    let attempts = 0
    recognise = async () => {
      if (++attempts === 1) throw new Error('the recogniser crashed')
      return [...words(first!.text, 1000), ...words(second!.text, 9000)]
    }
    const res = await api.as('owner').post(runsPath()).send({ method: 'audio' })
    expect(res.status).toBe(202)
    const run = await waitFor(res.body.id, finished)
    expect(attempts).toBe(2)
    expect(run).toMatchObject({ state: 'done', error: null })
    expect(run.proposals.slice(0, 2).map((p) => [p.lineId, p.startMs])).toEqual([
      [first!.id, 1000],
      [second!.id, 9000],
    ])
  })

  it('should try three times in all and then fail with a sentence, never a stack', async () => {
    let attempts = 0
    recognise = async () => {
      attempts++
      throw new Error('ENOENT: no such file or directory, open /var/tmp/x.wav')
    }
    const res = await api.as('owner').post(runsPath()).send({ method: 'audio' })
    const run = await waitFor(res.body.id, finished, 15_000)
    expect(attempts).toBe(3)
    expect(run.state).toBe('failed')
    expect(run.error).toBe('The alignment stopped because of a problem on our side, and trying again did not help. Start it again later; if it fails again, let us know.')
  })

  it('should fail with the source\'s own sentence when it has one', async () => {
    recognise = async () => {
      throw new CaptionFileError('This recording has no sound track to listen to.')
    }
    const res = await api.as('owner').post(runsPath()).send({ method: 'audio' })
    const run = await waitFor(res.body.id, finished, 15_000)
    expect(run).toMatchObject({ state: 'failed', error: 'This recording has no sound track to listen to.' })
  })
})

describe('DELETE …/alignments/:runId', () => {
  it('should stop a running job (its child process gone) and cancel a queued one before it starts', async () => {
    const pids: number[] = []
    recognise = sleepingChild(pids)
    const running = (await api.as('editor').post(runsPath()).send({ method: 'audio' })).body as AlignmentRun
    const queued = (await api.as('editor').post(runsPath()).send({ method: 'audio' })).body as AlignmentRun
    const started = await waitFor(running.id, (run) => run.state === 'running' && run.progress > 0)
    expect(started.progress).toBeCloseTo(0.25 * 0.95)
    expect(pids).toHaveLength(1)

    const cancelQueued = await api.as('editor').delete(`${runsPath()}/${queued.id}`)
    expect(cancelQueued.status).toBe(200)
    expect(cancelQueued.body).toMatchObject({ id: queued.id, state: 'cancelled' })

    const cancelRunning = await api.as('owner').delete(`${runsPath()}/${running.id}`)
    expect(cancelRunning.body).toMatchObject({ id: running.id, state: 'cancelled' })
    await expect.poll(() => alive(pids[0]!), { timeout: 2000 }).toBe(false)

    // the worker is free again: the cancelled queued run must not start
    await new Promise((resolve) => setTimeout(resolve, 1500))
    expect(audioCalls).toHaveLength(1)
    expect((await waitFor(queued.id, finished)).state).toBe('cancelled')
    expect((await waitFor(running.id, finished)).state).toBe('cancelled')
  })

  it('should answer a finished run as it is', async () => {
    const res = await api.as('owner').post(runsPath()).send({ method: 'audio' })
    await waitFor(res.body.id, finished)
    const cancel = await api.as('owner').delete(`${runsPath()}/${res.body.id}`)
    expect(cancel.status).toBe(200)
    expect(cancel.body).toMatchObject({ state: 'done', progress: 1 })
  })
})

describe('GET …/alignments', () => {
  it('should list the recording\'s runs newest first, and answer 404 for a run of another recording', async () => {
    const a = (await api.as('owner').post(runsPath()).send({ method: 'audio' })).body as AlignmentRun
    const b = (await api.as('owner').post(runsPath()).send({ method: 'audio' })).body as AlignmentRun
    const list = await api.as('presenter').get(runsPath())
    expect(list.body.map((r: AlignmentRun) => r.id)).toEqual([b.id, a.id])
    const other = await api.as('owner').get(`${runsPath(recordingId + 1000)}/${a.id}`)
    expect(other.status).toBe(404)
  })
})

describe('a run whose worker died', () => {
  it('should keep a working run alive by touching it, and fail one silent for a minute with a sentence', async () => {
    const pids: number[] = []
    recognise = sleepingChild(pids)
    const working = (await api.as('owner').post(runsPath()).send({ method: 'audio' })).body as AlignmentRun
    await waitFor(working.id, (run) => run.state === 'running')
    // its job touches it every watch interval (100 ms here), so it never looks silent
    const touched = async () => (await api.db('alignment_runs').where({ id: working.id }).first('updated_at'))!.updated_at.getTime()
    const first = await touched()
    await expect.poll(touched, { timeout: 2000 }).toBeGreaterThan(first)
    await api.as('owner').delete(`${runsPath()}/${working.id}`)

    // as a killed worker leaves its run: running, and not touched since
    const [dead] = await api
      .db('alignment_runs')
      .insert({ recording_id: recordingId, method: 'audio', state: 'running', progress: 0.4, job_id: randomUUID(), updated_at: api.db.raw("now() - interval '61 seconds'") })
      .returning('id')
    const answered = await api.as('editor').get(`${runsPath()}/${dead!.id}`)
    expect(answered.body).toMatchObject({ state: 'failed', error: 'The alignment stopped: the process working on it ended unexpectedly. Start it again.' })
  })
})

describe('an audio run end to end', () => {
  it('should place each line espeak-ng said within 1 s of its true start, recognised by pocketsphinx from the uploaded recording', async () => {
    // the take's shortest stretch of three lines, every other line hidden (not spoken, so not matched): ten seconds of speech
    const lines = shortestStretch(visibleLines(), 3)
    const said = new Set(lines.map((line) => line.id))
    const script = scriptOf(outline.outline)
    const hidden = await api
      .as('editor')
      .patch(`/api/channels/${api.channelId}/outlines/${outline.id}`)
      .send({ version: outline.version, script: { ...script, lines: script.lines.map((line) => ({ ...line, hidden: !said.has(line.id) })) } })
    expect(hidden.status, JSON.stringify(hidden.body)).toBe(200)
    const recording = speak({ utterances: lines.map((line, i) => ({ lineId: line.id, text: line.text, pauseMs: 700 + 600 * i })), absent: [] }, 165)
    const upload = await api
      .as('editor')
      .post(`/api/channels/${api.channelId}/outlines/${outline.id}/recordings`)
      .attach('file', readFileSync(recording.wavPath), 'spoken-take.wav')
    expect(upload.status, JSON.stringify(upload.body)).toBe(201)
    recognise = wordSources(createStorage(testConfig().storage)).audio

    const res = await api.as('editor').post(runsPath(upload.body.id)).send({ method: 'audio' })
    expect(res.status).toBe(202)
    const run = await waitFor(res.body.id, finished, 30_000, upload.body.id)
    expect(run).toMatchObject({ state: 'done', progress: 1, error: null })
    const startOf = new Map(run.proposals.map((p) => [p.lineId, p.startMs]))
    for (const spoken of recording.spoken) expect(Math.abs((startOf.get(spoken.lineId!) ?? -1e9) - spoken.startMs), `line ${spoken.lineId}`).toBeLessThanOrEqual(1000)
    // hidden lines are not spoken: neither proposed nor reported unplaced
    expect(run.proposals.map((p) => p.lineId)).toEqual(lines.map((line) => line.id))
    expect(run.unplaced).toEqual([])
    // the file goes with its row; the data reset after each test would only take the row
    expect((await api.as('editor').delete(`/api/channels/${api.channelId}/outlines/${outline.id}/recordings/${upload.body.id}`)).status).toBe(204)
  }, 40_000)
})

/** The `count` consecutive lines with the least text: a presenter's stretch of the take, a few seconds of speech. */
function shortestStretch(lines: OutlineLine[], count: number): OutlineLine[] {
  const length = (from: number) => lines.slice(from, from + count).reduce((sum, line) => sum + line.text.length, 0)
  let best = 0
  for (let from = 1; from + count <= lines.length; from++) if (length(from) < length(best)) best = from
  return lines.slice(best, best + count)
}

/** A line's words as a recogniser would time them: 300 ms a word. */
function words(text: string, fromMs: number): TimedWord[] {
  return spokenWords(text).map((word, i) => ({ word, startMs: fromMs + i * 300, endMs: fromMs + i * 300 + 250 }))
}
