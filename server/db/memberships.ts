import type { Role } from '../../shared/schemas/auth'
import type { Db } from './knex'

export async function findRole(db: Db, userId: number, channelId: number): Promise<Role | undefined> {
  const row = await db('memberships').where({ user_id: userId, channel_id: channelId }).first('role')
  return row?.role
}

export function listMemberships(db: Db, userId: number) {
  return db('memberships')
    .join('channels', 'channels.id', 'memberships.channel_id')
    .where('memberships.user_id', userId)
    .orderBy('channels.name')
    .select('channels.id as channel_id', 'channels.name as channel_name', 'channels.slug as channel_slug', 'memberships.role')
}

export function listMembers(db: Db, channelId: number) {
  return db('memberships')
    .join('users', 'users.id', 'memberships.user_id')
    .where('memberships.channel_id', channelId)
    .orderBy('users.name')
    .select('users.id as user_id', 'users.name', 'users.email', 'memberships.role')
}

export async function addMember(db: Db, userId: number, channelId: number, role: Role): Promise<void> {
  await db('memberships').insert({ user_id: userId, channel_id: channelId, role })
}
