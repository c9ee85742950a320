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

/** The member's row, locked until the transaction ends, with every owner row of the channel locked too (the last-owner rule). */
export async function lockMemberAndOwners(trx: Db, userId: number, channelId: number): Promise<{ role: Role | undefined; owners: number }> {
  const rows: { user_id: number; role: Role }[] = await trx('memberships')
    .where({ channel_id: channelId })
    .whereRaw('(user_id = ? or role = ?)', [userId, 'owner'])
    .forUpdate()
    .select('user_id', 'role')
  return { role: rows.find((r) => r.user_id === userId)?.role, owners: rows.filter((r) => r.role === 'owner').length }
}

export async function setMemberRole(db: Db, userId: number, channelId: number, role: Role): Promise<void> {
  await db('memberships').where({ user_id: userId, channel_id: channelId }).update({ role })
}

export async function removeMembership(db: Db, userId: number, channelId: number): Promise<void> {
  await db('memberships').where({ user_id: userId, channel_id: channelId }).delete()
}
