/**
 * The episode pipeline through the API against the real PostgreSQL: explicit stage moves by role (the table in
 * shared/schemas/pipeline.ts), the moves that follow an upload, an alignment and publishing, plans and the
 * cadence (every 3 days by default: common practice), the audit rows, notifications in the app and by mail
 * (read back from the local fake SMTP server, parsed by mailparser), and each person's choices.
 */
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { insertRun } from '../../server/db/alignment-runs'
import { sharedMailCatcher, type MailCatcher } from '../../server/mail/catcher'
import { takeAlignedByRun } from '../../server/services/pipeline'
import { auditEventSchema, boardSchema, notificationListSchema, type BoardTake } from '../../shared/schemas/pipeline'
import type { OutlineRecord } from '../../shared/schemas/studio'
import { demoEmail, useApiSuite, type Actor } from '../helpers/api'
import { wavFile } from '../helpers/media'
import { draftOf } from '../helpers/studio'

let take: OutlineRecord
const api = useApiSuite({
  prepare: async (suite) => {
    const puzzle = await suite.createPuzzle(draftOf('GT13'))
    const res = await suite.as('owner').post(`/api/channels/${suite.channelId}/puzzles/${puzzle.id}/outlines`, { name: 'Pipeline take' })
    if (res.status !== 201) throw new Error(`making an outline failed: ${res.status} ${JSON.stringify(res.body)}`)
    take = res.body
  },
})

let mail: MailCatcher
beforeAll(async () => {
  mail = await sharedMailCatcher()
})

const base = () => `/api/channels/${api.channelId}`
const takePath = () => `${base()}/outlines/${take.id}`
const move = (actor: Actor, stage: string) => api.as(actor).put(`${takePath()}/stage`, { stage })

async function boardTake(): Promise<BoardTake> {
  const res = await api.as('owner').get(`${base()}/board`)
  expect(res.status).toBe(200)
  return boardSchema.parse(res.body).takes.find((t) => t.outlineId === take.id)!
}

async function audit(query = '') {
  const res = await api.as('owner').get(`${base()}/audit${query}`)
  expect(res.status).toBe(200)
  return auditEventSchema.array().parse(res.body)
}

async function notificationsOf(actor: Actor) {
  const res = await api.as(actor).get('/api/notifications')
  expect(res.status).toBe(200)
  return notificationListSchema.parse(res.body)
}

async function upload(actor: Actor = 'editor') {
  const res = await api.as(actor).post(`${takePath()}/recordings`).attach('file', wavFile({ seconds: 0.3 }), 'pipeline-take.wav')
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id as number
}

describe('the board', () => {
  it('should list a new take at Planned with no plan, the cadence of 3 days and the studio team to assign', async () => {
    const res = await api.as('presenter').get(`${base()}/board`)
    expect(res.status).toBe(200)
    const board = boardSchema.parse(res.body)
    expect(board.cadenceDays).toBe(3)
    expect(board.people.map((p) => p.name).sort()).toEqual(['Noor Lindqvist', 'Priya Castellanos', 'Tomasz Ebi'])
    expect(board.takes.find((t) => t.outlineId === take.id)).toMatchObject({ stage: 'planned', plannedOn: null, assignee: null, hasRecording: false, name: 'Pipeline take' })
  })
})

describe('stage moves by role', () => {
  // each role against the stages it may and may not move a take into (STAGE_MOVERS)
  const cases: [Actor, string, number][] = [
    ['presenter', 'rehearsed', 200],
    ['editor', 'rehearsed', 403],
    ['editor', 'scripted', 200],
    ['owner', 'rehearsed', 200],
    ['viewer', 'scripted', 404],
  ]
  for (const [actor, stage, status] of cases) {
    it(`should answer ${status} when the ${actor} moves a take to ${stage}`, async () => {
      const res = await move(actor, stage)
      expect(res.status, JSON.stringify(res.body)).toBe(status)
      expect((await boardTake()).stage).toBe(status === 200 ? stage : 'planned')
    })
  }

  it('should say why a presenter may not mark a take aligned', async () => {
    const res = await move('presenter', 'aligned')
    expect(res.body).toEqual({ code: 'forbidden', message: "Your role in this channel (presenter) can't move a take to Aligned." })
  })

  it('should refuse impossible moves with 409 and a sentence', async () => {
    expect((await move('owner', 'planned')).body).toEqual({ code: 'impossible-move', message: 'This take is at Planned already.' })
    expect((await move('owner', 'recorded')).body.message).toBe('Upload a recording of this take before moving it to Recorded.')
    const published = await move('owner', 'published')
    expect(published.status).toBe(409)
    expect(published.body.message).toMatch(/publish it from the studio/)
  })

  it('should refuse an unknown stage with 400', async () => {
    const res = await move('owner', 'filmed')
    expect(res.status).toBe(400)
    expect(res.body.code).toBe('invalid-input')
  })

  it('should write an audit row naming who moved the take, from where to where', async () => {
    await move('presenter', 'scripted')
    const [row] = await audit()
    expect(row).toMatchObject({ kind: 'stage-moved', actor: { userId: api.user('presenter').id, name: 'Tomasz Ebi' }, details: { outlineId: take.id, from: 'planned', to: 'scripted' } })
    expect(row!.subject).toContain('Pipeline take')
  })

  it('should tell post-production (owner and editor) when a take is marked recorded, not the one who marked it', async () => {
    await upload()
    await move('owner', 'rehearsed')
    expect((await move('presenter', 'recorded')).status).toBe(200)
    const editor = await notificationsOf('editor')
    expect(editor.items[0]).toMatchObject({ kind: 'take-ready', channelId: api.channelId, link: `/channels/${api.channelId}/outlines/${take.id}`, read: false })
    expect((await notificationsOf('presenter')).items.some((n) => n.kind === 'take-ready')).toBe(false)
  })
})

describe('the person on a take', () => {
  it('should hear a take is ready for editing though their role is not post-production', async () => {
    await api.as('owner').put(`${takePath()}/plan`, { assigneeId: api.user('presenter').id })
    await upload('editor')
    await move('editor', 'scripted')
    // an upload moves a take on only from an earlier stage: back at Scripted, the editor marks it recorded
    expect((await move('editor', 'recorded')).status).toBe(200)
    expect((await notificationsOf('presenter')).items.map((n) => n.kind)).toContain('take-ready')
    expect((await notificationsOf('owner')).items.map((n) => n.kind)).toContain('take-ready')
    expect((await notificationsOf('editor')).items.map((n) => n.kind)).not.toContain('take-ready')
  })
})

describe('moves that follow other work', () => {
  it('should mark the take recorded on an upload, record it, and tell the team in the app and by mail', async () => {
    const mailed = mail.nextMail((m) => m.to.includes(demoEmail('presenter')) && m.subject.includes('recording was uploaded'))
    await upload('editor')
    expect(await boardTake()).toMatchObject({ stage: 'recorded', hasRecording: true })
    const [row] = await audit('?kind=stage-moved')
    expect(row).toMatchObject({ actor: { name: 'Priya Castellanos' }, details: { from: 'planned', to: 'recorded', automatic: 'upload' } })
    expect((await notificationsOf('owner')).items[0]).toMatchObject({ kind: 'recording-uploaded', text: expect.stringContaining('Priya Castellanos uploaded a recording') })
    // the uploader is not told of their own upload, and viewers are not told of studio work
    expect((await notificationsOf('editor')).unread).toBe(0)
    expect((await notificationsOf('viewer')).unread).toBe(0)
    const message = await mailed
    // the studio's address: the align screen is for owners and editors only
    expect(message.text).toContain(`/channels/${api.channelId}/outlines/${take.id}\n`)
    expect(message.html).toContain(`/channels/${api.channelId}/outlines/${take.id}">Open it in Gridcue</a>`)
    // the puzzle's title in quotes, escaped as HTML
    expect(message.html).toMatch(/&quot;[^<]+&quot; \(Pipeline take\)/)
  })

  it('should not take a take back when a recording is uploaded after it was aligned', async () => {
    await upload()
    await move('editor', 'aligned')
    await upload()
    expect((await boardTake()).stage).toBe('aligned')
  })

  it('should mark a recorded take aligned when an alignment run finishes', async () => {
    const recordingId = await upload()
    const run = await insertRun(api.db, { recording_id: recordingId, method: 'audio', job_id: randomUUID(), caption_text: null, created_by: null })
    await takeAlignedByRun(api.db, run.id)
    expect((await boardTake()).stage).toBe('aligned')
    expect((await audit('?kind=stage-moved'))[0]).toMatchObject({ actor: null, details: { to: 'aligned', automatic: 'alignment' } })
  })

  it('should mark the take published on its publish day, refuse moving it, and go back to Aligned when unpublished', async () => {
    const recordingId = await upload()
    const publishAt = '2030-05-04T10:00:00.000Z'
    const episode = { slug: 'pipeline-take', title: 'Pipeline take', visibility: 'public', description: '', video: { kind: 'recording', recordingId }, publishAt }
    expect((await api.as('editor').put(`${takePath()}/episode`, episode)).status).toBe(200)
    expect(await boardTake()).toMatchObject({ stage: 'published', plannedOn: '2030-05-04' })
    expect((await audit('?kind=episode-published'))[0]).toMatchObject({ actor: { name: 'Priya Castellanos' }, details: { slug: 'pipeline-take', publishAt, from: 'recorded' } })
    // a publish day still to come: the team hears the episode was scheduled
    expect((await notificationsOf('presenter')).items[0]).toMatchObject({ kind: 'episode-scheduled', text: expect.stringContaining('2030-05-04') })
    expect((await move('owner', 'scripted')).body.message).toBe('This take is published. Unpublish its episode first, then move it.')

    expect((await api.as('owner').delete(`${takePath()}/episode`)).status).toBe(200)
    expect((await boardTake()).stage).toBe('aligned')
    expect((await audit())[0]).toMatchObject({ kind: 'episode-unpublished', actor: { name: 'Noor Lindqvist' } })
  })

  it('should tell the team an episode was published when it goes live now', async () => {
    const episode = { slug: 'pipeline-now', title: 'Now', visibility: 'public', description: '', video: { kind: 'none' } }
    expect((await api.as('owner').put(`${takePath()}/episode`, episode)).status).toBe(200)
    expect((await notificationsOf('editor')).items[0]).toMatchObject({ kind: 'episode-published' })
  })
})

describe('plans and the cadence', () => {
  it('should set a planned day and a person on the take, and write it in the audit log', async () => {
    const res = await api.as('presenter').put(`${takePath()}/plan`, { plannedOn: '2026-12-10', assigneeId: api.user('editor').id })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ plannedOn: '2026-12-10', assignee: { userId: api.user('editor').id, name: 'Priya Castellanos' } })
    expect((await audit('?kind=take-planned'))[0]).toMatchObject({ details: { plannedOn: '2026-12-10', assignee: 'Priya Castellanos' } })
    // a field left out stays, null clears
    await api.as('owner').put(`${takePath()}/plan`, { assigneeId: null })
    expect(await boardTake()).toMatchObject({ plannedOn: '2026-12-10', assignee: null })
  })

  it('should refuse a viewer or a stranger as the person on a take, and a day that is no date', async () => {
    const viewer = await api.as('owner').put(`${takePath()}/plan`, { assigneeId: api.user('viewer').id })
    expect(viewer.status).toBe(400)
    expect(viewer.body.message).toBe("body.assigneeId: that person isn't on this channel's team (owners, presenters and editors)")
    expect((await api.as('owner').put(`${takePath()}/plan`, { assigneeId: api.user('non-member').id })).status).toBe(400)
    const date = await api.as('owner').put(`${takePath()}/plan`, { plannedOn: '2026-02-30' })
    expect(date.status).toBe(400)
    expect((await api.as('owner').put(`${takePath()}/plan`, {})).status).toBe(400)
  })

  it('should let an owner change the cadence, with an audit row, and refuse a cadence under a day', async () => {
    expect((await api.as('owner').put(`${base()}/cadence`, { cadenceDays: 7 })).body).toEqual({ cadenceDays: 7 })
    expect(boardSchema.parse((await api.as('editor').get(`${base()}/board`)).body).cadenceDays).toBe(7)
    expect((await audit('?kind=cadence-changed'))[0]).toMatchObject({ details: { from: 3, to: 7 } })
    const zero = await api.as('owner').put(`${base()}/cadence`, { cadenceDays: 0 })
    expect(zero.status).toBe(400)
    expect(zero.body.message).toBe('body.cadenceDays: the cadence is at least one day')
  })
})

describe('the audit log', () => {
  it('should filter by kind and by person, newest first', async () => {
    await move('presenter', 'scripted')
    await api.as('owner').put(`${takePath()}/plan`, { plannedOn: '2026-12-13' })
    await move('owner', 'rehearsed')
    expect((await audit()).map((r) => r.kind)).toEqual(['stage-moved', 'take-planned', 'stage-moved'])
    expect((await audit(`?actorId=${api.user('owner').id}`)).map((r) => r.kind)).toEqual(['stage-moved', 'take-planned'])
    expect((await audit('?kind=take-planned')).map((r) => r.actor?.name)).toEqual(['Noor Lindqvist'])
    expect((await api.as('owner').get(`${base()}/audit?kind=coffee`)).status).toBe(400)
  })
})

describe('notifications and choices', () => {
  it('should count unread ones and mark the named ones read, passing over anyone else’s', async () => {
    await upload('editor')
    await upload('editor')
    const before = await notificationsOf('owner')
    expect(before.unread).toBe(2)
    const presenterIds = (await notificationsOf('presenter')).items.map((n) => n.id)
    const res = await api.as('owner').post('/api/notifications/read', { ids: [before.items[0]!.id, ...presenterIds] })
    expect(res.status).toBe(204)
    expect((await notificationsOf('owner')).unread).toBe(1)
    expect((await notificationsOf('presenter')).unread).toBe(2)
    await api.as('owner').post('/api/notifications/read', { all: true })
    expect((await notificationsOf('owner')).unread).toBe(0)
  })

  it('should start with every kind on both ways', async () => {
    const res = await api.as('viewer').get('/api/notification-choices')
    expect(res.body).toEqual([
      { kind: 'take-ready', inApp: true, email: true },
      { kind: 'recording-uploaded', inApp: true, email: true },
      { kind: 'episode-published', inApp: true, email: true },
      { kind: 'episode-scheduled', inApp: true, email: true },
    ])
  })

  it('should keep a kind out of the bell and the mail once turned off', async () => {
    const saved = await api.as('owner').put('/api/notification-choices', [{ kind: 'recording-uploaded', inApp: false, email: false }])
    expect(saved.status).toBe(200)
    expect(saved.body).toContainEqual({ kind: 'recording-uploaded', inApp: false, email: false })
    mail.clear()
    const presenterMail = mail.nextMail((m) => m.to.includes(demoEmail('presenter')))
    await upload('editor')
    await presenterMail
    expect((await notificationsOf('owner')).unread).toBe(0)
    expect((await notificationsOf('presenter')).unread).toBe(1)
    expect(mail.mails().filter((m) => m.to.includes(demoEmail('owner')))).toEqual([])
  })

  it('should refuse a kind given twice', async () => {
    const twice = { kind: 'take-ready', inApp: true, email: false }
    const res = await api.as('owner').put('/api/notification-choices', [twice, twice])
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('body: give each kind of notification once')
  })
})
