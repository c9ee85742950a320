import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'
import jwt from 'jsonwebtoken'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { createApp } from '../../server/app'
import { BoundedMemoryStore } from '../../server/auth/bounded-store'
import { issueToken } from '../../server/auth/tokens'
import type { Config } from '../../server/config'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import type { Role } from '../../shared/schemas/auth'
import { demoEmail, useApiSuite } from '../helpers/api'
import { testConfig } from '../helpers/db'

const api = useApiSuite()

/** The test app built again with some settings changed (and no client files unless a folder is given). */
function appWith(change: (config: Config) => Config, clientDir = '/nonexistent') {
  return createApp({ db: api.db, config: change(testConfig()), engine: api.engine, clientDir })
}

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

  it('should answer 429 after too many attempts for one address and e-mail', async () => {
    const attempt = () => request(api.app).post('/api/auth/sign-in').send({ email: 'guess@gridcue.example', password: 'guess' })
    const limit = testConfig().auth.signInAttemptsPer15Min
    for (let i = 0; i < limit; i++) expect((await attempt()).status).toBe(401)
    const blocked = await attempt()
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/Too many sign-in attempts/)
  })

  it('should count the e-mail in any letter case as one account', async () => {
    const limit = testConfig().auth.signInAttemptsPer15Min
    for (let i = 0; i < limit; i++) {
      const email = i % 2 ? 'guess@gridcue.example' : 'GUESS@GridCue.example'
      expect((await request(api.app).post('/api/auth/sign-in').send({ email, password: 'guess' })).status).toBe(401)
    }
    expect((await request(api.app).post('/api/auth/sign-in').send({ email: 'Guess@gridcue.example', password: 'guess' })).status).toBe(429)
  })
})

describe('POST /api/auth/sign-in, password spraying', () => {
  const perAddress = 4
  const sprayable = () => appWith((c) => ({ ...c, auth: { ...c.auth, signInAttemptsPerAddressPer15Min: perAddress } }))

  it('should answer 429 once one address has failed the per-address limit, across different e-mails', async () => {
    const app = sprayable()
    // one password against many accounts: each e-mail is tried once, far below the per-account limit
    for (let i = 0; i < perAddress; i++) {
      const res = await request(app).post('/api/auth/sign-in').send({ email: `person-${i}@gridcue.example`, password: 'Summer2026!' })
      expect(res.status).toBe(401)
    }
    const blocked = await request(app).post('/api/auth/sign-in').send({ email: demoEmail('owner'), password: DEMO_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(blocked.body.code).toBe('too-many-attempts')
  })

  it('should count only failures against the address, so an office behind one address can sign in many people', async () => {
    const app = sprayable()
    const attempt = (email: string, password: string) => request(app).post('/api/auth/sign-in').send({ email, password })
    for (let i = 0; i < perAddress - 1; i++) expect((await attempt(`person-${i}@gridcue.example`, 'guess')).status).toBe(401)
    for (const role of ['owner', 'editor', 'viewer'] as const) expect((await attempt(demoEmail(role), DEMO_PASSWORD)).status).toBe(200)
    expect((await attempt('last-try@gridcue.example', 'guess')).status).toBe(401)
    expect((await attempt('one-more@gridcue.example', 'guess')).status).toBe(429)
  })

  it("should not count another limit's refusals against the address, so they can't lock the office out", async () => {
    // per-account limit 5 (tests/helpers/db.ts); the address allows 8 wrong passwords
    const app = appWith((c) => ({ ...c, auth: { ...c.auth, signInAttemptsPerAddressPer15Min: 8 } }))
    const attempt = (email: string, password: string) => request(app).post('/api/auth/sign-in').send({ email, password })
    for (let i = 0; i < 5; i++) expect((await attempt('guessed@gridcue.example', 'guess')).status).toBe(401)
    for (let i = 0; i < 3; i++) expect((await attempt('guessed@gridcue.example', 'guess')).status).toBe(429)
    // five wrong passwords counted, not eight: the next person behind this address still signs in
    expect((await attempt(demoEmail('editor'), DEMO_PASSWORD)).status).toBe(200)
  })

  it('should count the address the proxy passes on behind TLS, and ignore that header otherwise', async () => {
    const failFrom = (app: ReturnType<typeof appWith>, address: string, i: number) =>
      request(app).post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email: `person-${i}@gridcue.example`, password: 'guess' })
    const behindTls = appWith((c) => ({ ...c, http: { ...c.http, behindTls: true }, auth: { ...c.auth, signInAttemptsPerAddressPer15Min: perAddress } }))
    for (let i = 0; i < perAddress; i++) expect((await failFrom(behindTls, '198.51.100.7', i)).status).toBe(401)
    expect((await failFrom(behindTls, '198.51.100.7', 99)).status).toBe(429)
    expect((await failFrom(behindTls, '203.0.113.20', 99)).status).toBe(401)

    const direct = sprayable()
    for (let i = 0; i < perAddress; i++) expect((await failFrom(direct, `198.51.100.${i}`, i)).status).toBe(401)
    expect((await failFrom(direct, '203.0.113.20', 99)).status).toBe(429)
  })

  it('should answer 400 for a huge e-mail before any limit counts it', async () => {
    const app = sprayable()
    for (let i = 0; i < perAddress + 2; i++) {
      const res = await request(app).post('/api/auth/sign-in').send({ email: `${'x'.repeat(900_000)}${i}@gridcue.example`, password: 'guess' })
      expect(res.status).toBe(400)
      expect(res.body.message).toBe('body.email: An e-mail address has at most 254 characters')
    }
    // the huge ones left no count behind: the address still has all its tries
    for (let i = 0; i < perAddress; i++) expect((await request(app).post('/api/auth/sign-in').send({ email: `p${i}@gridcue.example`, password: 'guess' })).status).toBe(401)
    expect((await request(app).post('/api/auth/sign-in').send({ email: 'p9@gridcue.example', password: 'guess' })).status).toBe(429)
  })

  it('should not grow the heap with huge e-mails (the attack grew it ~480 MB over 500 requests of 900 KB)', async () => {
    const collectGarbage = exposedGc()
    const app = api.app
    const heapAfterGc = () => {
      collectGarbage()
      return process.memoryUsage().heapUsed
    }
    const send = (i: number) => request(app).post('/api/auth/sign-in').send({ email: `${'y'.repeat(900_000)}${i}@gridcue.example`, password: 'guess' })
    await send(-1) // warm up: the first request compiles and allocates what every later one reuses
    const before = heapAfterGc()
    const statuses = new Set<number>()
    for (let i = 0; i < 200; i++) statuses.add((await send(i)).status)
    const grown = heapAfterGc() - before
    // 200 kept e-mails would be 180 MB; what is left is noise
    expect(grown).toBeLessThan(20 * 2 ** 20)
    expect([...statuses]).toEqual([400])
  })
})

describe('BoundedMemoryStore (the sign-in limits keep their counters in it)', () => {
  const windowMs = 60_000
  const storeOf = (maxKeys: number) => {
    const store = new BoundedMemoryStore(maxKeys)
    store.init({ windowMs } as Parameters<BoundedMemoryStore['init']>[0])
    return store
  }

  it('should count hits per key and forget them when the window ends', () => {
    vi.useFakeTimers()
    try {
      const store = storeOf(10)
      store.increment('a')
      expect(store.increment('a').totalHits).toBe(2)
      store.decrement('a')
      expect(store.get('a')?.totalHits).toBe(1)
      vi.advanceTimersByTime(windowMs)
      expect(store.get('a')).toBeUndefined()
      expect(store.increment('a').totalHits).toBe(1)
    } finally {
      vi.useRealTimers()
    }
  })

  it('should never hold more than its maximum of keys, however many callers come', () => {
    const store = storeOf(100)
    for (let i = 0; i < 10_000; i++) store.increment(`203.0.113.${i % 250}|person-${i}@example.com`)
    expect(store.size).toBe(100)
    // the newest counters are the ones kept
    expect(store.get('203.0.113.249|person-9999@example.com')?.totalHits).toBe(1)
    expect(store.get('203.0.113.0|person-0@example.com')).toBeUndefined()
  })

  it('should drop counters whose window has ended before it drops a live one', () => {
    vi.useFakeTimers()
    try {
      const store = storeOf(3)
      store.increment('old-1')
      store.increment('old-2')
      vi.advanceTimersByTime(windowMs / 2)
      store.increment('live')
      vi.advanceTimersByTime(windowMs / 2)
      store.increment('new-1')
      store.increment('new-2')
      expect(store.size).toBe(3)
      expect(store.get('live')?.totalHits).toBe(1)
    } finally {
      vi.useRealTimers()
    }
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

  it('should answer 401 for a token without an expiry, which would otherwise never run out', async () => {
    const viewer = api.user('viewer')
    const token = jwt.sign({ ver: 0 }, testConfig().auth.jwtSecret, { subject: String(viewer.id), issuer: 'gridcue', algorithm: 'HS256' })
    expect(jwt.decode(token)).not.toHaveProperty('exp')
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
  })

  it('should answer 401 for a token without a token version', async () => {
    const viewer = api.user('viewer')
    const token = jwt.sign({}, testConfig().auth.jwtSecret, { subject: String(viewer.id), issuer: 'gridcue', algorithm: 'HS256', expiresIn: 600 })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
  })

  it.each([
    ['a decimal', (id: number) => `${id}.0`],
    ['negative', () => '-1'],
    ['beyond a PostgreSQL integer', () => '99999999999'],
    ['not a number', () => 'abc'],
    ['written with a sign', (id: number) => `+${id}`],
    ['with an exponent', () => '1e0'],
    ['padded', (id: number) => ` ${id}`],
  ])('should answer 401, never 500, for a subject that is %s', async (_kind, subjectFor) => {
    const subject = subjectFor(api.user('viewer').id)
    const token = jwt.sign({ ver: 0 }, testConfig().auth.jwtSecret, { subject, issuer: 'gridcue', algorithm: 'HS256', expiresIn: 600 })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
    expect(res.body.code).toBe('unauthenticated')
  })

  it('should answer 401 for an unsigned ("none") token', async () => {
    const token = jwt.sign({}, '', { algorithm: 'none', subject: '1', issuer: 'gridcue' })
    const res = await request(api.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)
    expect(res.status).toBe(401)
  })
})

describe('POST /api/auth/sign-out', () => {
  it('should answer 204, after which the token it was sent with is refused', async () => {
    const token = await tokenFor('editor')
    expect((await request(api.app).get('/api/auth/me').set('Authorization', token)).status).toBe(200)

    const res = await request(api.app).post('/api/auth/sign-out').set('Authorization', token)
    expect(res.status).toBe(204)

    const after = await request(api.app).get('/api/auth/me').set('Authorization', token)
    expect(after.status).toBe(401)
    expect(after.body.code).toBe('unauthenticated')
  })

  it("should end every other session of the same user too: the token version is the user's, not the token's", async () => {
    const laptop = await tokenFor('presenter')
    const phone = await tokenFor('presenter')
    const someoneElse = await tokenFor('viewer')

    expect((await request(api.app).post('/api/auth/sign-out').set('Authorization', laptop)).status).toBe(204)

    expect((await request(api.app).get('/api/channels').set('Authorization', phone)).status).toBe(401)
    expect((await request(api.app).get('/api/channels').set('Authorization', someoneElse)).status).toBe(200)
  })

  it('should let the user sign in again afterwards, with a token that works', async () => {
    await request(api.app).post('/api/auth/sign-out').set('Authorization', await tokenFor('owner'))
    const fresh = await tokenFor('owner')
    expect((await request(api.app).get('/api/auth/me').set('Authorization', fresh)).status).toBe(200)
  })

  it('should answer 401 without a token', async () => {
    const res = await request(api.app).post('/api/auth/sign-out')
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

  it('should allow scripts, styles and fonts from this origin only', async () => {
    const policy = directivesOf((await request(api.app).get('/api/auth/me')).headers['content-security-policy'])
    expect(policy['script-src']).toEqual(["'self'"])
    expect(policy['font-src']).toEqual(["'self'"])
    // PrimeVue's theme writes <style> elements at run time (in Chromium, 'self' alone left the page unstyled)
    expect(policy['style-src']).toEqual(["'self'", "'unsafe-inline'"])
    for (const sources of Object.values(policy)) expect(sources.filter((s) => /^(https?:|\*)/.test(s))).toEqual([])
  })

  it('should leave out HSTS and the https upgrade unless BEHIND_TLS says so', async () => {
    const plain = await request(api.app).get('/api/auth/me')
    expect(plain.headers['strict-transport-security']).toBeUndefined()
    expect(directivesOf(plain.headers['content-security-policy'])).not.toHaveProperty('upgrade-insecure-requests')

    const behindTls = appWith((c) => ({ ...c, http: { ...c.http, behindTls: true } }))
    const res = await request(behindTls).get('/api/auth/me')
    expect(res.headers['strict-transport-security']).toMatch(/^max-age=\d+/)
    expect(directivesOf(res.headers['content-security-policy'])).toHaveProperty('upgrade-insecure-requests')
  })
})

describe('the built client', () => {
  let clientDir: string
  beforeAll(() => {
    clientDir = mkdtempSync(join(tmpdir(), 'gridcue-client-'))
    mkdirSync(join(clientDir, 'assets'))
    writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Gridcue</title><div id="app"></div>')
    writeFileSync(join(clientDir, 'assets', 'index-Cx81b2Qd.js'), 'console.log("app")')
    writeFileSync(join(clientDir, 'robots.txt'), 'User-agent: *')
  })
  afterAll(() => rmSync(clientDir, { recursive: true, force: true }))

  it('should send the shell with no-cache wherever it is asked for, so a new build shows at once', async () => {
    const app = appWith((c) => c, clientDir)
    for (const path of ['/', '/index.html', '/channels/3/studio/7']) {
      const res = await request(app).get(path)
      expect(res.status, path).toBe(200)
      expect(res.text).toContain('<div id="app">')
      expect(res.headers['cache-control'], path).toBe('no-cache')
    }
  })

  it('should let browsers keep hashed assets for a year without asking again', async () => {
    const res = await request(appWith((c) => c, clientDir)).get('/assets/index-Cx81b2Qd.js')
    expect(res.status).toBe(200)
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable')
  })

  it('should have other files revalidated, as their names do not change with their content', async () => {
    const res = await request(appWith((c) => c, clientDir)).get('/robots.txt')
    expect(res.status).toBe(200)
    expect(res.headers['cache-control']).toBe('no-cache')
  })
})

/** A Content-Security-Policy header as directive → sources. */
function directivesOf(header: string): Record<string, string[]> {
  return Object.fromEntries(
    header
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter(([name]) => name)
      .map(([name, ...sources]) => [name!, sources]),
  )
}

/** Node's garbage collector, to measure what a run really keeps (vitest's workers don't expose it). */
function exposedGc(): () => void {
  setFlagsFromString('--expose-gc')
  return runInNewContext('gc') as () => void
}
