import type { Knex } from 'knex'

// Links sent by mail: an invitation into a channel, a password reset, a new e-mail address to confirm.
// Each row keeps only a SHA-256 of its link's token, so a copy of the database can't be used to follow one.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (t) => {
    t.increments('id')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.string('email', 254).notNullable()
    t.specificType('role', 'channel_role').notNullable()
    t.string('token_hash', 64).notNullable().unique()
    t.integer('invited_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('expires_at', { useTz: true }).notNullable()
    t.timestamp('accepted_at', { useTz: true }).nullable()
    t.integer('accepted_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['invited_by'])
    t.index(['accepted_by'])
  })
  // one open invitation per address and channel: sending again replaces its link
  await knex.raw('create unique index invitations_open_unique on invitations (channel_id, lower(email)) where accepted_at is null')

  await knex.schema.createTable('password_resets', (t) => {
    t.increments('id')
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.string('token_hash', 64).notNullable().unique()
    t.timestamp('expires_at', { useTz: true }).notNullable()
    t.timestamp('used_at', { useTz: true }).nullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['user_id'])
  })

  // at most one address waiting for confirmation per person: asking again replaces it
  await knex.schema.createTable('email_changes', (t) => {
    t.integer('user_id').primary().references('users.id').onDelete('CASCADE')
    t.string('new_email', 254).notNullable()
    t.string('token_hash', 64).notNullable().unique()
    t.timestamp('expires_at', { useTz: true }).notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('email_changes')
  await knex.schema.dropTable('password_resets')
  await knex.schema.dropTable('invitations')
}
