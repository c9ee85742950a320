import type { Knex } from 'knex'

const STAGES = ['planned', 'scripted', 'rehearsed', 'recorded', 'aligned', 'published']

// The episode pipeline: each take's stage, planned publish day and the person on it; the channel's cadence;
// the audit log; in-app notifications and each person's choice of which kinds reach them, and how.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outlines', (t) => {
    t.enu('stage', STAGES, { useNative: true, enumName: 'take_stage' }).notNullable().defaultTo('planned')
    t.date('planned_on').nullable()
    t.integer('assignee_id').nullable().references('users.id').onDelete('SET NULL')
    t.index(['assignee_id'])
  })
  // takes made before the pipeline start where their history puts them: a live episode, else a recording
  await knex.raw("update outlines set stage = 'published', planned_on = (select (e.publish_at at time zone 'UTC')::date from episodes e where e.outline_id = outlines.id) where id in (select outline_id from episodes where unpublished_at is null)")
  await knex.raw("update outlines set stage = 'recorded' where stage = 'planned' and id in (select outline_id from recordings)")

  await knex.schema.alterTable('channels', (t) => {
    // one episode every N days; every 3 is common practice for puzzle channels
    t.integer('cadence_days').notNullable().defaultTo(3)
  })

  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.integer('actor_id').nullable().references('users.id').onDelete('SET NULL')
    // the name as it was, so a row still says who once the account is gone
    t.string('actor_name', 200).nullable()
    t.string('kind', 40).notNullable()
    t.string('subject', 300).notNullable()
    t.jsonb('details').notNullable().defaultTo('{}')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['channel_id', 'created_at'])
    t.index(['actor_id'])
  })

  await knex.schema.createTable('notifications', (t) => {
    t.bigIncrements('id')
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.integer('channel_id').notNullable().references('channels.id').onDelete('CASCADE')
    t.string('kind', 40).notNullable()
    t.string('text', 500).notNullable()
    t.string('link', 300).notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('read_at', { useTz: true }).nullable()
    t.index(['user_id', 'created_at'])
    t.index(['channel_id'])
  })

  // a kind with no row here reaches the person both ways
  await knex.schema.createTable('notification_choices', (t) => {
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.string('kind', 40).notNullable()
    t.boolean('in_app').notNullable()
    t.boolean('email').notNullable()
    t.primary(['user_id', 'kind'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notification_choices')
  await knex.schema.dropTable('notifications')
  await knex.schema.dropTable('audit_events')
  await knex.schema.alterTable('channels', (t) => t.dropColumn('cadence_days'))
  await knex.schema.alterTable('outlines', (t) => {
    t.dropColumn('assignee_id')
    t.dropColumn('planned_on')
    t.dropColumn('stage')
  })
  await knex.raw('drop type take_stage')
}
