import { loadConfig } from '../../server/config'
import { createDb, type Db } from '../../server/db/knex'
import { seed as seedDemo } from '../../seeds/01_demo_channel'

/** Config for tests: the test database from DATABASE_URL (set by `npm test`), quiet logs. */
export const testConfig = () =>
  loadConfig({ ...process.env, NODE_ENV: 'test', SIGN_IN_ATTEMPTS_PER_15_MIN: '5', JWT_SECRET: process.env.JWT_SECRET ?? 'x'.repeat(40) })

/** A knex instance on the test database, migrated to the latest schema. */
export async function openTestDb(): Promise<Db> {
  const db = createDb(testConfig().db.url)
  await db.migrate.latest()
  return db
}

/** Empties every application table (not knex's own bookkeeping). */
export async function truncateAll(db: Db): Promise<void> {
  const rows: { tablename: string }[] = (
    await db.raw("select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_%'")
  ).rows
  if (rows.length) await db.raw(`truncate ${rows.map((r) => `"${r.tablename}"`).join(', ')} restart identity cascade`)
}

/** Fresh tables with the demo channel and its four people (one per role). */
export async function resetWithDemo(db: Db): Promise<void> {
  await truncateAll(db)
  await seedDemo(db)
}
