// The migration that renames `facts.seen.thermometer` to `facts.seen.ruledOut` inside stored outlines.
// The outline is a real one: Project Euler problem 96, grid 07 (tests/fixtures/classic-puzzles.json,
// sources noted in the file), whose path has last-candidate steps with digits ruled out earlier.
import { beforeAll, describe, expect, it } from 'vitest'
import classic from '../fixtures/classic-puzzles.json'
import { parsePuzzle, solvePath, type Puzzle } from '../../shared/engine/index'
import { buildOutline } from '../../shared/script/index'
import type { Outline } from '../../shared/schemas/outline'
import { migrateUpTo, useScratchDatabase } from '../helpers/db'

const MIGRATION = '20261203000100_steps_ruled_out.ts'

const scratchDb = useScratchDatabase('ruled_out')
// outlines as they were stored then: one document column (a later migration split the script off)
beforeAll(() => migrateUpTo(scratchDb.db, MIGRATION))

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
  const [channel] = await scratchDb.db('channels').insert({ name: 'Migration test', slug: `migration-${Date.now()}` }, ['id'])
  const [puzzleRow] = await scratchDb.db('puzzles').insert({ channel_id: channel.id, title: pe07.title, givens: pe07.givens, check: 'unique' }, ['id'])
  // raw SQL: the typed outlines table only takes documents of today's shape
  const { rows } = await scratchDb.db.raw<{ rows: { id: number }[] }>(
    `insert into outlines (puzzle_id, name, status, step_count, total_ms, document) values (?, 'Take 1', 'solved', ?, 1000, cast(? as jsonb)) returning id`,
    [puzzleRow.id, current.steps.length, JSON.stringify(document)],
  )
  return rows[0].id
}

const rowOf = async (id: number) => (await scratchDb.db.raw<{ rows: { document: unknown }[] }>('select * from outlines where id = ?', [id])).rows[0]
const documentOf = async (id: number) => (await rowOf(id)).document

describe(`migration ${MIGRATION}`, () => {
  it('should rename the key in every stored step on the way up and back on the way down, leaving the text alone', async () => {
    const old = savedBeforeRename(current)
    expect(JSON.stringify(old)).toContain('"thermometer"')
    await scratchDb.db.migrate.down({ name: MIGRATION })
    const id = await storeOutline(old)
    const untouchedId = await storeOutline({ ...current, steps: current.steps.filter((s) => s.facts.kind !== 'single-cell') })
    const untouched = await rowOf(untouchedId)

    await scratchDb.db.migrate.up({ name: MIGRATION })
    const migrated = await documentOf(id)
    expect(migrated).toEqual(current)
    expect(await rowOf(untouchedId)).toEqual(untouched)

    await scratchDb.db.migrate.down({ name: MIGRATION })
    expect(await documentOf(id)).toEqual(old)
    await scratchDb.db.migrate.up({ name: MIGRATION })
    expect(await documentOf(id)).toEqual(current)
  })
})
