import type { ChannelMember, ChannelSummary } from '../../shared/schemas/channel'
import { findChannelForUser, listChannelsForUser, type ChannelWithRole } from '../db/channels'
import type { Db } from '../db/knex'
import { listMembers } from '../db/memberships'
import { notFound } from '../errors'

const toSummary = (row: ChannelWithRole): ChannelSummary => ({
  id: row.id,
  name: row.name,
  slug: row.slug,
  description: row.description,
  role: row.role,
  memberCount: Number(row.member_count),
})

export async function channelsOf(db: Db, userId: number): Promise<ChannelSummary[]> {
  return (await listChannelsForUser(db, userId)).map(toSummary)
}

export async function channelOf(db: Db, userId: number, channelId: number): Promise<ChannelSummary> {
  const row = await findChannelForUser(db, userId, channelId)
  if (!row) throw notFound('Channel')
  return toSummary(row)
}

export async function membersOf(db: Db, channelId: number): Promise<ChannelMember[]> {
  const rows = await listMembers(db, channelId)
  return rows.map((r) => ({ userId: r.user_id, name: r.name, email: r.email, role: r.role }))
}
