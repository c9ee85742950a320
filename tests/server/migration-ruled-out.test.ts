// The migration that renames `facts.seen.thermometer` to `facts.seen.ruledOut` inside stored outlines.
// The outline is a real one: Project Euler problem 96, grid 07 (tests/fixtures/classic-puzzles.json,
// sources noted in the file), whose path has last-candidate steps with digits ruled out earlier.
import knex from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { knexConfig } from '../../knexfile'
import classic from '../fixtures/classic-puzzles.json'
import { parsePuzzle, solvePath, type Puzzle } from '../../shared/engine/index'
import { buildOutline } from '../../shared/script/index'
import type { Outline } from '../../shared/schemas/outline'
import { testConfig } from '../helpers/db'

const MIGRATION = '20261203000100_steps_ruled_out.ts'

// A database of its own, so stepping this migration down and up doesn't disturb the other API tests.
const url = new URL(testConfig().db.url)
const scratchName = `${url.pathname.slice(1)}_ruled_out`
const admin = knex(knexConfig(url.toString()))
const scratchUrl = Object.assign(new URL(url), { pathname: `/${scratchName}` }).toString()
let scratch: ReturnType<typeof knex>

beforeAll(async () => {
  await admin.raw(`drop database if exists "${scratchName}" with (force)`)
  await admin.raw(`create database "${scratchName}"`)
  scratch = knex(knexConfig(scratchUrl))
  await scratch.migrate.latest()
})
afterAll(async () => {
  await scratch.destroy()
  await admin.raw(`drop database if exists "${scratchName}" with (force)`)
  await admin.destroy()
})

const pe07 = classic.puzzles.find((p) => p.id === 'PE07')!
const puzzle = parsePuzzle({ title: pe07.title, givens: pe07.givens, thermometers: [] }).puzzle as Puzzle
const current: Outline = buildOutline(puzzle, solvePath(puzzle))

/** The outline as it was stored before the rename. */
function savedBeforeRename(outline: Outline): unknown {
  return {
    ...outline,
    steps: outline.steps.map((step) => {
      if (step.facts.kind !== 'single-cell') return step
      const { ruledOut, ...houses } = step.facts.seen
      return { ...step, facts: { ...step.facts, seen: { ...houses, thermometer: ruledOut } } }
    }),
  }
}

async function storeOutline(document: unknown): Promise<number> {
  const [channel] = await scratch('channels').insert({ name: 'Migration test', slug: `migration-${Date.now()}` }, ['id'])
  const [puzzleRow] = await scratch('puzzles').insert({ channel_id: channel.id, title: pe07.title, givens: pe07.givens, check: 'unique' }, ['id'])
  // raw SQL: the typed outlines table only takes documents of today's shape
  const { rows } = await scratch.raw<{ rows: { id: number }[] }>(
    `insert into outlines (puzzle_id, name, status, step_count, total_ms, document) values (?, 'Take 1', 'solved', ?, 1000, cast(? as jsonb)) returning id`,
    [puzzleRow.id, current.steps.length, JSON.stringify(document)],
  )
  return rows[0].id
}

const rowOf = async (id: number) => (await scratch.raw<{ rows: { document: unknown }[] }>('select * from outlines where id = ?', [id])).rows[0]
const documentOf = async (id: number) => (await rowOf(id)).document

describe(`migration ${MIGRATION}`, () => {
  it('should rename the key in every stored step on the way up and back on the way down, leaving the text alone', async () => {
    const old = savedBeforeRename(current)
    expect(JSON.stringify(old)).toContain('"thermometer"')
    await scratch.migrate.down({ name: MIGRATION })
    const id = await storeOutline(old)
    const untouchedId = await storeOutline({ ...current, steps: current.steps.filter((s) => s.facts.kind !== 'single-cell') })
    const untouched = await rowOf(untouchedId)

    await scratch.migrate.up({ name: MIGRATION })
    const migrated = await documentOf(id)
    expect(migrated).toEqual(current)
    expect(await rowOf(untouchedId)).toEqual(untouched)

    await scratch.migrate.down({ name: MIGRATION })
    expect(await documentOf(id)).toEqual(old)
    await scratch.migrate.up({ name: MIGRATION })
    expect(await documentOf(id)).toEqual(current)
  })
})
