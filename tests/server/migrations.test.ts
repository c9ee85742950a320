import { describe, expect, it } from 'vitest'
import { useScratchDatabase } from '../helpers/db'

const scratchDb = useScratchDatabase('migrations')

const appTables = async () =>
  (await scratchDb.db.raw("select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_%' order by 1")).rows.map(
    (r: { tablename: string }) => r.tablename,
  )

describe('migrations', () => {
  it('should run up, all the way down and up again on an empty database', async () => {
    await scratchDb.db.migrate.latest()
    const tables = await appTables()
    expect(tables).toEqual(expect.arrayContaining(['channels', 'memberships', 'outlines', 'puzzles', 'users']))
    await scratchDb.db.migrate.rollback(undefined, true)
    expect(await appTables()).toEqual([])
    const types = await scratchDb.db.raw("select typname from pg_type where typname in ('channel_role', 'puzzle_check', 'outline_status')")
    expect(types.rows).toEqual([])
    await scratchDb.db.migrate.latest()
    expect(await appTables()).toEqual(tables)
  })
})
