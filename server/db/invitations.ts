import type { Db } from './knex'
import type { InvitationRow } from './tables'

export interface InvitationWithNames extends InvitationRow {
  channel_name: string
  inviter_name: string | null
}

/**
 * Opens an invitation, or gives the open one for the same address and channel a new link, role and
 * expiry: the old link then names nothing.
 */
export async function upsertOpenInvitation(db: Db, invitation: Pick<InvitationRow, 'channel_id' | 'email' | 'role' | 'token_hash' | 'invited_by' | 'expires_at'>): Promise<InvitationRow> {
  const rows = await db.raw<{ rows: InvitationRow[] }>(
    `insert into invitations (channel_id, email, role, token_hash, invited_by, expires_at) values (?, ?, ?, ?, ?, ?)
     on conflict (channel_id, lower(email)) where accepted_at is null
     do update set role = excluded.role, token_hash = excluded.token_hash, invited_by = excluded.invited_by, expires_at = excluded.expires_at, created_at = now()
     returning *`,
    [invitation.channel_id, invitation.email, invitation.role, invitation.token_hash, invitation.invited_by, invitation.expires_at],
  )
  return rows.rows[0]!
}

const withNames = (db: Db) =>
  db('invitations')
    .join('channels', 'channels.id', 'invitations.channel_id')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .select('invitations.*', 'channels.name as channel_name', 'users.name as inviter_name')

export function findInvitationByHash(db: Db, tokenHash: string): Promise<InvitationWithNames | undefined> {
  return withNames(db).where('invitations.token_hash', tokenHash).first()
}

/** The channel's invitations nobody has accepted yet, newest first (expired ones too: the owner may send them again). */
export function listOpenInvitations(db: Db, channelId: number): Promise<InvitationWithNames[]> {
  return withNames(db).where('invitations.channel_id', channelId).whereNull('invitations.accepted_at').orderBy('invitations.created_at', 'desc')
}

/** Marks an open, unexpired invitation accepted; false when it was used or ran out meanwhile (single use even under a race). */
export async function markInvitationAccepted(db: Db, id: number, userId: number): Promise<boolean> {
  const count = await db('invitations')
    .where({ id })
    .whereNull('accepted_at')
    .where('expires_at', '>', db.fn.now())
    .update({ accepted_at: db.fn.now(), accepted_by: userId })
  return count === 1
}

/** Withdraws an open invitation of the channel; false when there is none by that id. */
export async function deleteOpenInvitation(db: Db, channelId: number, id: number): Promise<boolean> {
  return (await db('invitations').where({ id, channel_id: channelId }).whereNull('accepted_at').delete()) === 1
}
