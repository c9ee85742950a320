import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('puzzles', (t) => {
    t.increments('id')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.string('title', 200).notNullable()
    t.string('author', 200).notNullable().defaultTo('')
    t.text('link').notNullable().defaultTo('')
    // text, not date: the form sends '' for "unknown", and pg would turn a date into a local-midnight Date
    t.string('published_on', 10).notNullable().defaultTo('')
    t.text('notes').notNullable().defaultTo('')
    t.specificType('givens', 'char(81)').notNullable()
    t.jsonb('thermometers').notNullable().defaultTo('[]')
    t.enu('check', ['unique', 'no-solution', 'multiple-solutions', 'invalid'], { useNative: true, enumName: 'puzzle_check' }).notNullable()
    t.jsonb('problems').notNullable().defaultTo('[]')
    t.specificType('solution', 'char(81)').nullable()
    t.integer('version').notNullable().defaultTo(1)
    // kept when the person leaves: the puzzle belongs to the channel
    t.integer('created_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamps(true, true)
    t.index(['channel_id'])
    t.index(['created_by'])
  })
  await knex.raw(`alter table puzzles add constraint puzzles_published_on_format check (published_on = '' or published_on ~ '^\\d{4}-\\d{2}-\\d{2}$')`)

  await knex.schema.createTable('outlines', (t) => {
    t.increments('id')
    t.integer('puzzle_id').notNullable().references('puzzles.id').onDelete('CASCADE')
    t.string('name', 100).notNullable()
    t.enu('status', ['solved', 'stuck'], { useNative: true, enumName: 'outline_status' }).notNullable()
    t.integer('step_count').notNullable()
    t.integer('total_ms').notNullable()
    t.jsonb('document').notNullable()
    t.integer('version').notNullable().defaultTo(1)
    t.integer('created_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamps(true, true)
    t.index(['puzzle_id'])
    t.index(['created_by'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outlines')
  await knex.raw('drop type outline_status')
  await knex.schema.dropTable('puzzles')
  await knex.raw('drop type puzzle_check')
}
