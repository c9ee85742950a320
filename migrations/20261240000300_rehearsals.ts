import type { Knex } from 'knex'

// Timed runs through a take: who rehearsed, and each line's real duration with what the line asked of them
// (words, digits, marks, what-if moves) as the take stood then, so their calibration survives later edits.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rehearsals', (t) => {
    t.increments('id')
    t.integer('outline_id').notNullable().references('outlines.id').onDelete('CASCADE')
    // kept when the person leaves (the take's history), though it then calibrates nobody
    t.integer('presenter_id').nullable().references('users.id').onDelete('SET NULL')
    t.string('name', 80).notNullable()
    t.jsonb('lines').notNullable()
    t.integer('speech_ms').notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['outline_id'])
    t.index(['presenter_id'])
  })
  await knex.raw('alter table rehearsals add constraint rehearsals_speech_ms check (speech_ms >= 0)')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rehearsals')
}
