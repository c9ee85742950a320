import type { Knex } from 'knex'

// One row per attempt to align a take's lines to a recording: queued by a request, worked by a job
// (server/jobs), read by the client while it polls. The job's own bookkeeping lives in pg-boss's schema.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('alignment_runs', (t) => {
    t.increments('id')
    t.integer('recording_id').notNullable().references('recordings.id').onDelete('CASCADE')
    t.enu('method', ['captions', 'audio'], { useNative: true, enumName: 'alignment_method' }).notNullable()
    t.enu('state', ['queued', 'running', 'done', 'failed', 'cancelled'], { useNative: true, enumName: 'alignment_state' }).notNullable().defaultTo('queued')
    t.float('progress').notNullable().defaultTo(0)
    t.jsonb('proposals').notNullable().defaultTo('[]')
    t.jsonb('unplaced').notNullable().defaultTo('[]')
    t.text('error').nullable()
    // the pg-boss job now carrying the run: a job left over from an earlier attempt finds another id here and stops
    t.text('job_id').notNullable()
    t.text('caption_text').nullable()
    t.integer('created_by').nullable().references('users.id').onDelete('SET NULL')
    t.timestamps(true, true)
    t.index(['recording_id'])
    t.index(['created_by'])
  })
  await knex.raw(`alter table alignment_runs add constraint alignment_runs_caption_text check ((method = 'captions') = (caption_text is not null))`)
  await knex.raw('alter table alignment_runs add constraint alignment_runs_progress check (progress >= 0 and progress <= 1)')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('alignment_runs')
  await knex.raw('drop type alignment_state')
  await knex.raw('drop type alignment_method')
}
