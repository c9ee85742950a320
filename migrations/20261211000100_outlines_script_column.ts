import type { Knex } from 'knex'

// A take's script (what a person edits: pace, names, target, lines, chapters) gets a column of its own beside
// the engine's part of the document. A save then writes 40 KB into one column; merging it into the whole
// 130 KB document made PostgreSQL walk every step on every save (about 20 times the work, measured with pgbench).
const SCRIPT_KEYS = "array['pace', 'names', 'targetMs', 'lines', 'chapters']"

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.jsonb('script')
  })
  await knex.raw(`
    update outlines
       set script = (select coalesce(jsonb_object_agg(key, value), '{}'::jsonb) from jsonb_each(document) where key = any (${SCRIPT_KEYS})),
           document = document - ${SCRIPT_KEYS}::text[]`)
  await knex.raw('alter table outlines alter column script set not null')
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('update outlines set document = document || script')
  await knex.schema.alterTable('outlines', (t) => {
    t.dropColumn('script')
  })
}
