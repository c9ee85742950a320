import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Express } from 'express'
import type { Db } from '../../server/db/knex'
import { ACTORS, openApiSuite, type Actor, type ApiSuite } from '../helpers/api'

let suite: ApiSuite
let db: Db
let app: Express
let tokens: ApiSuite['tokens']
let channelId: number
beforeAll(async () => {
  suite = await openApiSuite()
  ;({ db, app, tokens, channelId } = suite)
})
afterAll(() => suite.close())

const get = (path: string, actor: Actor) => {
  const req = request(app).get(path)
  return tokens[actor] ? req.set('Authorization', tokens[actor]!) : req
}

describe('role matrix', () => {
  const matrix: { route: string; expected: Record<Actor, number> }[] = [
    { route: '/api/auth/me', expected: { anonymous: 401, viewer: 200, editor: 200, presenter: 200, owner: 200 } },
    { route: '/api/channels', expected: { anonymous: 401, viewer: 200, editor: 200, presenter: 200, owner: 200 } },
    { route: '/api/channels/:id', expected: { anonymous: 401, viewer: 200, editor: 200, presenter: 200, owner: 200 } },
    { route: '/api/channels/:id/members', expected: { anonymous: 401, viewer: 403, editor: 200, presenter: 200, owner: 200 } },
  ]
  for (const { route, expected } of matrix) {
    for (const actor of ACTORS) {
      it(`GET ${route} as ${actor} → ${expected[actor]}`, async () => {
        const res = await get(route.replace(':id', String(channelId)), actor)
        expect(res.status).toBe(expected[actor])
      })
    }
  }
})

describe('GET /api/channels', () => {
  it('should list the channel with the caller role and member count', async () => {
    const res = await get('/api/channels', 'presenter')
    expect(res.body).toEqual([
      { id: channelId, name: 'Marigold Logic', slug: 'marigold-logic', description: expect.any(String), role: 'presenter', memberCount: 4 },
    ])
  })
})

describe('GET /api/channels/:channelId', () => {
  it('should answer 404 to someone who is not a member, without revealing the channel', async () => {
    const other = (await db('channels').insert({ name: 'Elsewhere', slug: 'elsewhere' }).returning('id'))[0]!.id
    const res = await get(`/api/channels/${other}`, 'owner')
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Channel not found')
  })

  it('should answer 400 for an id that is not a number', async () => {
    const res = await get('/api/channels/abc', 'owner')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('params.channelId: must be a positive whole number')
  })

  it('should answer 400, not a database error, for an id beyond PostgreSQL integers', async () => {
    const res = await get('/api/channels/99999999999', 'owner')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('params.channelId: is too large to be an id')
  })
})

describe('GET /api/channels/:channelId/members', () => {
  it('should list the four demo people with their roles and no hashes', async () => {
    const res = await get(`/api/channels/${channelId}/members`, 'owner')
    expect(res.body.map((m: { role: string }) => m.role).sort()).toEqual(['editor', 'owner', 'presenter', 'viewer'])
    expect(JSON.stringify(res.body)).not.toMatch(/password|\$2[aby]\$/)
  })

  it('should tell a viewer which role blocks them', async () => {
    const res = await get(`/api/channels/${channelId}/members`, 'viewer')
    expect(res.body).toMatchObject({ code: 'forbidden', message: 'Your role in this channel (viewer) does not allow this' })
  })
})
