import { roleCan, type Action } from '../../shared/permissions'
import type { Db } from '../db/knex'
import { findRole } from '../db/memberships'
import { forbidden, notFound } from '../errors'

/**
 * Passes when the user's role in the channel allows `action` (shared/permissions.ts is the one table).
 * Non-members get 404, so a channel's existence is not revealed; members with another role get 403.
 */
export async function requireChannelAccess(db: Db, userId: number, channelId: number, action: Action): Promise<void> {
  const role = await findRole(db, userId, channelId)
  if (!role) throw notFound('Channel')
  if (!roleCan(role, action)) throw forbidden(`Your role in this channel (${role}) does not allow this`)
}
