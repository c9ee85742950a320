// The migration that moves a take's script (pace, names, target, lines, chapters) out of the outline document
// into a column of its own. The outline is a real one: Project Euler problem 96, grid 07
// (tests/fixtures/classic-puzzles.json, sources noted in the file).
import { beforeAll, describe, expect, it } from 'vitest'
import classic from '../fixtures/classic-puzzles.json'
import { parsePuzzle, solvePath, type Puzzle } from '../../shared/engine/index'
import { scriptOf, type Outline } from '../../shared/schemas/outline'
import { buildOutline } from '../../shared/script/index'
import { migrateUpTo, useScratchDatabase } from '../helpers/db'

const MIGRATION = '20261211000100_outlines_script_column.ts'
const BEFORE = '20261210000100_users_token_version.ts'

const scratchDb = useScratchDatabase('script_column')
beforeAll(() => migrateUpTo(scratchDb.db, BEFORE))

const pe07 = classic.puzzles.find((p) => p.id === 'PE07')!
const puzzle = parsePuzzle({ title: pe07.title, givens: pe07.givens, thermometers: [] }).puzzle as Puzzle
const outline: Outline = { ...buildOutline(puzzle, solvePath(puzzle)), targetMs: 600_000 }

async function storeWholeDocument(): Promise<number> {
  const [channel] = await scratchDb.db('channels').insert({ name: 'Migration test', slug: `migration-${Date.now()}` }, ['id'])
  const [puzzleRow] = await scratchDb.db('puzzles').insert({ channel_id: channel.id, title: pe07.title, givens: pe07.givens, check: 'unique' }, ['id'])
  // raw SQL: the typed outlines table only takes rows of today's shape
  const { rows } = await scratchDb.db.raw<{ rows: { id: number }[] }>(
    `insert into outlines (puzzle_id, name, status, step_count, total_ms, document) values (?, 'Take 1', 'solved', ?, 1000, cast(? as jsonb)) returning id`,
    [puzzleRow.id, outline.steps.length, JSON.stringify(outline)],
  )
  return rows[0].id
}

const rowOf = async (id: number) => (await scratchDb.db.raw<{ rows: Record<string, unknown>[] }>('select * from outlines where id = ?', [id])).rows[0]

describe(`migration ${MIGRATION}`, () => {
  it('should move exactly the script keys into their own column on the way up and merge them back on the way down', async () => {
    const id = await storeWholeDocument()
    await scratchDb.db.migrate.up({ name: MIGRATION })
    const split = await rowOf(id)
    expect(split.script).toEqual(scriptOf(outline))
    // the script's keys when the migration was written (trim came later)
    expect(Object.keys(split.script as object).sort()).toEqual(['chapters', 'lines', 'names', 'pace', 'targetMs'])
    expect(split.document).not.toHaveProperty('lines')
    expect({ ...(split.document as object), ...(split.script as object) }).toEqual(outline)

    await scratchDb.db.migrate.down({ name: MIGRATION })
    const merged = await rowOf(id)
    expect(merged).not.toHaveProperty('script')
    expect(merged.document).toEqual(outline)
  })
})
