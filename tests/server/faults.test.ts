/**
 * The database going away while the app runs: PostgreSQL is stopped under a running app (a cluster of this
 * file's own, so the other suites' database stays up), then started again. Every answer meanwhile is a 503
 * that says nothing was stored — never a 500, never a wait of more than a few seconds — and the same app
 * serves again once the database is back, without a restart.
 */
import { createServer, type AddressInfo, type Server, type Socket } from 'node:net'
import type { Express } from 'express'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { createDb, isConnectionFailure, type Db } from '../../server/db/knex'
import type { EnginePool } from '../../server/workers/engine-pool'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { scriptOf, type Outline } from '../../shared/schemas/outline'
import type { OutlineRecord, PuzzleRecord } from '../../shared/schemas/studio'
import { editLineText } from '../../shared/script/index'
import { demoEmail, testEnginePool } from '../helpers/api'
import { testConfig } from '../helpers/db'
import { startOwnPostgres, type OwnPostgres } from '../helpers/own-postgres'

const SAVE_NOT_STORED = "The database is unavailable; this change was not saved — it is kept in this browser and will be sent when it's back."
/** "A few seconds": a refused connection fails at once, so anything near the 3 s connect timeout is a hang. */
const QUICK_MS = 2000

const quiet = { warn: () => {} }
const buildApp = (db: Db, engine: EnginePool): Express => createApp({ db, config: testConfig(), engine, clientDir: '/nonexistent' })

let cluster: OwnPostgres
let db: Db
let engine: EnginePool
let app: Express
let token: string
let channelId: number
let puzzle: PuzzleRecord
let outline: OutlineRecord

const get = (path: string) => request(app).get(path).set('Authorization', `Bearer ${token}`)
const patch = (path: string, body: object) => request(app).patch(path).set('Authorization', `Bearer ${token}`).send(body)
const put = (path: string, body: object) => request(app).put(path).set('Authorization', `Bearer ${token}`).send(body)
const post = (path: string) => request(app).post(path).set('Authorization', `Bearer ${token}`)
const outlinePath = () => `/api/channels/${channelId}/outlines/${outline.id}`
const puzzlePath = () => `/api/channels/${channelId}/puzzles/${puzzle.id}`
const retitled = (o: Outline, text: string): Outline => editLineText(o, o.lines[1]!.id, text)
const puzzleSave = (title: string) => ({ title, givens: puzzle.givens, thermometers: puzzle.thermometers, version: puzzle.version })

/** The body of a set-up request that must succeed. */
async function ok(send: request.Test) {
  const res = await send
  if (res.status >= 300) throw new Error(`set-up request answered ${res.status}: ${JSON.stringify(res.body)}`)
  return res.body
}

/** A request and how long its answer took. */
async function timed(send: () => request.Test): Promise<{ res: request.Response; ms: number }> {
  const start = performance.now()
  const res = await send()
  return { res, ms: performance.now() - start }
}

beforeAll(async () => {
  cluster = await startOwnPostgres()
  db = createDb(cluster.url, { logger: quiet })
  engine = testEnginePool()
  app = buildApp(db, engine)
  const signIn = await ok(request(app).post('/api/auth/sign-in').send({ email: demoEmail('presenter'), password: DEMO_PASSWORD }))
  token = signIn.token
  channelId = (await ok(get('/api/channels')))[0].id
  // the demo seed's puzzles: "Four Fevers" has the one outline
  const puzzles: PuzzleRecord[] = await ok(get(`/api/channels/${channelId}/puzzles`))
  puzzle = await ok(get(`/api/channels/${channelId}/puzzles/${puzzles.find((p) => p.outlineCount > 0)!.id}`))
  const [take] = await ok(get(`/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`))
  outline = await ok(get(`/api/channels/${channelId}/outlines/${take.id}`))
})

afterAll(async () => {
  await engine?.destroy()
  await db?.destroy()
  await cluster?.destroy()
})

describe('the database stopped and started under a running app', () => {
  it('should report the database up while it runs', async () => {
    const res = await request(app).get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ status: 'ok', database: 'up' })
  })

  it('should answer reads, saves, sign-in and the health check with a quick 503 while it is stopped', async () => {
    await cluster.stop()
    const answers = {
      read: await timed(() => get(outlinePath())),
      list: await timed(() => get(`/api/channels/${channelId}/puzzles`)),
      outlineSave: await timed(() => patch(outlinePath(), { version: outline.version, script: scriptOf(retitled(outline.outline, 'Written while the database was away.')) })),
      puzzleSave: await timed(() => put(puzzlePath(), puzzleSave('Renamed while the database was away'))),
      signIn: await timed(() => request(app).post('/api/auth/sign-in').send({ email: demoEmail('owner'), password: DEMO_PASSWORD })),
      duplicate: await timed(() => post(`/api/channels/${channelId}/outlines/${outline.id}/duplicate`)),
      health: await timed(() => request(app).get('/api/health')),
    }
    for (const [name, { res, ms }] of Object.entries(answers)) {
      expect({ name, status: res.status, code: res.body.code }).toEqual({ name, status: 503, code: 'database-unavailable' })
      expect(ms, name).toBeLessThan(QUICK_MS)
      expect(res.headers['retry-after'], name).toBe('5')
    }
    // a save says plainly that it was not stored; a read doesn't talk about changes
    expect(answers.outlineSave.res.body.message).toBe(SAVE_NOT_STORED)
    expect(answers.puzzleSave.res.body.message).toBe(SAVE_NOT_STORED)
    expect(answers.read.res.body.message).toBe('The database is unavailable, so this could not be loaded. Try again in a moment.')
    // signing in changes nothing a browser keeps: it must not promise to send anything later
    // nothing keeps a duplicate to send again: it says so rather than promising it
    expect(answers.duplicate.res.body.message).toBe("The database is unavailable, so this wasn't done. Try again in a moment.")
    expect(answers.signIn.res.body.message).toBe("The database is unavailable, so signing in can't be checked right now. Try again in a moment.")
    expect(answers.health.res.body).toMatchObject({ status: 'degraded', database: 'down' })
  })

  it('should serve again once it is started, with nothing of the refused saves stored', async () => {
    await cluster.start()
    const health = await request(app).get('/api/health')
    expect(health.status).toBe(200)
    expect(health.body).toEqual({ status: 'ok', database: 'up' })

    const read = await get(outlinePath())
    expect(read.status).toBe(200)
    // the version is the one read before the outage: the 503 save wrote nothing
    expect(read.body.version).toBe(outline.version)
    expect(read.body.outline.lines[1].text).not.toBe('Written while the database was away.')

    // the browser's copy, sent again as the studio's autosave does, now lands
    const resent = await patch(outlinePath(), { version: outline.version, script: scriptOf(retitled(outline.outline, 'Written while the database was away.')) })
    expect(resent.status).toBe(200)
    expect(resent.body.version).toBe(outline.version + 1)
    const stored = await get(outlinePath())
    expect(stored.body.outline.lines[1].text).toBe('Written while the database was away.')
    const renamed = await put(puzzlePath(), puzzleSave('Renamed after the outage'))
    expect(renamed.status).toBe(200)
    expect(renamed.body.title).toBe('Renamed after the outage')
    outline = stored.body
    puzzle = renamed.body
  })

  it('should answer requests in flight when it stops with 2xx, 409 or 503 only, and serve again after', async () => {
    // reads and saves keep coming while PostgreSQL shuts down; the saves share one version, so one can win
    const reads: Promise<request.Response>[] = []
    const saves: Promise<request.Response>[] = []
    const wave = () => {
      reads.push(get(outlinePath()).then((res) => res))
      saves.push(patch(outlinePath(), { version: outline.version, script: scriptOf(retitled(outline.outline, `Racing save ${saves.length}`)) }).then((res) => res))
    }
    // traffic starts with the database up and goes on until it has stopped, plus one wave after
    let stopped = false
    const traffic = (async () => {
      while (!stopped) {
        wave()
        await new Promise((resolve) => setTimeout(resolve, 2))
      }
      wave()
    })()
    await new Promise((resolve) => setTimeout(resolve, 100))
    await cluster.stop()
    stopped = true
    await traffic
    const saveStatuses = (await Promise.all(saves)).map((res) => res.status)
    const statuses = [...(await Promise.all(reads)).map((res) => res.status), ...saveStatuses]
    expect(statuses.filter((s) => ![200, 409, 503].includes(s))).toEqual([])
    expect(statuses).toContain(503)

    await cluster.start()
    const after = await get(outlinePath())
    expect(after.status).toBe(200)
    // a save answered 200 was stored; one answered 503 was not
    expect(after.body.version - outline.version).toBe(saveStatuses.filter((s) => s === 200).length)
  })
})

describe('a database that freezes under a running app', () => {
  let frozenDb: Db
  let frozenApp: Express

  beforeAll(async () => {
    frozenDb = createDb(cluster.url, { timeoutMs: 500, queryTimeoutMs: 800, logger: quiet })
    frozenApp = buildApp(frozenDb, engine)
    await request(frozenApp).get('/api/health').expect(200) // the pool holds open connections when the freeze comes
  })
  afterAll(async () => {
    await cluster.thaw()
    await frozenDb.destroy()
  })

  it('should answer 503 after the query time-out instead of holding the request, and serve again once it runs on', async () => {
    await cluster.freeze()
    try {
      const { res, ms } = await timed(() => request(frozenApp).get(outlinePath()).set('Authorization', `Bearer ${token}`))
      expect(res.status).toBe(503)
      expect(res.body.code).toBe('database-unavailable')
      expect(ms).toBeLessThan(QUICK_MS)
    } finally {
      await cluster.thaw()
    }
    const after = await request(frozenApp).get(outlinePath()).set('Authorization', `Bearer ${token}`)
    expect(after.status).toBe(200)
  })
})

describe('a database that accepts connections but never answers', () => {
  let silent: Server
  const sockets: Socket[] = []
  let hungDb: Db
  let hungApp: Express

  beforeAll(async () => {
    // a listener that takes the TCP connection and says nothing, as a frozen server or a dead route does
    silent = createServer((socket) => void sockets.push(socket))
    await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve))
    const { port } = silent.address() as AddressInfo
    hungDb = createDb(`postgres://postgres@127.0.0.1:${port}/gridcue`, { timeoutMs: 500, logger: quiet })
    hungApp = buildApp(hungDb, engine)
  })
  afterAll(async () => {
    await hungDb.destroy()
    for (const socket of sockets) socket.destroy()
    await new Promise((resolve) => silent.close(resolve))
  })

  it('should give up after the connection time-out and answer 503, not hang', async () => {
    const { res, ms } = await timed(() => request(hungApp).get(outlinePath()).set('Authorization', `Bearer ${token}`))
    expect(res.status).toBe(503)
    expect(res.body.code).toBe('database-unavailable')
    expect(ms).toBeGreaterThanOrEqual(450)
    expect(ms).toBeLessThan(QUICK_MS)

    const health = await timed(() => request(hungApp).get('/api/health'))
    expect(health.res.status).toBe(503)
    expect(health.res.body).toMatchObject({ status: 'degraded', database: 'down' })
    expect(health.ms).toBeLessThan(QUICK_MS)
  })
})

describe('isConnectionFailure', () => {
  // SQLSTATEs from the PostgreSQL manual, appendix A "PostgreSQL Error Codes"
  it.each([
    ['08006 connection_failure', { code: '08006' }],
    ['08001 sqlclient_unable_to_establish_sqlconnection', { code: '08001' }],
    ['57P01 admin_shutdown', { code: '57P01' }],
    ['57P03 cannot_connect_now', { code: '57P03' }],
    ['a refused socket', { code: 'ECONNREFUSED' }],
    ["knex's pool time-out", { name: 'KnexTimeoutError', message: 'Knex: Timeout acquiring a connection. The pool is probably full.' }],
    ['a connection dropped under a query', new Error('update "outlines" set … - Connection terminated unexpectedly')],
    ['a sent query unanswered past the query time-out', new Error('select … - Query read timeout')],
    ['every address of a host refused', { errors: [{ code: 'ECONNREFUSED' }, { code: 'ECONNREFUSED' }] }],
  ])('should count %s as the database being away', (_, error) => {
    expect(isConnectionFailure(error)).toBe(true)
  })

  it.each([
    ['23505 unique_violation', { code: '23505' }],
    ['22P05 untranslatable_character (a NUL byte)', { code: '22P05' }],
    ['57014 query_canceled', { code: '57014' }],
    ['a plain bug', new TypeError("Cannot read properties of undefined (reading 'id')")],
    ['no error object', 'Connection terminated'],
  ])('should not count %s: the database answered, or it is not a database error', (_, error) => {
    expect(isConnectionFailure(error)).toBe(false)
  })
})
