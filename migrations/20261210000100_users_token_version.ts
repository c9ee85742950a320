import type { Knex } from 'knex'

// A user's token version is carried in each token issued to them and compared on every request, so
// bumping it (sign-out, later a password change) ends every session of that user at once.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.integer('token_version').notNullable().defaultTo(0)
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('token_version')
  })
}
