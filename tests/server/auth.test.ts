import jwt from 'jsonwebtoken'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { issueToken } from '../../server/auth/tokens'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import type { Role } from '../../shared/schemas/auth'
import { demoEmail, useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'

const api = useApiSuite()

/** A bearer header from signing in through the API, as the client gets it. */
async function tokenFor(role: Role): Promise<string> {
  const res = await request(api.app).post('/api/auth/sign-in').send({ email: demoEmail(role), password: DEMO_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return `Bearer ${res.body.token}`
}

describe('POST /api/auth/sign-in', () => {
  it('should return a token, its expiry and the user without any password hash', async () => {
    const res = await request(api.app).post('/api/auth/sign-in').send({ email: demoEmail('presenter'), password: DEMO_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ email: demoEmail('presenter'), name: 'Tomasz Ebi' })
    expect(JSON.stringify(res.body)).not.toMatch(/\$2[aby]\$/)
    expect(Object.keys(res.body.user).sort()).toEqual(['email', 'id', 'name'])
    const decoded = jwt.decode(res.body.token) as { exp: number; iat: number }
    expect(decoded.exp - decoded.iat).toBe(testConfig().auth.tokenTtlSeconds)
    expect(new Date(res.body.expiresAt).getTime()).toBe(decoded.exp * 1000)
  })

  it('should accept the e-mail in any letter case', async () => {
    const res = await request(api.app).post('/api/auth/sign-in').send({ email: demoEmail('viewer').toUpperCase(), password: DEMO_PASSWORD })
    expect(res.status).toBe(200)
  })

  it('should answer 401 with one message for a wrong password and for an unknown e-mail', async () => {
    const wrong = await request(api.app).post('/api/auth/sign-in').send({ email: demoEmail('editor'), password: 'nope' })
    const unknown = await request(api.app).post('/api/auth/sign-in').send({ email: 'nobody@gridcue.example', password: 'nope' })
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401)
      expect(res.body).toMatchObject({ code: 'bad-credentials', message: 'E-mail or password is wrong' })
    }
  })

  it('should answer 400 naming the field when the body is incomplete', async () => {
    const res = await request(api.app).post('/api/auth/sign-in').send({ email: 'not-an-email' })
    expect(res.status).toBe(400)
    expect(res.body.code).toBe('invalid-input')
    expect(res.body.details.map((d: { path: string }) => d.path)).toEqual(['body.email', 'body.password'])
  })

  it('should answer 400, not 500, when the e-mail is not text', async () => {
    const res = await request(api.app).post('/api/auth/sign-in').send({ email: { toString: 1 }, password: 'x' })
    expect(res.status).toBe(400)
    expect(res.body.details[0].path).toBe('body.email')
  })

  it('should answer 400 for a body that is not JSON', async () => {
    const res = await request(api.app).post('/api/auth/sign-in').set('Content-Type', 'application/json').send('{"email": ')
    expect(res.status).toBe(400)
    expect(res.body).toEqual({ code: 'bad-json', message: 'The request body is not valid JSON' })
  })

  it('should answer 429 after too many attempts for one address', async () => {
    const attempt = () => request(api.app).post('/api/auth/sign-in').send({ email: 'guess@gridcue.example', password: 'guess' })
    const limit = testConfig().auth.signInAttemptsPer15Min
    for (let i = 0; i < limit; i++) expect((await attempt()).status).toBe(401)
    const blocked = await attempt()
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/Too many sign-in attempts/)
  })
})

describe('GET /api/auth/me', () => {
  it('should describe the signed-in user and their channel roles', async () => {
    const res = await request(api.app).get('/api/auth/me').set('Authorization', await tokenFor('editor'))
    expect(res.status).toBe(200)
    expect(res.body.user.email).toBe(demoEmail('editor'))
    expect(res.body.memberships).toEqual([
      { channelId: expect.any(Number), channelName: 'Marigold Logic', channelSlug: 'marigold-logic', role: 'editor' },
    ])
  })

  it('should answer 401 without a token', async () => {
    const res = await request(api.app).get('/api/auth/me')
    expect(res.status).toBe(401)
    expect(res.body).toMatchObject({ code: 'unauthenticated', message: 'Please sign in first.' })
  })

  it('should answer 401 for a tampered token', async () => {
    const token = (await tokenFor('viewer')).slice('Bearer '.length)
    const [header, payload, signature] = token.split('.')
    const forged = Buffer.from(JSON.stringify({ ...JSON.parse(Buffer.from(payload!, 'base64url').toString()), sub: '1' })).toString('base64url')
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${header}.${forged}.${signature}`)
    expect(res.status).toBe(401)
  })

  it('should answer 401 for a token signed with another key', async () => {
    const { token } = issueToken(1, { jwtSecret: 'another-secret-that-is-long-enough-0123456789', tokenTtlSeconds: 600 })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
    expect(res.body.message).toMatch(/not valid/)
  })

  it('should answer 401 for an expired token', async () => {
    const token = jwt.sign({ exp: Math.floor(Date.now() / 1000) - 60 }, testConfig().auth.jwtSecret, { subject: '1', issuer: 'gridcue' })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
    expect(res.body.message).toMatch(/expired/)
  })

  it('should answer 401 for an unsigned ("none") token', async () => {
    const token = jwt.sign({}, '', { algorithm: 'none', subject: '1', issuer: 'gridcue' })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
  })
})

describe('passwords', () => {
  it('should be stored as bcrypt hashes with cost 10 or more', async () => {
    const rows = await api.db('users').select('password_hash')
    expect(rows.length).toBeGreaterThan(0)
    for (const { password_hash } of rows) {
      const [, variant, cost] = password_hash.split('$')
      expect(['2a', '2b', '2y']).toContain(variant)
      expect(Number(cost)).toBeGreaterThanOrEqual(10)
    }
  })
})

describe('unknown routes and security headers', () => {
  it('should answer a JSON 404 for an unknown API route', async () => {
    const res = await request(api.app).get('/api/no-such-thing')
    expect(res.status).toBe(404)
    expect(res.body).toEqual({ code: 'not-found', message: 'No API route for GET /api/no-such-thing' })
  })

  it('should send security headers and no CORS permission', async () => {
    const res = await request(api.app).get('/api/auth/me').set('Origin', 'http://elsewhere.example')
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['content-security-policy']).toContain("default-src 'self'")
    expect(res.headers['access-control-allow-origin']).toBeUndefined()
    expect(res.headers['x-powered-by']).toBeUndefined()
  })
})
