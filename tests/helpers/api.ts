import request from 'supertest'
import type { Express } from 'express'
import { createApp } from '../../server/app'
import type { Db } from '../../server/db/knex'
import { createEnginePool, type EnginePool } from '../../server/workers/engine-pool'
import { DEMO_PASSWORD, DEMO_USERS } from '../../seeds/01_demo_channel'
import type { Role } from '../../shared/schemas/auth'
import { testConfig } from './db'

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
