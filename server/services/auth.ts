import type { MeResponse, SignInInput, SignInResponse } from '../../shared/schemas/auth'
import { verifyPassword } from '../auth/passwords'
import { issueToken, type TokenSettings } from '../auth/tokens'
import type { Db } from '../db/knex'
import { listMemberships } from '../db/memberships'
import { findUserByEmail } from '../db/users'
import { HttpError } from '../errors'

export async function signIn(db: Db, settings: TokenSettings, input: SignInInput): Promise<SignInResponse> {
  const user = await findUserByEmail(db, input.email)
  const ok = await verifyPassword(input.password, user?.password_hash)
  if (!user || !ok) throw new HttpError(401, 'bad-credentials', 'E-mail or password is wrong')
  const { token, expiresAt } = issueToken(user.id, settings)
  return { token, expiresAt: expiresAt.toISOString(), user: { id: user.id, email: user.email, name: user.name } }
}

export async function describeMe(db: Db, user: Express.User): Promise<MeResponse> {
  const rows = await listMemberships(db, user.id)
  return {
    user,
    memberships: rows.map((r) => ({ channelId: r.channel_id, channelName: r.channel_name, channelSlug: r.channel_slug, role: r.role })),
  }
}
