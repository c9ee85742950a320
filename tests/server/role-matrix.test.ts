/**
 * The role matrix, generated: every endpoint the app registers × every kind of caller, each answer
 * checked against the permission table (shared/permissions.ts). ENDPOINTS below pins each endpoint's
 * access and gives a minimal valid request; an endpoint without a row fails here. Beside the helper's
 * callers it has one more: the owner of another channel, who must fare no better than a non-member,
 * whether they name the demo channel or their own channel with the demo channel's puzzle or outline.
 */
import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import type { Express } from 'express'
import { mediaTokens } from '../../server/auth/media-tokens'
import { issueToken } from '../../server/auth/tokens'
import { insertRun } from '../../server/db/alignment-runs'
import { insertRecording } from '../../server/db/recordings'
import { newLinkToken, fromNow, HOUR_MS } from '../../server/auth/link-tokens'
import { replaceEmailChange } from '../../server/db/email-changes'
import { upsertOpenInvitation } from '../../server/db/invitations'
import { replacePasswordReset } from '../../server/db/password-resets'
import { STRONG_PASSWORD } from '../helpers/mail'
import { insertRehearsal } from '../../server/db/rehearsals'
import type { Access, EndpointInfo } from '../../server/routes/endpoint'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { rolesFor } from '../../shared/permissions'
import { scriptOf } from '../../shared/schemas/outline'
import type { OutlineRecord, PuzzleRecord } from '../../shared/schemas/studio'
import { ACTORS, demoEmail, registeredEndpoints, useApiSuite, type Actor, type ApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { wavFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

let puzzle: PuzzleRecord
let outline: OutlineRecord
let otherOwner: { id: number; channelId: number }
let played: number
let spare: number
let alignment: { recordingId: number; runId: number }
// a take still at the pipeline's first stage (the shared one is recorded and published in prepare)
let plannedTake: number
let links: Awaited<ReturnType<typeof mailedLinks>>
let rehearsalId: number
const api = useApiSuite({
  prepare: async (suite) => {
    puzzle = await suite.createPuzzle(draftOf('GT13'))
    const res = await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, {})
    if (res.status !== 201) throw new Error(`making an outline failed: ${res.status} ${JSON.stringify(res.body)}`)
    outline = res.body
    otherOwner = await ownerOfAnotherChannel(suite.db)
    plannedTake = (await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, { name: 'Planned take' })).body.id
    played = await uploadedRecording(suite, outline.id)
    spare = await uploadedRecording(suite, outline.id)
    alignment = await recordingWithRun(suite.db, outline.id)
    links = await mailedLinks(suite)
    rehearsalId = await insertRehearsal(suite.db, { outline_id: outline.id, presenter_id: null, name: 'Matrix run', lines: [], speech_ms: 0 })
    await publishedEpisode(suite, outline.id, played)
  },
})

/** The take published as a public episode playing the recording, so the episode's own and public routes have one to answer. */
async function publishedEpisode(suite: ApiSuite, outlineId: number, recordingId: number): Promise<void> {
  const body = { slug: EPISODE.episodeSlug, title: 'Matrix episode', visibility: 'public', description: '', video: { kind: 'recording', recordingId } }
  const res = await suite.as('owner').put(`/api/channels/${suite.channelId}/outlines/${outlineId}/episode`, body)
  if (res.status !== 200) throw new Error(`publishing the episode failed: ${res.status} ${JSON.stringify(res.body)}`)
}

// the published episode's public address
const EPISODE = { channelSlug: 'marigold-logic', episodeSlug: 'matrix-episode' }

/** An invented person who owns a channel of their own and is not in the demo channel. */
async function ownerOfAnotherChannel(db: typeof api.db): Promise<typeof otherOwner> {
  const { password_hash } = (await db('users').where({ email: demoEmail('owner') }).first())!
  const [user] = await db('users').insert({ email: 'other-owner@gridcue.example', name: 'Iris Mbeki', password_hash }).returning('id')
  const [channel] = await db('channels').insert({ name: 'Lantern Grids', slug: 'lantern-grids' }).returning('id')
  await db('memberships').insert({ user_id: user!.id, channel_id: channel!.id, role: 'owner' })
  return { id: user!.id, channelId: channel!.id }
}

/**
 * Links as the mails carry them (an invitation, a password reset, an address to confirm), each token known
 * here; and a second owner, so the demo owner may leave the channel like any member.
 */
async function mailedLinks(suite: ApiSuite) {
  const { db } = suite
  const { password_hash } = (await db('users').where({ email: demoEmail('owner') }).first())!
  const [coOwner] = await db('users').insert({ email: 'co-owner@gridcue.example', name: 'Ines Varga', password_hash }).returning('id')
  await db('memberships').insert({ user_id: coOwner!.id, channel_id: suite.channelId, role: 'owner' })
  const invitation = newLinkToken()
  const { id: invitationId } = await upsertOpenInvitation(db, { channel_id: suite.channelId, email: 'matrix-invitee@gridcue.example', role: 'editor', token_hash: invitation.hash, invited_by: null, expires_at: fromNow(HOUR_MS) })
  const reset = newLinkToken()
  await replacePasswordReset(db, { user_id: suite.user('viewer').id, token_hash: reset.hash, expires_at: fromNow(HOUR_MS) })
  const emailChange = newLinkToken()
  await replaceEmailChange(db, { user_id: suite.user('viewer').id, new_email: 'matrix-new-address@gridcue.example', token_hash: emailChange.hash, expires_at: fromNow(HOUR_MS) })
  return { invitationId, invitation: invitation.token, reset: reset.token, emailChange: emailChange.token }
}

/** A recording row of the outline (its file is never read here) with one queued alignment run. */
async function recordingWithRun(db: typeof api.db, outlineId: number): Promise<typeof alignment> {
  const recordingId = await insertRecording(db, {
    outline_id: outlineId, storage_key: `recordings/${outlineId}/matrix.wav`, original_name: 'matrix.wav', mime: 'audio/wav', kind: 'audio', size_bytes: 44, duration_ms: 1000, facts: {}, uploaded_by: null,
  })
  const run = await insertRun(db, { recording_id: recordingId, method: 'audio', job_id: randomUUID(), caption_text: null, created_by: null })
  return { recordingId, runId: run.id }
}

/** A recording uploaded through the API, its waveform worked out: one whose file is really there to play. */
async function uploadedRecording(suite: ApiSuite, outlineId: number): Promise<number> {
  const base = `/api/channels/${suite.channelId}/outlines/${outlineId}/recordings`
  const res = await suite.as('owner').post(base).attach('file', wavFile({ seconds: 0.5 }), 'matrix-take.wav')
  if (res.status !== 201) throw new Error(`uploading a recording failed: ${res.status} ${JSON.stringify(res.body)}`)
  for (let tries = 0; (await suite.as('owner').get(`${base}/${res.body.id}/peaks`)).status !== 200; tries++) {
    if (tries === 100) throw new Error('the waveform of the uploaded recording was not ready within 10 s')
    await new Promise((resolve) => setTimeout(resolve, 100))
  }
  return res.body.id
}

/** A playback link's token for the played recording, as the owner gets one (the data is restored before each test). */
const playbackToken = () =>
  mediaTokens(testConfig().auth.jwtSecret).issue({ userId: api.user('owner').id, tokenVersion: 0, channelId: api.channelId, outlineId: outline.id, recordingId: played }).token

interface Row {
  access: Access
  /** a valid body, built when the test runs (after the puzzle and outline above exist) */
  body?: () => object
  /** a file sent as the multipart field `file` (the body's fields go beside it) */
  file?: () => { name: string; content: Buffer }
  /** path ids (or a link's token) of this row's own, over the shared ones */
  ids?: () => Record<string, number | string>
}

/** Each endpoint by `METHOD path`: who may call it, and what a valid request sends. */
const ENDPOINTS: Record<string, Row> = {
  'GET /api/health': { access: 'public' },
  'POST /api/auth/sign-in': { access: 'public', body: () => ({ email: demoEmail('owner'), password: DEMO_PASSWORD }) },
  'POST /api/auth/sign-out': { access: 'signed-in' },
  'GET /api/auth/me': { access: 'signed-in' },
  'GET /api/channels': { access: 'signed-in' },
  'GET /api/channels/:channelId': { access: 'channel.read' },
  'GET /api/channels/:channelId/members': { access: 'members.read' },
  'POST /api/channels': { access: 'signed-in', body: () => ({ name: 'Matrix channel' }) },
  'PATCH /api/channels/:channelId': { access: 'channel.manage', body: () => ({ name: 'Marigold Logic', description: 'Renamed in the matrix.' }) },
  'PATCH /api/channels/:channelId/members/:userId': { access: 'members.manage', body: () => ({ role: 'editor' }), ids: () => ({ userId: api.user('presenter').id }) },
  'DELETE /api/channels/:channelId/members/:userId': { access: 'members.manage', ids: () => ({ userId: api.user('viewer').id }) },
  // every member may leave (a second owner is in the channel, so the demo owner may too)
  'DELETE /api/channels/:channelId/membership': { access: 'channel.read' },
  'GET /api/channels/:channelId/invitations': { access: 'members.manage' },
  'POST /api/channels/:channelId/invitations': { access: 'members.manage', body: () => ({ email: 'matrix-second-invitee@gridcue.example', role: 'viewer' }) },
  'DELETE /api/channels/:channelId/invitations/:invitationId': { access: 'members.manage', ids: () => ({ invitationId: links.invitationId }) },
  // public: the link's token is the access (refusals of used, expired and unknown links: tests/server/team.test.ts)
  'GET /api/invitations/:token': { access: 'public', ids: () => ({ token: links.invitation }) },
  'POST /api/invitations/:token/sign-up': { access: 'public', body: () => ({ name: 'Matrix Invitee', password: STRONG_PASSWORD }), ids: () => ({ token: links.invitation }) },
  'POST /api/invitations/:token/accept': { access: 'signed-in', ids: () => ({ token: links.invitation }) },
  'GET /api/account': { access: 'signed-in' },
  'PATCH /api/account': { access: 'signed-in', body: () => ({ name: 'Renamed Person' }) },
  'POST /api/account/email': { access: 'signed-in', body: () => ({ email: 'matrix-moved@gridcue.example', password: DEMO_PASSWORD }) },
  'POST /api/account/email/:token': { access: 'public', ids: () => ({ token: links.emailChange }) },
  'PUT /api/account/password': { access: 'signed-in', body: () => ({ currentPassword: DEMO_PASSWORD, newPassword: STRONG_PASSWORD }) },
  'POST /api/auth/password-reset': { access: 'public', body: () => ({ email: demoEmail('editor') }) },
  'GET /api/auth/password-reset/:token': { access: 'public', ids: () => ({ token: links.reset }) },
  'POST /api/auth/password-reset/:token': { access: 'public', body: () => ({ password: STRONG_PASSWORD }), ids: () => ({ token: links.reset }) },
  // the local mail catcher's page: registered only outside production without SMTP_URL, as in tests
  'GET /dev/mail': { access: 'public' },
  'GET /api/channels/:channelId/puzzles': { access: 'puzzle.read' },
  'POST /api/channels/:channelId/puzzles': { access: 'puzzle.edit', body: () => draftOf('PE01') },
  'GET /api/channels/:channelId/puzzles/:puzzleId': { access: 'puzzle.read' },
  'PUT /api/channels/:channelId/puzzles/:puzzleId': { access: 'puzzle.edit', body: () => ({ ...draftOf('GT13'), title: 'Renamed', version: puzzle.version }) },
  'DELETE /api/channels/:channelId/puzzles/:puzzleId': { access: 'puzzle.edit' },
  'GET /api/channels/:channelId/puzzles/:puzzleId/outlines': { access: 'outline.read' },
  'POST /api/channels/:channelId/puzzles/:puzzleId/outlines': { access: 'outline.create', body: () => ({ name: 'Another take' }) },
  'GET /api/channels/:channelId/outlines/:outlineId': { access: 'outline.read' },
  'PATCH /api/channels/:channelId/outlines/:outlineId': { access: 'outline.edit', body: () => ({ version: outline.version, script: scriptOf(outline.outline) }) },
  'GET /api/channels/:channelId/outlines/:outlineId/cue-sheet.pdf': { access: 'outline.read' },
  'GET /api/channels/:channelId/outlines/:outlineId/picture.png': { access: 'outline.read' },
  'POST /api/channels/:channelId/outlines/:outlineId/duplicate': { access: 'outline.create' },
  'POST /api/channels/:channelId/outlines/:outlineId/refresh': { access: 'outline.create', body: () => ({ version: outline.version }) },
  'DELETE /api/channels/:channelId/outlines/:outlineId': { access: 'outline.create' },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings': { access: 'recording.read' },
  'POST /api/channels/:channelId/outlines/:outlineId/recordings': { access: 'recording.edit', file: () => ({ name: 'another-take.wav', content: wavFile({ seconds: 0.2 }) }) },
  'PATCH /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId': { access: 'recording.edit', body: () => ({ current: true }), ids: () => ({ recordingId: played }) },
  // the spare one: its file goes with the first allowed delete, and later deletes of the restored row still succeed
  'DELETE /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId': { access: 'recording.edit', ids: () => ({ recordingId: spare }) },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/media': { access: 'recording.read', ids: () => ({ recordingId: played }) },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/media-link': { access: 'recording.read', ids: () => ({ recordingId: played }) },
  // public: the link's token is the access, so any caller holding a valid one plays the recording
  'GET /api/media/:token': { access: 'public', ids: () => ({ token: playbackToken() }) },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/peaks': { access: 'recording.read', ids: () => ({ recordingId: played }) },
  'POST /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/alignments': { access: 'recording.edit', body: () => ({ method: 'audio' }) },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/alignments': { access: 'recording.read' },
  'GET /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/alignments/:runId': { access: 'recording.read' },
  'DELETE /api/channels/:channelId/outlines/:outlineId/recordings/:recordingId/alignments/:runId': { access: 'recording.edit' },
  'GET /api/channels/:channelId/outlines/:outlineId/rehearsals': { access: 'rehearsal.read' },
  'POST /api/channels/:channelId/outlines/:outlineId/rehearsals': { access: 'rehearsal.run', body: () => ({ name: 'Matrix rehearsal', lines: [{ lineId: outline.outline.lines[0]!.id, ms: 4000 }] }) },
  'DELETE /api/channels/:channelId/outlines/:outlineId/rehearsals/:rehearsalId': { access: 'rehearsal.run', ids: () => ({ rehearsalId }) },
  'POST /api/channels/:channelId/outlines/:outlineId/read-aloud': { access: 'rehearsal.run', body: () => ({ fromLineId: outline.outline.lines[0]!.id, toLineId: outline.outline.lines[0]!.id }) },
  'GET /api/channels/:channelId/board': { access: 'pipeline.read' },
  'PUT /api/channels/:channelId/outlines/:outlineId/stage': { access: 'pipeline.move', body: () => ({ stage: 'scripted' }), ids: () => ({ outlineId: plannedTake }) },
  'PUT /api/channels/:channelId/outlines/:outlineId/plan': { access: 'pipeline.plan', body: () => ({ plannedOn: '2026-12-10' }) },
  'PUT /api/channels/:channelId/cadence': { access: 'channel.manage', body: () => ({ cadenceDays: 4 }) },
  'GET /api/channels/:channelId/audit': { access: 'audit.read' },
  'GET /api/notifications': { access: 'signed-in' },
  'POST /api/notifications/read': { access: 'signed-in', body: () => ({ all: true }) },
  'GET /api/notification-choices': { access: 'signed-in' },
  'PUT /api/notification-choices': { access: 'signed-in', body: () => [{ kind: 'take-ready', inApp: true, email: false }] },
  'GET /api/channels/:channelId/episodes': { access: 'episode.read' },
  'GET /api/channels/:channelId/outlines/:outlineId/episode': { access: 'outline.read' },
  'PUT /api/channels/:channelId/outlines/:outlineId/episode': {
    access: 'episode.publish',
    body: () => ({ slug: EPISODE.episodeSlug, title: 'Matrix episode again', visibility: 'members', description: 'Published again.', video: { kind: 'none' } }),
  },
  'DELETE /api/channels/:channelId/outlines/:outlineId/episode': { access: 'episode.publish' },
  // public: the episode is public and live, so every caller reads it (members-only and drafts: tests/server/episodes.test.ts)
  'GET /api/episodes/:channelSlug/:episodeSlug': { access: 'public', ids: () => EPISODE },
  'GET /api/episodes/:channelSlug/:episodeSlug/media': { access: 'public', ids: () => EPISODE },
  'GET /api/episodes/:channelSlug/:episodeSlug/captions.vtt': { access: 'public', ids: () => EPISODE },
  'GET /api/episodes/:channelSlug/:episodeSlug/picture.png': { access: 'public', ids: () => EPISODE },
  // the episode page's HTML, outside /api
  'GET /episodes/:channelSlug/:episodeSlug': { access: 'public', ids: () => EPISODE },
}

const endpoints = await registeredEndpoints()
const keyOf = (e: EndpointInfo) => `${e.method.toUpperCase()} ${e.path}`
const paramNames = (path: string) => [...path.matchAll(/:(\w+)/g)].map(([, name]) => name ?? '')

type Outcome = 'allowed' | 401 | 403 | 404

function outcomeFor(access: Access, actor: Actor): Outcome {
  if (access === 'public') return 'allowed'
  if (actor === 'anonymous') return 401
  if (access === 'signed-in') return 'allowed'
  if (actor === 'non-member') return 404
  if (rolesFor(access).includes(actor)) return 'allowed'
  // a viewer is given no hint that the studio's drafts, scripts and recordings exist (issue #11)
  return actor === 'viewer' ? 404 : 403
}

const refusal = (outcome: 401 | 403 | 404, actor: Actor) =>
  ({
    401: { code: 'unauthenticated', message: 'Please sign in first.' },
    403: { code: 'forbidden', message: `Your role in this channel (${actor}) does not allow this` },
    404: actor === 'viewer' ? { code: 'not-found', message: 'Nothing was found at this address.' } : { code: 'not-found', message: 'Channel not found' },
  })[outcome]

type Client = ReturnType<typeof api.as>

function call(endpoint: EndpointInfo, caller: Actor | Client, ids: Record<string, string | number> = {}) {
  const row = ENDPOINTS[keyOf(endpoint)]
  if (!row) throw new Error(`${keyOf(endpoint)} has no row in ENDPOINTS: add its access and a valid request`)
  const known: Record<string, string | number> = { channelId: api.channelId, puzzleId: puzzle.id, outlineId: outline.id, ...alignment, ...row.ids?.(), ...ids }
  const path = endpoint.path.replace(/:(\w+)/g, (_, name: string) => {
    if (known[name] === undefined) throw new Error(`no test id for :${name}`)
    return String(known[name])
  })
  const client = typeof caller === 'string' ? api.as(caller) : caller
  const req = client[endpoint.method](path, row.body?.())
  const file = row.file?.()
  return file ? req.attach('file', file.content, file.name) : req
}

/** Requests as the owner of the other channel, with a token signed for them as the helper signs its callers'. */
function asOtherChannelOwner(): Client {
  const authorization = `Bearer ${issueToken(otherOwner.id, testConfig().auth).token}`
  const send = (method: EndpointInfo['method']) => (path: string, body?: object) => {
    const req = request(api.app)[method](path).set('Authorization', authorization)
    return body === undefined ? req : req.send(body)
  }
  return { get: send('get'), post: send('post'), put: send('put'), patch: send('patch'), delete: send('delete') }
}

const isResourceId = (name: string) => name !== 'channelId'

for (const endpoint of endpoints) {
  describe(`${keyOf(endpoint)} (${endpoint.access})`, () => {
    for (const actor of ACTORS) {
      const outcome = outcomeFor(endpoint.access, actor)
      it(`as ${actor} → ${outcome === 'allowed' ? '2xx' : outcome}`, async () => {
        const res = await call(endpoint, actor)
        if (outcome === 'allowed') expect(res.status, JSON.stringify(res.body)).toSatisfy((s: number) => s >= 200 && s < 300)
        else expect({ status: res.status, body: res.body }).toEqual({ status: outcome, body: refusal(outcome, actor) })
      })
    }
    const outsider = outcomeFor(endpoint.access, 'non-member')
    it(`as the owner of another channel → ${outsider === 'allowed' ? '2xx' : outsider}, like a non-member`, async () => {
      const res = await call(endpoint, asOtherChannelOwner())
      if (outsider === 'allowed') expect(res.status, JSON.stringify(res.body)).toSatisfy((s: number) => s >= 200 && s < 300)
      else expect({ status: res.status, body: res.body }).toEqual({ status: outsider, body: refusal(outsider, 'non-member') })
    })
    if (endpoint.path.includes(':channelId') && paramNames(endpoint.path).some(isResourceId)) {
      it("as the owner of another channel, naming the demo channel's puzzle or outline under their own channel → 404", async () => {
        const res = await call(endpoint, asOtherChannelOwner(), { channelId: otherOwner.channelId })
        expect(res.status, JSON.stringify(res.body)).toBe(404)
        expect(res.body.code).toBe('not-found')
      })
    }
    if (endpoint.path.includes(':channelId')) {
      it('as owner with a channel id that is not a number → 400', async () => {
        const res = await call(endpoint, 'owner', { channelId: 'first' })
        expect(res.status).toBe(400)
        expect(res.body.message).toBe('params.channelId: must be a positive whole number')
      })
    }
  })
}

describe('the endpoint table', () => {
  it('should have one row per registered endpoint, naming the access it was registered with', () => {
    const registered = Object.fromEntries(endpoints.map((e) => [keyOf(e), e.access]))
    const rows = Object.fromEntries(Object.entries(ENDPOINTS).map(([key, row]) => [key, row.access]))
    expect(registered).toEqual(rows)
  })

  it('should know every route the app answers (no route added around the endpoint table)', () => {
    expect(routesOf(api.app.router).sort()).toEqual(endpoints.map(keyOf).sort())
  })
})

type Layer = Express['router']['stack'][number]

/** `METHOD path` of every route in a router and the routers mounted in it. */
function routesOf(router: { stack: Layer[] }): string[] {
  return router.stack.flatMap((layer) => {
    const route = layer.route
    if (route) return [...new Set(route.stack.map((l) => l.method.toUpperCase()))].map((method) => `${method} ${route.path}`)
    const mounted = layer.handle
    return 'stack' in mounted && Array.isArray(mounted.stack) ? routesOf({ stack: mounted.stack }) : []
  })
}
