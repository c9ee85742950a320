import type { Knex } from 'knex'

// A take published as an episode: one per take, its address name unique in the channel. The row keeps a
// snapshot of the take as it was published, so later edits show on the page only once it is republished.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('episodes', (t) => {
    t.increments('id')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.integer('outline_id').notNullable().unique().references('outlines.id').onDelete('CASCADE')
    t.string('slug', 80).notNullable()
    t.string('title', 200).notNullable()
    t.enu('visibility', ['public', 'members'], { useNative: true, enumName: 'episode_visibility' }).notNullable()
    // a future time schedules the episode: the page appears then
    t.timestamp('publish_at', { useTz: true }).notNullable()
    t.text('description').notNullable().defaultTo('')
    // what the team chose to play (EpisodeVideoChoice); a recording also in recording_id, so deleting it empties the player
    t.jsonb('video').notNullable()
    t.integer('recording_id').nullable().references('recordings.id').onDelete('SET NULL')
    t.jsonb('snapshot').notNullable()
    // the take's updated_at when the snapshot was taken: a later one means the take changed since
    t.timestamp('snapshot_updated_at', { useTz: true }).notNullable()
    t.timestamp('published_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.integer('published_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('unpublished_at', { useTz: true }).nullable()
    t.unique(['channel_id', 'slug'], { indexName: 'episodes_channel_slug_unique' })
    t.index(['recording_id'])
    t.index(['published_by'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('episodes')
  await knex.raw('drop type episode_visibility')
}
