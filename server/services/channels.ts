import type { Role } from '../../shared/schemas/auth'
import type { ChannelMember, ChannelSummary } from '../../shared/schemas/channel'
import type { ChannelInput } from '../../shared/schemas/team'
import { findChannelForUser, insertChannel, listChannelsForUser, slugsLike, updateChannel, type ChannelWithRole } from '../db/channels'
import type { Db } from '../db/knex'
import { addMember, listMembers, lockMemberAndOwners, removeMembership, setMemberRole } from '../db/memberships'
import { HttpError, notFound } from '../errors'

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

const SLUG_MAX = 60

/** The channel's address name from its name: lower-case ASCII words joined by '-', a number added when taken. */
async function freeSlug(db: Db, name: string): Promise<string> {
  const base =
    name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, SLUG_MAX)
      .replace(/-+$/, '') || 'channel'
  const taken = new Set(await slugsLike(db, base))
  if (!taken.has(base)) return base
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`
}

/** A new channel with its creator as its one owner. */
export async function createChannel(db: Db, userId: number, input: ChannelInput): Promise<ChannelSummary> {
  const id = await db.transaction(async (trx) => {
    const channel = await insertChannel(trx, { name: input.name, description: input.description, slug: await freeSlug(trx, input.name) })
    await addMember(trx, userId, channel.id, 'owner')
    return channel.id
  })
  return channelOf(db, userId, id)
}

/** A new name and description; the address name (slug) stays, so published links keep working. */
export async function renameChannel(db: Db, userId: number, channelId: number, input: ChannelInput): Promise<ChannelSummary> {
  await updateChannel(db, channelId, input)
  return channelOf(db, userId, channelId)
}

const lastOwner = (doing: string) =>
  new HttpError(409, 'last-owner', `A channel needs at least one owner, so the last one can't ${doing}. Make someone else an owner first.`)

/** A member's new role; the last owner can't be made anything else. */
export async function changeMemberRole(db: Db, channelId: number, memberId: number, role: Role): Promise<ChannelMember> {
  await db.transaction(async (trx) => {
    const current = await lockMemberAndOwners(trx, memberId, channelId)
    if (!current.role) throw notFound('Member')
    if (current.role === 'owner' && role !== 'owner' && current.owners === 1) throw lastOwner('be given another role')
    await setMemberRole(trx, memberId, channelId, role)
  })
  const member = (await membersOf(db, channelId)).find((m) => m.userId === memberId)
  if (!member) throw notFound('Member')
  return member
}

/** Takes someone out of the channel (an owner removing a member, or a member leaving); never its last owner. */
export async function removeMember(db: Db, channelId: number, memberId: number, leaving = false): Promise<void> {
  await db.transaction(async (trx) => {
    const current = await lockMemberAndOwners(trx, memberId, channelId)
    if (!current.role) throw notFound('Member')
    if (current.role === 'owner' && current.owners === 1) throw lastOwner(leaving ? 'leave' : 'be removed')
    await removeMembership(trx, memberId, channelId)
  })
}
