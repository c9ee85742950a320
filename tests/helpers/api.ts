import request from 'supertest'
import type { Express } from 'express'
import { afterAll, beforeAll, beforeEach } from 'vitest'
import { createApp } from '../../server/app'
import { issueToken } from '../../server/auth/tokens'
import { createDb, type Db } from '../../server/db/knex'
import { createJobQueue, type AlignmentQueue } from '../../server/jobs/queue'
import { createLogger } from '../../server/logger'
import { listEndpoints, type EndpointInfo } from '../../server/routes/endpoint'
import { createEnginePool, type EnginePool } from '../../server/workers/engine-pool'
import { DEMO_USERS } from '../../seeds/01_demo_channel'
import type { Role } from '../../shared/schemas/auth'
import type { PuzzleDraft, PuzzleRecord } from '../../shared/schemas/studio'
import { openTestDb, resetWithDemo, saveBaseline, testConfig, type Baseline } from './db'

const buildTestApp = (db: Db, engine?: EnginePool, jobs?: AlignmentQueue): Express => createApp({ db, config: testConfig(), engine, jobs, clientDir: '/nonexistent' })

/** A one-thread engine pool for API tests; destroy it in afterAll. */
export const testEnginePool = (): EnginePool => createEnginePool({ threads: 1, timeoutMs: 60_000, logger: createLogger('error') })

export const demoEmail = (role: Role) => DEMO_USERS.find((u) => u.role === role)!.email

/** Every kind of caller: nobody signed in, someone signed in who is not in the demo channel, and each demo role. */
export type Actor = 'anonymous' | 'non-member' | Role
export const ACTORS: readonly Actor[] = ['anonymous', 'non-member', 'viewer', 'editor', 'presenter', 'owner']

// an invented person with an account but no membership in the demo channel
const NON_MEMBER = { email: 'non-member@gridcue.example', name: 'Ada Okafor' }

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'
type ActorClient = Record<Method, (path: string, body?: object) => request.Test>

export interface ApiSuite {
  readonly db: Db
  /** built again for each test, so in-memory state such as sign-in rate limits starts empty too */
  readonly app: Express
  readonly engine: EnginePool
  /** the demo channel */
  readonly channelId: number
  /** requests to the app as one kind of caller */
  as(actor: Actor): ActorClient
  /** the signed-in person behind an actor, for calling services directly */
  user(actor: Exclude<Actor, 'anonymous'>): Express.User
  /** a puzzle saved through the API by the demo owner, in the demo channel unless another is given */
  createPuzzle(draft: PuzzleDraft, channelId?: number): Promise<PuzzleRecord>
  /** a new channel in which the demo owner is the only member */
  ownersOtherChannel(): Promise<number>
}

export interface ApiSuiteOptions {
  /** data every test of the file starts from, made once (through the API) on top of the demo data */
  prepare?: (suite: ApiSuite) => Promise<void>
  /** the queue the app puts alignment runs on (the caller stops it); by default one that only queues, stopped after the suite */
  jobs?: (db: Db) => AlignmentQueue
}

interface SuiteState {
  db: Db
  engine: EnginePool
  jobs: AlignmentQueue
  app: Express
  baseline: Baseline | undefined
  channelId: number
  users: Record<Exclude<Actor, 'anonymous'>, Express.User>
}

/**
 * The one set-up of the API test files; call it at the top of the file. It opens the migrated test
 * database with the demo channel, its four people and one person outside it, and a one-thread engine
 * pool; requests carry a token signed for the person they are sent as. Before every test the data goes back to what it was after
 * `prepare` and the app is built again, so no test depends on another's leftovers.
 */
export function useApiSuite(options: ApiSuiteOptions = {}): ApiSuite {
  let state: SuiteState | undefined
  let otherChannels = 0
  // one queue for the suite's apps, which are built again for every test: it connects only when a test queues a job
  const ownQueue = createJobQueue({ url: testConfig().db.url, logger: createLogger('silent') })
  const current = (): SuiteState => {
    if (!state) throw new Error('useApiSuite: the suite is used before its beforeAll ran')
    return state
  }

  const suite: ApiSuite = {
    get db() {
      return current().db
    },
    get app() {
      return current().app
    },
    get engine() {
      return current().engine
    },
    get channelId() {
      return current().channelId
    },
    as: (actor) => clientFor(current().app, actor === 'anonymous' ? undefined : bearer(current().users[actor])),
    user: (actor) => current().users[actor],
    async createPuzzle(draft, channelId = current().channelId) {
      const res = await suite.as('owner').post(`/api/channels/${channelId}/puzzles`, draft)
      if (res.status !== 201) throw new Error(`creating a puzzle failed: ${res.status} ${JSON.stringify(res.body)}`)
      return res.body
    },
    async ownersOtherChannel() {
      const { db, users } = current()
      const [{ id }] = await db('channels').insert({ name: 'Second Shelf', slug: `second-shelf-${++otherChannels}` }).returning('id')
      await db('memberships').insert({ user_id: users.owner.id, channel_id: id, role: 'owner' })
      return id
    },
  }

  beforeAll(async () => {
    const db = await openTestDb()
    await resetWithDemo(db)
    const users = await peopleOf(db)
    const channelId = (await db('channels').where({ slug: 'marigold-logic' }).first())!.id
    const engine = testEnginePool()
    const jobs = options.jobs?.(db) ?? ownQueue
    state = { db, engine, jobs, app: buildTestApp(db, engine, jobs), baseline: undefined, channelId, users }
    await options.prepare?.(suite)
    state.baseline = await saveBaseline(db)
  })
  beforeEach(async () => {
    const s = current()
    await s.baseline?.restore()
    s.app = buildTestApp(s.db, s.engine, s.jobs)
  })
  afterAll(async () => {
    if (!state) return
    await state.engine.destroy()
    await ownQueue.close()
    await state.baseline?.drop()
    await state.db.destroy()
  })
  return suite
}

/** The endpoints the app registers, read before any hook runs (tests are generated from them); no connection is made. */
export async function registeredEndpoints(): Promise<readonly EndpointInfo[]> {
  const db = createDb(testConfig().db.url)
  try {
    return listEndpoints(buildTestApp(db))
  } finally {
    await db.destroy()
  }
}

function clientFor(app: Express, authorization: string | undefined): ActorClient {
  const send = (method: Method) => (path: string, body?: object) => {
    const req = request(app)[method](path)
    if (authorization) req.set('Authorization', authorization)
    return body === undefined ? req : req.send(body)
  }
  return { get: send('get'), post: send('post'), put: send('put'), patch: send('patch'), delete: send('delete') }
}

/** The demo people by role, plus the non-member (who gets the demo password too). */
async function peopleOf(db: Db): Promise<SuiteState['users']> {
  const rows = await db('users').whereIn('email', DEMO_USERS.map((u) => u.email))
  const [nonMember] = await db('users').insert({ ...NON_MEMBER, password_hash: rows[0]!.password_hash }).returning('*')
  const person = (email: string): Express.User => {
    const row = [...rows, nonMember!].find((r) => r.email === email)
    if (!row) throw new Error(`no user ${email} in the demo data`)
    return { id: row.id, email: row.email, name: row.name }
  }
  return {
    'non-member': person(NON_MEMBER.email),
    viewer: person(demoEmail('viewer')),
    editor: person(demoEmail('editor')),
    presenter: person(demoEmail('presenter')),
    owner: person(demoEmail('owner')),
  }
}

// signed here rather than through POST /api/auth/sign-in: no password hashing, no sign-in rate limit
const bearer = (user: Express.User) => `Bearer ${issueToken(user.id, testConfig().auth).token}`
