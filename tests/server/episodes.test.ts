/**
 * Publishing a take as an episode and the public episode API: publish, republish, unpublish, schedule, the
 * snapshot kept until republished, address names, visibility for every kind of visitor, and hostile input.
 */
import { PNG } from 'pngjs'
import { describe, expect, it } from 'vitest'
import { episodePageSchema, episodeSchema, episodeSummarySchema, type EpisodePage, type EpisodePublish } from '../../shared/schemas/episode'
import { scriptOf } from '../../shared/schemas/outline'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { useApiSuite, type Actor } from '../helpers/api'
import { wavFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

let take: OutlineRecord
let other: OutlineRecord
let recordingId: number
let othersRecordingId: number

const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    const outlines = `/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`
    take = (await suite.as('owner').post(outlines, {})).body
    other = (await suite.as('owner').post(outlines, { name: 'Second take' })).body
    recordingId = await upload(take.id)
    othersRecordingId = await upload(other.id)
  },
})

async function upload(outlineId: number): Promise<number> {
  const res = await api.as('owner').post(`/api/channels/${api.channelId}/outlines/${outlineId}/recordings`).attach('file', wavFile({ seconds: 0.5 }), 'take.wav')
  if (res.status !== 201) throw new Error(`uploading a recording failed: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body.id
}

const episodeOf = (outlineId = take.id) => `/api/channels/${api.channelId}/outlines/${outlineId}/episode`
const publicApi = (slug = 'thermo-tuesday-1') => `/api/episodes/marigold-logic/${slug}`

const publishing = (extra: Partial<EpisodePublish> = {}): EpisodePublish => ({
  slug: 'thermo-tuesday-1',
  title: 'Thermo Tuesday 1',
  visibility: 'public',
  description: 'A calm solve of a thermometer puzzle. Chapters below.',
  video: { kind: 'recording', recordingId },
  ...extra,
})

async function publish(extra: Partial<EpisodePublish> = {}, outlineId = take.id, as: Actor = 'editor') {
  const res = await api.as(as).put(episodeOf(outlineId), publishing(extra))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return episodeSchema.parse(res.body)
}

async function pageAs(actor: Actor, slug?: string): Promise<EpisodePage> {
  const res = await api.as(actor).get(publicApi(slug))
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return episodePageSchema.parse(res.body)
}

/** The channel's episodes as one caller lists them, of this file's two takes only (the demo data may hold others). */
async function listedAs(actor: Actor) {
  const res = await api.as(actor).get(`/api/channels/${api.channelId}/episodes`)
  expect(res.status).toBe(200)
  return (res.body as unknown[]).map((e) => episodeSummarySchema.parse(e)).filter((e) => e.outlineId === take.id || e.outlineId === other.id)
}

const NO_EPISODE = { code: 'not-found', message: 'There is no episode at this address.' }

/** Saves the take with `change` applied to its script, as the studio's autosave does. */
async function editTake(change: (script: ReturnType<typeof scriptOf>) => void): Promise<void> {
  const current = (await api.as('owner').get(`/api/channels/${api.channelId}/outlines/${take.id}`)).body as OutlineRecord
  const script = scriptOf(current.outline)
  change(script)
  const res = await api.as('owner').patch(`/api/channels/${api.channelId}/outlines/${take.id}`, { version: current.version, script })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
}

describe('PUT …/outlines/:outlineId/episode', () => {
  it('should publish the take at once, live at its address, by the person who published it', async () => {
    const before = Date.now()
    const episode = await publish()
    expect(episode).toMatchObject({
      outlineId: take.id,
      slug: 'thermo-tuesday-1',
      title: 'Thermo Tuesday 1',
      visibility: 'public',
      state: 'live',
      pageUrl: '/episodes/marigold-logic/thermo-tuesday-1',
      puzzleTitle: take.outline.title,
      video: { kind: 'recording', recordingId },
      publishedBy: 'Priya Castellanos',
      takeChangedSince: false,
    })
    expect(Date.parse(episode.publishAt)).toBeGreaterThanOrEqual(before - 1000)
    expect((await api.as('presenter').get(episodeOf())).body).toEqual(episode)
  })

  it('should take a publish date in the past as now', async () => {
    const before = Date.now()
    const episode = await publish({ publishAt: '2020-01-01T10:00:00+02:00' })
    expect(episode.state).toBe('live')
    expect(Date.parse(episode.publishAt)).toBeGreaterThanOrEqual(before - 1000)
  })

  it('should schedule a future date: not on the public API, nor in a viewer’s list, until that time has come', async () => {
    const at = new Date(Date.now() + 3 * 24 * 3600_000)
    const episode = await publish({ publishAt: at.toISOString() })
    expect(episode).toMatchObject({ state: 'scheduled', publishAt: at.toISOString() })
    expect(await api.as('anonymous').get(publicApi())).toMatchObject({ status: 404, body: NO_EPISODE })
    expect(await api.as('viewer').get(publicApi())).toMatchObject({ status: 404, body: NO_EPISODE })
    expect(await listedAs('viewer')).toEqual([])

    // the time passes
    await api.db('episodes').where({ id: episode.id }).update({ publish_at: new Date(Date.now() - 1000) })
    expect((await pageAs('anonymous')).episode.title).toBe('Thermo Tuesday 1')
    expect(await listedAs('viewer')).toMatchObject([{ id: episode.id, state: 'live' }])
  })

  it('should keep the published snapshot while the take is edited, until it is published again', async () => {
    await publish()
    const firstStep = take.outline.lines.find((l) => l.kind === 'step')!
    await editTake((script) => {
      script.lines.find((l) => l.id === firstStep.id)!.text = 'A line rewritten after publishing.'
    })
    expect((await pageAs('anonymous')).lines.find((l) => l.id === firstStep.id)!.text).toBe(firstStep.text)
    expect((await api.as('editor').get(episodeOf())).body).toMatchObject({ takeChangedSince: true })

    const again = await publish({ title: 'Thermo Tuesday 1 (fixed)' })
    expect(again.takeChangedSince).toBe(false)
    const page = await pageAs('anonymous')
    expect(page.episode.title).toBe('Thermo Tuesday 1 (fixed)')
    expect(page.lines.find((l) => l.id === firstStep.id)!.text).toBe('A line rewritten after publishing.')
  })

  it('should refuse an address name another episode of the channel uses, and let the same take keep its own', async () => {
    await publish()
    const res = await api.as('editor').put(episodeOf(other.id), publishing({ video: { kind: 'none' } }))
    expect(res.status).toBe(409)
    expect(res.body).toMatchObject({ code: 'slug-taken', message: 'Another episode of this channel already uses the address name "thermo-tuesday-1". Pick another one.' })
    expect((await publish({ video: { kind: 'none' } })).slug).toBe('thermo-tuesday-1')
    expect((await publish({ slug: 'thermo-tuesday-2', video: { kind: 'none' } }, other.id)).state).toBe('live')
  })

  it('should let another channel use the same address name', async () => {
    await publish()
    const channelId = await api.ownersOtherChannel()
    const puzzle = await api.createPuzzle(draftOf('GT13'), channelId)
    const theirs = (await api.as('owner').post(`/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`, {})).body as OutlineRecord
    const res = await api.as('owner').put(`/api/channels/${channelId}/outlines/${theirs.id}/episode`, publishing({ video: { kind: 'none' } }))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
  })

  it("should refuse a recording of another take with a sentence, publishing nothing", async () => {
    const res = await api.as('editor').put(episodeOf(), publishing({ video: { kind: 'recording', recordingId: othersRecordingId } }))
    expect(res.status).toBe(400)
    expect(res.body.message).toBe("body.video.recordingId: the chosen recording is not one of this take's recordings")
    expect((await api.as('editor').get(episodeOf())).status).toBe(404)
  })

  it.each([
    ['a NUL in the title', { title: 'Thermo\u0000Tuesday' }, "body.title: episode title can't contain a NUL character"],
    ['an 81-character address name', { slug: 'a'.repeat(81) }, 'body.slug: the address name can be at most 80 characters'],
    ['an address name with capitals and spaces', { slug: 'Thermo Tuesday' }, 'body.slug: the address name may hold only lower-case letters, digits and single hyphens (e.g. "thermo-tuesday-12")'],
    ['a javascript: video address', { video: { kind: 'external', url: 'javascript:alert(1)' } }, 'body.video.url: video address must be a web address (https://…)'],
    ['an empty title', { title: '   ' }, 'body.title: episode title must not be empty'],
    ['an unknown visibility', { visibility: 'everyone' }, 'body.visibility: Invalid option: expected one of "public"|"members"'],
  ])('should refuse %s with a sentence (400)', async (_what, extra, message) => {
    const res = await api.as('editor').put(episodeOf(), { ...publishing(), ...extra })
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toBe(message)
  })

  it('should refuse a publish date that is not a date and time', async () => {
    const res = await api.as('editor').put(episodeOf(), { ...publishing(), publishAt: 'next tuesday' })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^body\.publishAt: /)
  })
})

describe('DELETE …/outlines/:outlineId/episode', () => {
  it('should take the page down with the same 404 as an address that never existed, and publish again on PUT', async () => {
    await publish()
    const down = await api.as('owner').delete(episodeOf())
    expect(down.status).toBe(200)
    expect(episodeSchema.parse(down.body)).toMatchObject({ state: 'unpublished', slug: 'thermo-tuesday-1' })
    expect(await api.as('anonymous').get(publicApi())).toMatchObject({ status: 404, body: NO_EPISODE })
    expect(await api.as('anonymous').get(publicApi('never-was'))).toMatchObject({ status: 404, body: NO_EPISODE })
    expect(await api.as('anonymous').get(`${publicApi()}/media`)).toMatchObject({ status: 404, body: NO_EPISODE })

    expect((await publish()).state).toBe('live')
    expect((await pageAs('anonymous')).episode.slug).toBe('thermo-tuesday-1')
  })

  it('should answer 404 for a take never published', async () => {
    const res = await api.as('owner').delete(episodeOf())
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('This take has not been published yet.')
  })
})

describe('GET /api/channels/:channelId/episodes', () => {
  it('should list every state to the studio team, and only live episodes to a viewer', async () => {
    await publish()
    await publish({ slug: 'later', publishAt: new Date(Date.now() + 3600_000).toISOString(), video: { kind: 'none' } }, other.id)
    expect(await listedAs('presenter')).toMatchObject([
      { slug: 'later', state: 'scheduled' },
      { slug: 'thermo-tuesday-1', state: 'live', puzzleTitle: take.outline.title },
    ])
    expect((await listedAs('viewer')).map((e) => e.slug)).toEqual(['thermo-tuesday-1'])
  })
})

describe('GET /api/episodes/:channelSlug/:episodeSlug', () => {
  it('should give the published page: visible lines timed from the cut-in, chapters from 0:00, the rules and the recording', async () => {
    const hidden = take.outline.lines.filter((l) => l.kind === 'step')[1]!
    await editTake((script) => {
      script.lines.find((l) => l.id === hidden.id)!.hidden = true
      script.trim = { inMs: 1500 }
      script.lines[0]!.alignedStartMs = 1500
    })
    await publish()
    const page = await pageAs('anonymous')
    expect(page.channel).toEqual({ name: 'Marigold Logic', slug: 'marigold-logic' })
    expect(page.lines.map((l) => l.id)).not.toContain(hidden.id)
    expect(page.lines).toHaveLength(take.outline.lines.length - 1)
    // the intro is aligned at the cut-in, so it starts the video; the rest follow by their estimates
    expect(page.lines[0]).toMatchObject({ kind: 'intro', startMs: 0 })
    expect(page.lines[1]!.startMs).toBe(take.outline.lines[0]!.estMs)
    expect(page.timing).toBe('estimated')
    expect(page.chapters[0]).toMatchObject({ startMs: 0, lineId: page.lines[0]!.id })
    expect(page.chapters.every((c) => page.lines.some((l) => l.id === c.lineId))).toBe(true)
    expect(page.steps).toHaveLength(take.outline.steps.length)
    // GT13 has thermometers: the rules say how they read (product.md: digits strictly increase from bulb to tip)
    expect(page.puzzle.thermometers.length).toBeGreaterThan(0)
    expect(page.puzzle.rules).toMatch(/each row, each column and each of the nine 3×3 boxes/)
    expect(page.puzzle.rules).toMatch(/from the bulb, its round end, to the tip: each one is larger than the one before/)
    expect(page.player).toEqual({ kind: 'media', url: '/api/episodes/marigold-logic/thermo-tuesday-1/media', mime: 'audio/wav', audioOnly: true })
    expect(page.captionsUrl).toBe('/api/episodes/marigold-logic/thermo-tuesday-1/captions.vtt')
    expect(page.pictureUrl).toBe('/api/episodes/marigold-logic/thermo-tuesday-1/picture.png')
  })

  it("should say 'aligned' when every shown line has an aligned start", async () => {
    await editTake((script) => {
      let at = 0
      for (const line of script.lines) {
        line.alignedStartMs = at
        at += 2000
      }
    })
    await publish()
    const page = await pageAs('anonymous')
    expect(page.timing).toBe('aligned')
    expect(page.lines.map((l) => l.startMs)).toEqual(page.lines.map((_, i) => i * 2000))
  })

  it.each([
    ['https://video.example/ep1.mp4', { kind: 'media', url: 'https://video.example/ep1.mp4', mime: 'video/mp4', audioOnly: false }],
    ['https://video.example/audio/ep1.MP3?dl=1', { kind: 'media', url: 'https://video.example/audio/ep1.MP3?dl=1', mime: 'audio/mpeg', audioOnly: true }],
    ['https://video.example/watch?v=abc', { kind: 'link', url: 'https://video.example/watch?v=abc' }],
  ])('should play the external address %s as its file name says', async (url, player) => {
    await publish({ video: { kind: 'external', url } })
    const page = await pageAs('anonymous')
    expect(page.player).toEqual(player)
    expect(page.captionsUrl !== undefined).toBe(player.kind === 'media')
  })

  it('should show no video once the published recording is deleted', async () => {
    // one of its own: the file goes with the recording, and the data restored before each test brings back rows, not files
    const doomed = await upload(take.id)
    await publish({ video: { kind: 'recording', recordingId: doomed } })
    expect((await api.as('owner').delete(`/api/channels/${api.channelId}/outlines/${take.id}/recordings/${doomed}`)).status).toBe(204)
    expect((await pageAs('anonymous')).player).toEqual({ kind: 'none' })
    expect((await api.as('anonymous').get(`${publicApi()}/media`)).status).toBe(404)
  })

  it('should answer members-only episodes to members alone, with the same 404 for everyone else', async () => {
    await publish({ visibility: 'members' })
    // the non-member owns a channel of their own: a member somewhere, just not here
    const [theirs] = await api.db('channels').insert({ name: 'Lantern Grids', slug: 'lantern-grids' }).returning('id')
    await api.db('memberships').insert({ user_id: api.user('non-member').id, channel_id: theirs!.id, role: 'owner' })
    for (const actor of ['anonymous', 'non-member'] as const) expect(await api.as(actor).get(publicApi())).toMatchObject({ status: 404, body: NO_EPISODE })
    const forged = await api.as('anonymous').get(publicApi()).set('Authorization', 'Bearer not-a-token')
    expect(forged).toMatchObject({ status: 404, body: NO_EPISODE })

    const page = await pageAs('viewer')
    expect(page.episode.visibility).toBe('members')
    const grant = /\?access=([^&]+)$/.exec(page.player.kind === 'media' ? page.player.url : '')?.[1]
    expect(grant).toBeDefined()
    expect(page.captionsUrl).toBe(`/api/episodes/marigold-logic/thermo-tuesday-1/captions.vtt?access=${grant}`)

    // a media element can't send the token: the grant in the address plays it, for this episode only
    const played = await api.as('anonymous').get(page.player.kind === 'media' ? page.player.url : '').set('Range', 'bytes=0-9').buffer(true)
    expect(played.status).toBe(206)
    expect(played.headers['content-range']).toMatch(/^bytes 0-9\/\d+$/)
    expect((await api.as('anonymous').get(page.captionsUrl!)).text).toMatch(/^WEBVTT\n/)
    expect(await api.as('anonymous').get(`${publicApi()}/media`)).toMatchObject({ status: 404, body: NO_EPISODE })
    expect(await api.as('anonymous').get(`${publicApi()}/media?access=forged.grant.value`)).toMatchObject({ status: 404, body: NO_EPISODE })

    // signing out ends the grant
    await api.as('viewer').post('/api/auth/sign-out')
    expect((await api.as('anonymous').get(page.captionsUrl!)).status).toBe(404)
  })

  it('should answer the grant of one episode with 404 on another', async () => {
    await publish({ visibility: 'members' })
    await publish({ slug: 'second', visibility: 'members', video: { kind: 'recording', recordingId: othersRecordingId } }, other.id)
    const page = await pageAs('viewer')
    const grant = page.captionsUrl!.split('?')[1]
    expect(await api.as('anonymous').get(`${publicApi('second')}/captions.vtt?${grant}`)).toMatchObject({ status: 404, body: NO_EPISODE })
  })
})

describe('GET /api/episodes/:channelSlug/:episodeSlug/media and /captions.vtt', () => {
  it('should play the published recording in ranges (RFC 9110 §14) and give WebVTT captions of the published lines', async () => {
    await publish()
    const whole = await api.as('anonymous').get(`${publicApi()}/media`).buffer(true)
    expect(whole.status, JSON.stringify(whole.body)).toBe(200)
    expect(whole.headers['content-type']).toBe('audio/wav')
    expect(whole.headers['accept-ranges']).toBe('bytes')
    const part = await api.as('anonymous').get(`${publicApi()}/media`).set('Range', 'bytes=4-11').buffer(true)
    expect(part.status).toBe(206)
    // the WAV's own header: "RIFF", its size, then "WAVE" (the RIFF WAVE format, Microsoft 1991)
    expect(Buffer.from(part.body as Buffer).subarray(4).toString('ascii')).toBe('WAVE')

    const captions = await api.as('anonymous').get(`${publicApi()}/captions.vtt`)
    expect(captions.status).toBe(200)
    expect(captions.headers['content-type']).toMatch(/^text\/vtt/)
    // W3C WebVTT: the file starts with WEBVTT; cues hold "hh:mm:ss.ttt --> hh:mm:ss.ttt"
    expect(captions.text).toMatch(/^WEBVTT\n\n1\n00:00:00\.000 --> \d\d:\d\d:\d\d\.\d{3}\n/)
  })

  it('should give no recording for an episode published with none', async () => {
    await publish({ video: { kind: 'none' } })
    expect(await api.as('anonymous').get(`${publicApi()}/media`)).toMatchObject({ status: 404, body: { message: 'This episode has no recording to play.' } })
  })
})

describe('GET /api/episodes/:channelSlug/:episodeSlug/picture.png', () => {
  it('should draw the published grid as a PNG in the asked shape, and 400 for a step past the last', async () => {
    await publish()
    const get = (query: string) => api.as('anonymous').get(`${publicApi()}/picture.png${query}`).buffer(true)
    const wide = await get('')
    expect(wide.status).toBe(200)
    expect(wide.headers['content-type']).toBe('image/png')
    // pngjs reads the PNG's own header (W3C PNG specification: IHDR width and height)
    expect(PNG.sync.read(wide.body as Buffer)).toMatchObject({ width: 1280, height: 720 })
    expect(PNG.sync.read((await get('?shape=square&step=3&highlights=off')).body as Buffer)).toMatchObject({ width: 1080, height: 1080 })
    const past = await get(`?step=${take.outline.steps.length + 1}`)
    expect(past.status).toBe(400)
    expect(past.body.message).toMatch(new RegExp(`^This take has ${take.outline.steps.length} steps`))
  })
})
