import { spawnSync } from 'node:child_process'
import request from 'supertest'
import { describe, expect, it, vi } from 'vitest'
import { episodePageSchema } from '../../shared/schemas/episode'
import { timeline } from '../../shared/script/index'
import { outlineOf } from '../../server/db/outlines'
import { DEMO_EPISODE_ADDRESS, demoEpisodePath } from '../../server/demo-episode'
import { createStorage, type Storage } from '../../server/storage'
import { DEMO_CHANNEL } from '../../seeds/01_demo_channel'
import { seed as seedPuzzles } from '../../seeds/02_demo_puzzles'
import { DEMO_EPISODE, seed as seedEpisode } from '../../seeds/03_demo_episode'
import { useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'

// every test starts from the demo channel with its puzzles and take, and publishes the demo episode itself
const api = useApiSuite({ prepare: (suite) => seedPuzzles(suite.db) })

const PAGE = `/api/episodes/marigold-logic/${DEMO_EPISODE.slug}`
const storage = () => createStorage(testConfig().storage)
/** A store that refuses every file, as one that is away would. */
const refusing = (): Storage => ({ ...storage(), put: () => Promise.reject(new Error('the store is away')) })

/** Runs the seed without a recording, keeping its one line about that off the test's output. */
async function seedWithoutRecording() {
  const say = vi.spyOn(console, 'log').mockImplementation(() => {})
  try {
    await seedEpisode(api.db, refusing())
    return say.mock.calls.map(([line]) => String(line))
  } finally {
    say.mockRestore()
  }
}
const installed = (tool: string) => spawnSync(tool, ['-version'], { stdio: 'ignore' }).error === undefined
const mediaTools = installed('espeak-ng') && installed('sox') && installed('ffmpeg')

async function demoTake() {
  const take = await api.db('outlines').where({ name: 'First take' }).first()
  return outlineOf(take!)
}

describe('seeds/03_demo_episode', { timeout: 60_000 }, () => {
  it.runIf(mediaTools)('should publish a public episode whose every line is aligned to a playable recording of it', async () => {
    await seedEpisode(api.db, storage())

    const res = await request(api.app).get(PAGE)
    expect(res.status).toBe(200)
    const page = episodePageSchema.parse(res.body)
    expect(page.episode).toMatchObject({ title: DEMO_EPISODE.title, visibility: 'public' })
    expect(page.puzzle).toMatchObject({ title: 'Four Fevers', setter: 'Ilse Marchetti' })

    // every visible line carries its true start in the recording: the page's times are the recording's
    const take = await demoTake()
    const aligned = take.lines.filter((l) => l.alignedStartMs !== undefined)
    expect(aligned.map((l) => l.id)).toEqual(take.lines.filter((l) => !l.hidden).map((l) => l.id))
    expect(timeline(take).source).toBe('aligned')
    expect(page.timing).toBe('aligned')
    const pageStart = new Map(page.lines.map((l) => [l.id, l.startMs]))
    for (const line of aligned) expect(pageStart.get(line.id)).toBe(line.alignedStartMs)
    expect(aligned[0]!.alignedStartMs).toBeGreaterThanOrEqual(700)

    // RFC 9110 §14: a range answers 206 with exactly those bytes; WebM files open with the EBML magic 1A 45 DF A3 (RFC 8794 §8.1)
    expect(page.player).toMatchObject({ kind: 'media', mime: 'audio/webm', audioOnly: true })
    const url = page.player.kind === 'media' ? page.player.url : ''
    const part = await request(api.app).get(url).set('Range', 'bytes=0-99').buffer(true)
    expect(part.status).toBe(206)
    expect(part.headers['content-type']).toMatch(/^audio\/webm/)
    expect(Buffer.from(part.body).length).toBe(100)
    expect(Buffer.from(part.body).subarray(0, 4).toString('hex')).toBe('1a45dfa3')

    const [recording] = await api.db('recordings')
    expect(recording).toMatchObject({ mime: 'audio/webm', kind: 'audio', is_current: true })
    // the recording holds every spoken line and ends soon after the last one
    expect(recording!.duration_ms).toBeGreaterThan(aligned.at(-1)!.alignedStartMs!)
    expect(recording!.duration_ms).toBeLessThan(aligned.at(-1)!.alignedStartMs! + 30_000)
  })

  it.runIf(mediaTools)('should publish once however often it runs', async () => {
    await seedEpisode(api.db, storage())
    await seedEpisode(api.db, storage())

    expect(await api.db('episodes').count({ n: '*' })).toEqual([{ n: '1' }])
    expect(await api.db('recordings').count({ n: '*' })).toEqual([{ n: '1' }])
  })

  it('should still publish, at estimated times and without a video, when the recording cannot be made or kept', async () => {
    const [line, ...more] = await seedWithoutRecording()
    expect(more).toEqual([])
    expect(line).toContain('the demo episode is published without a recording, at estimated times: ')
    // without the speech tools the seed never reaches the store, and says which tool is missing
    expect(line).toContain(mediaTools ? 'the store is away' : 'is not installed')
    const res = await request(api.app).get(PAGE)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ timing: 'estimated', player: { kind: 'none' } })
    expect(await api.db('recordings').count({ n: '*' })).toEqual([{ n: '0' }])
    expect((await demoTake()).lines.every((l) => l.alignedStartMs === undefined)).toBe(true)
  })

  it("should give npm start the demo episode's page only while anyone can open it", async () => {
    expect(DEMO_EPISODE_ADDRESS.channelSlug).toBe(DEMO_CHANNEL.slug)
    expect(await demoEpisodePath(api.db)).toBeNull()

    await seedWithoutRecording()
    expect(await demoEpisodePath(api.db)).toBe(`/episodes/marigold-logic/${DEMO_EPISODE.slug}`)

    await api.db('episodes').update({ unpublished_at: new Date() })
    expect(await demoEpisodePath(api.db)).toBeNull()
  })
})
