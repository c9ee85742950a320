import knex from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { knexConfig } from '../../knexfile'
import { testConfig } from '../helpers/db'

// A database of its own, so rolling everything back doesn't disturb the other API tests.
const url = new URL(testConfig().db.url)
const scratchName = `${url.pathname.slice(1)}_migrations`
const admin = knex(knexConfig(url.toString()))
const scratchUrl = Object.assign(new URL(url), { pathname: `/${scratchName}` }).toString()
let scratch: ReturnType<typeof knex>

beforeAll(async () => {
  await admin.raw(`drop database if exists "${scratchName}" with (force)`)
  await admin.raw(`create database "${scratchName}"`)
  scratch = knex(knexConfig(scratchUrl))
})
afterAll(async () => {
  await scratch.destroy()
  await admin.raw(`drop database if exists "${scratchName}" with (force)`)
  await admin.destroy()
})

const appTables = async () =>
  (await scratch.raw("select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_%' order by 1")).rows.map(
    (r: { tablename: string }) => r.tablename,
  )

describe('migrations', () => {
  it('should run up, all the way down and up again on an empty database', async () => {
    await scratch.migrate.latest()
    const tables = await appTables()
    expect(tables).toEqual(expect.arrayContaining(['channels', 'memberships', 'outlines', 'puzzles', 'users']))
    await scratch.migrate.rollback(undefined, true)
    expect(await appTables()).toEqual([])
    const types = await scratch.raw("select typname from pg_type where typname in ('channel_role', 'puzzle_check', 'outline_status')")
    expect(types.rows).toEqual([])
    await scratch.migrate.latest()
    expect(await appTables()).toEqual(tables)
  })
})
