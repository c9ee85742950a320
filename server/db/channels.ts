import type { Role } from '../../shared/schemas/auth'
import type { Db } from './knex'
import type { ChannelRow } from './tables'

export interface ChannelWithRole extends ChannelRow {
  role: Role
  member_count: string
}

const withRoleAndCount = (db: Db, userId: number) =>
  db('channels')
    .join('memberships', 'memberships.channel_id', 'channels.id')
    .where('memberships.user_id', userId)
    .select(
      'channels.*',
      'memberships.role',
      db.raw('(select count(*) from memberships m where m.channel_id = channels.id) as member_count'),
    )

export function listChannelsForUser(db: Db, userId: number): Promise<ChannelWithRole[]> {
  return withRoleAndCount(db, userId).orderBy('channels.name')
}

export function findChannelForUser(db: Db, userId: number, channelId: number): Promise<ChannelWithRole | undefined> {
  return withRoleAndCount(db, userId).where('channels.id', channelId).first()
}

export async function insertChannel(db: Db, channel: Pick<ChannelRow, 'name' | 'slug' | 'description'>): Promise<ChannelRow> {
  const [row] = await db('channels').insert(channel).returning('*')
  return row as ChannelRow
}

export function findChannelBySlug(db: Db, slug: string): Promise<ChannelRow | undefined> {
  return db('channels').where({ slug }).first()
}

export async function updateChannel(db: Db, id: number, changes: Pick<ChannelRow, 'name' | 'description'>): Promise<void> {
  await db('channels').where({ id }).update({ ...changes, updated_at: db.fn.now() })
}

/** Slugs in use that start with `base`, for choosing a free one. */
export async function slugsLike(db: Db, base: string): Promise<string[]> {
  const rows = await db('channels').whereLike('slug', `${base}%`).select('slug')
  return rows.map((r) => r.slug)
}
