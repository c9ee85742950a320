import { describe, expect, it } from 'vitest'
import { useApiSuite } from '../helpers/api'

const api = useApiSuite()

describe('GET /api/channels', () => {
  it('should list the channel with the caller role and member count', async () => {
    const res = await api.as('presenter').get('/api/channels')
    expect(res.body).toEqual([
      { id: api.channelId, name: 'Marigold Logic', slug: 'marigold-logic', description: expect.any(String), role: 'presenter', memberCount: 4 },
    ])
  })

  it('should list nothing for someone who is in no channel', async () => {
    const res = await api.as('non-member').get('/api/channels')
    expect(res.status).toBe(200)
    expect(res.body).toEqual([])
  })
})

describe('GET /api/channels/:channelId', () => {
  it('should describe the channel with the caller role', async () => {
    const res = await api.as('viewer').get(`/api/channels/${api.channelId}`)
    expect(res.body).toMatchObject({ id: api.channelId, name: 'Marigold Logic', role: 'viewer', memberCount: 4 })
  })

  it('should answer 404 to a member of other channels only, without revealing the channel', async () => {
    const other = await api.ownersOtherChannel()
    const res = await api.as('editor').get(`/api/channels/${other}`)
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Channel not found')
  })

  it('should answer 400 for an id that is not a number', async () => {
    const res = await api.as('owner').get('/api/channels/abc')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('params.channelId: must be a positive whole number')
  })

  it('should answer 400, not a database error, for an id beyond PostgreSQL integers', async () => {
    const res = await api.as('owner').get('/api/channels/99999999999')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('params.channelId: is too large to be an id')
  })
})

describe('GET /api/channels/:channelId/members', () => {
  it('should list the four demo people with their roles and no hashes', async () => {
    const res = await api.as('owner').get(`/api/channels/${api.channelId}/members`)
    expect(res.body.map((m: { role: string }) => m.role).sort()).toEqual(['editor', 'owner', 'presenter', 'viewer'])
    expect(JSON.stringify(res.body)).not.toMatch(/password|\$2[aby]\$/)
  })
})
