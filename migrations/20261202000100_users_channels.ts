import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id')
    t.string('email', 254).notNullable()
    t.string('name', 120).notNullable()
    t.string('password_hash', 100).notNullable()
    t.timestamps(true, true)
  })
  // e-mail addresses compare case-insensitively
  await knex.raw('create unique index users_email_lower_unique on users (lower(email))')

  await knex.schema.createTable('channels', (t) => {
    t.increments('id')
    t.string('name', 120).notNullable()
    t.string('slug', 80).notNullable().unique()
    t.text('description').notNullable().defaultTo('')
    t.timestamps(true, true)
  })

  await knex.schema.createTable('memberships', (t) => {
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.enu('role', ['owner', 'presenter', 'editor', 'viewer'], { useNative: true, enumName: 'channel_role' }).notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.primary(['user_id', 'channel_id'])
    t.index(['channel_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('memberships')
  await knex.raw('drop type channel_role')
  await knex.schema.dropTable('channels')
  await knex.schema.dropTable('users')
}
