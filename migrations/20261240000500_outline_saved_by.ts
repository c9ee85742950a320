import type { Knex } from 'knex'

// Who saved a take last, so a person whose save was refused learns whose edits they are looking at
// ("Priya saved 2 minutes ago"). Kept when that person leaves the channel's team, as the take is the channel's.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.integer('saved_by').nullable().references('users.id').onDelete('SET NULL')
    t.index(['saved_by'])
  })
  // until now the last save's author wasn't kept: the maker is the best guess
  await knex.raw('update outlines set saved_by = created_by')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.dropColumn('saved_by')
  })
}
