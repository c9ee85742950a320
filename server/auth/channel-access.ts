import { roleCan, type Action } from '../../shared/permissions'
import type { Db } from '../db/knex'
import { findRole } from '../db/memberships'
import { forbidden, HttpError, notFound } from '../errors'

/**
 * Passes when the user's role in the channel allows `action` (shared/permissions.ts is the one table).
 * Non-members get 404, so a channel's existence is not revealed. So do viewers, for anything of the studio's
 * (drafts, scripts, recordings): a direct link gives no hint that it exists. Team members with another role get 403.
 */
export async function requireChannelAccess(db: Db, userId: number, channelId: number, action: Action): Promise<void> {
  const role = await findRole(db, userId, channelId)
  if (!role) throw notFound('Channel')
  if (roleCan(role, action)) return
  if (role === 'viewer') throw new HttpError(404, 'not-found', 'Nothing was found at this address.')
  throw forbidden(`Your role in this channel (${role}) does not allow this`)
}
