import request from 'supertest'
import type { Express } from 'express'
import { createApp } from '../../server/app'
import type { Db } from '../../server/db/knex'
import { createEnginePool, type EnginePool } from '../../server/workers/engine-pool'
import { DEMO_PASSWORD, DEMO_USERS } from '../../seeds/01_demo_channel'
import type { Role } from '../../shared/schemas/auth'
import { openTestDb, resetWithDemo, testConfig } from './db'

export const buildTestApp = (db: Db, engine?: EnginePool): Express => createApp({ db, config: testConfig(), engine, clientDir: '/nonexistent' })

/** A one-thread engine pool for API tests; destroy it in afterAll. */
export const testEnginePool = (): EnginePool => createEnginePool({ threads: 1, timeoutMs: 60_000 })

export const demoEmail = (role: Role) => DEMO_USERS.find((u) => u.role === role)!.email

/** Signs a demo person in and returns the bearer header value. */
export async function tokenFor(app: Express, role: Role): Promise<string> {
  const res = await request(app).post('/api/auth/sign-in').send({ email: demoEmail(role), password: DEMO_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return `Bearer ${res.body.token}`
}

export type Actor = 'anonymous' | Role
export const ACTORS: Actor[] = ['anonymous', 'viewer', 'editor', 'presenter', 'owner']

/** Bearer headers for every demo role, for role-matrix tests. */
export async function tokensForAll(app: Express): Promise<Record<Actor, string | undefined>> {
  const out: Record<Actor, string | undefined> = { anonymous: undefined, viewer: '', editor: '', presenter: '', owner: '' }
  for (const role of ['viewer', 'editor', 'presenter', 'owner'] as const) out[role] = await tokenFor(app, role)
  return out
}

export interface ApiSuite {
  db: Db
  app: Express
  engine: EnginePool
  /** bearer headers per demo role (undefined for anonymous) */
  tokens: Record<Actor, string | undefined>
  /** the demo channel */
  channelId: number
  close: () => Promise<void>
}

/** Fresh demo data, an app (with a one-thread engine pool) and every role signed in; call close() in afterAll. */
export async function openApiSuite(): Promise<ApiSuite> {
  const db = await openTestDb()
  await resetWithDemo(db)
  const engine = testEnginePool()
  const app = buildTestApp(db, engine)
  const tokens = await tokensForAll(app)
  const channelId = (await db('channels').where({ slug: 'marigold-logic' }).first())!.id
  return {
    db,
    app,
    engine,
    tokens,
    channelId,
    close: async () => {
      await engine.destroy()
      await db.destroy()
    },
  }
}
