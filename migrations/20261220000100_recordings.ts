import type { Knex } from 'knex'

// A take's recordings: the file lives in storage (server/storage) under storage_key, the row says what it is.
// Several per take; the one the take's alignment and exports refer to is marked current.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('recordings', (t) => {
    t.increments('id')
    t.integer('outline_id').notNullable().references('outlines.id').onDelete('CASCADE')
    t.text('storage_key').notNullable().unique()
    t.string('original_name', 255).notNullable()
    t.string('mime', 100).notNullable()
    t.enu('kind', ['audio', 'video'], { useNative: true, enumName: 'recording_kind' }).notNullable()
    t.bigInteger('size_bytes').notNullable()
    t.integer('duration_ms').nullable()
    t.jsonb('facts').notNullable().defaultTo('{}')
    // worked out after the upload is answered; null until then
    t.jsonb('peaks').nullable()
    t.boolean('is_current').notNullable().defaultTo(false)
    // kept when the person leaves: the recording belongs to the take
    t.integer('uploaded_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['outline_id'])
    t.index(['uploaded_by'])
  })
  await knex.raw('create unique index recordings_one_current_per_outline on recordings (outline_id) where is_current')
  await knex.raw('alter table recordings add constraint recordings_size_bytes check (size_bytes >= 0)')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('recordings')
  await knex.raw('drop type recording_kind')
}
