import type { MeResponse, SignInInput, SignInResponse } from '../../shared/schemas/auth'
import { verifyPassword } from '../auth/passwords'
import { issueToken, type TokenSettings } from '../auth/tokens'
import type { Db } from '../db/knex'
import { listMemberships } from '../db/memberships'
import { bumpTokenVersion, findUserByEmail } from '../db/users'
import { HttpError } from '../errors'

export async function signIn(db: Db, settings: TokenSettings, input: SignInInput): Promise<SignInResponse> {
  const user = await findUserByEmail(db, input.email)
  const ok = await verifyPassword(input.password, user?.password_hash)
  if (!user || !ok) throw new HttpError(401, 'bad-credentials', 'E-mail or password is wrong')
  const { token, expiresAt } = issueToken(user.id, settings, user.token_version)
  return { token, expiresAt: expiresAt.toISOString(), user: { id: user.id, email: user.email, name: user.name } }
}

/**
 * Ends every session of a user, on every device: the tokens they hold carry the old token version.
 * Sign-out calls it, and so should a password change.
 */
export async function endAllSessions(db: Db, userId: number): Promise<void> {
  await bumpTokenVersion(db, userId)
}

export async function describeMe(db: Db, user: Express.User): Promise<MeResponse> {
  const rows = await listMemberships(db, user.id)
  return {
    user,
    memberships: rows.map((r) => ({ channelId: r.channel_id, channelName: r.channel_name, channelSlug: r.channel_slug, role: r.role })),
  }
}
