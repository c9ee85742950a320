import type { Knex } from 'knex'

// A take remembers the puzzle version it was solved on, so the puzzle page, the Library and the studio can
// tell when the puzzle's grid has moved on. A take made before this is taken as made from the current
// version when its grid (givens and thermometers, stored in its document) is the puzzle's grid, and from
// an earlier one (0) when it is not. The server names the version of every take it makes; a row written
// without one (a hand-made fixture) reads as made from an earlier version. The document keeps thermometers as cell indices, the puzzle as names.
const TAKE_THERMOMETERS_AS_NAMES = `
  coalesce((select jsonb_agg(
      (select jsonb_agg('r' || ((c.value::int / 9) + 1) || 'c' || ((c.value::int % 9) + 1) order by c.ordinality)
         from jsonb_array_elements_text(path.value) with ordinality c)
      order by path.ordinality)
    from jsonb_array_elements(outlines.document -> 'puzzle' -> 'thermometers') with ordinality path), '[]'::jsonb)`

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.integer('puzzle_version').notNullable().defaultTo(0)
  })
  await knex.raw(`
    update outlines
       set puzzle_version = case
             when outlines.document -> 'puzzle' ->> 'givens' = puzzles.givens and ${TAKE_THERMOMETERS_AS_NAMES} = puzzles.thermometers
             then puzzles.version else 0 end
      from puzzles
     where puzzles.id = outlines.puzzle_id`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.dropColumn('puzzle_version')
  })
}
