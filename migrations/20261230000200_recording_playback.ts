import type { Knex } from 'knex'

// A recording browsers can't play as uploaded is converted after the upload is answered (a transcode takes
// about as long as the recording): until then it is 'preparing', and 'failed' with a note when it can't be.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('recordings', (t) => {
    t.text('playback').notNullable().defaultTo('ready')
    t.text('playback_note').nullable()
  })
  await knex.raw("alter table recordings add constraint recordings_playback check (playback in ('ready', 'preparing', 'failed'))")
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('recordings', (t) => {
    t.dropColumn('playback_note')
    t.dropColumn('playback')
  })
}
