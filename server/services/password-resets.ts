import type { SignInResponse } from '../../shared/schemas/auth'
import { RESET_REQUESTED_MESSAGE, type ResetPasswordInput, type ResetRequestInput } from '../../shared/schemas/team'
import { fromNow, hashLinkToken, HOUR_MS, newLinkToken } from '../auth/link-tokens'
import { hashPassword } from '../auth/passwords'
import { requireStrongPassword } from '../auth/password-strength'
import { issueToken, type TokenSettings } from '../auth/tokens'
import type { MailSettings } from '../config'
import type { Db } from '../db/knex'
import { findPasswordResetByHash, markPasswordResetUsed, replacePasswordReset } from '../db/password-resets'
import type { PasswordResetRow } from '../db/tables'
import { findUserByEmail, findUserById, updateUser } from '../db/users'
import { HttpError } from '../errors'
import type { AppLogger } from '../logger'
import { sendMail } from '../mail/mailer'
import { passwordResetMail } from '../mail/messages'

const RESET_LIFETIME_MS = HOUR_MS

/**
 * Mails a reset link when the address has an account. The answer is the same either way and comes before
 * the mail is sent, so neither its words nor its timing tell whether the address is known.
 */
export async function requestPasswordReset(db: Db, mail: MailSettings, logger: AppLogger, input: ResetRequestInput): Promise<{ message: string }> {
  const user = await findUserByEmail(db, input.email)
  if (user) {
    const { token, hash } = newLinkToken()
    await replacePasswordReset(db, { user_id: user.id, token_hash: hash, expires_at: fromNow(RESET_LIFETIME_MS) })
    const message = passwordResetMail({ to: user.email, name: user.name, url: `${mail.publicUrl}/reset-password/${token}` })
    void sendMail(message).catch((err: unknown) => logger.error({ err }, 'a password reset mail could not be sent'))
  }
  return { message: RESET_REQUESTED_MESSAGE }
}

async function usableReset(db: Db, token: string): Promise<PasswordResetRow> {
  const row = await findPasswordResetByHash(db, hashLinkToken(token))
  if (!row) throw new HttpError(404, 'reset-unknown', 'This link to choose a new password is not known. It may have been mistyped or replaced by a newer one: ask for a new link.')
  if (row.used_at) throw resetUsed()
  if (row.expires_at.getTime() <= Date.now()) throw new HttpError(410, 'reset-expired', 'This link to choose a new password has expired (links work for an hour). Ask for a new one.')
  return row
}

const resetUsed = () => new HttpError(410, 'reset-used', 'This link to choose a new password has been used already. Ask for a new one if you need it.')

/** Whose password a link would change, so its page can say so (and tell an old link at once). */
export async function describeReset(db: Db, token: string): Promise<{ email: string }> {
  const row = await usableReset(db, token)
  const user = await findUserById(db, row.user_id)
  return { email: user?.email ?? '' }
}

/** Sets the new password, ends every session of the account, and signs this browser in with a fresh token. */
export async function resetPassword(db: Db, settings: TokenSettings, token: string, input: ResetPasswordInput): Promise<SignInResponse> {
  const row = await usableReset(db, token)
  const user = await findUserById(db, row.user_id)
  if (!user) throw resetUsed()
  requireStrongPassword(input.password, { email: user.email, name: user.name })
  const passwordHash = await hashPassword(input.password)
  const updated = await db.transaction(async (trx) => {
    if (!(await markPasswordResetUsed(trx, row.id))) throw resetUsed()
    return updateUser(trx, user.id, { password_hash: passwordHash })
  })
  const { token: session, expiresAt } = issueToken(updated.id, settings, updated.token_version)
  return { token: session, expiresAt: expiresAt.toISOString(), user: { id: updated.id, email: updated.email, name: updated.name } }
}
