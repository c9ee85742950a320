import type { SignInResponse } from '../../shared/schemas/auth'
import type { Account, AccountNameInput, EmailChangeInput, PasswordChangeInput } from '../../shared/schemas/team'
import { DAY_MS, fromNow, hashLinkToken, newLinkToken } from '../auth/link-tokens'
import { hashPassword, verifyPassword } from '../auth/passwords'
import { requireStrongPassword } from '../auth/password-strength'
import { issueToken, type TokenSettings } from '../auth/tokens'
import type { MailSettings } from '../config'
import { deleteEmailChange, findEmailChangeByHash, findEmailChangeOf, replaceEmailChange } from '../db/email-changes'
import type { Db } from '../db/knex'
import type { UserRow } from '../db/tables'
import { findUserByEmail, findUserById, updateUser } from '../db/users'
import { HttpError } from '../errors'
import { sendMailOrExplain } from '../mail/mailer'
import { emailConfirmationMail } from '../mail/messages'

const EMAIL_CHANGE_LIFETIME_MS = DAY_MS

async function accountRow(db: Db, userId: number): Promise<UserRow> {
  const row = await findUserById(db, userId)
  // the token was checked against this row a moment ago: gone now means the account was deleted meanwhile
  if (!row) throw new HttpError(401, 'unauthenticated', 'Your sign-in token is not valid. Please sign in again.')
  return row
}

export async function accountOf(db: Db, userId: number): Promise<Account> {
  const [row, change] = await Promise.all([accountRow(db, userId), findEmailChangeOf(db, userId)])
  return { id: row.id, email: row.email, name: row.name, pendingEmail: change && change.expires_at.getTime() > Date.now() ? change.new_email : null }
}

export async function renameAccount(db: Db, userId: number, input: AccountNameInput): Promise<Account> {
  await updateUser(db, userId, { name: input.name })
  return accountOf(db, userId)
}

const wrongPassword = () => new HttpError(400, 'wrong-password', 'Your current password is not right, so nothing was changed.')

/** Mails a confirmation link to the new address; the account keeps its old address until the link is followed. */
export async function requestEmailChange(db: Db, mail: MailSettings, userId: number, input: EmailChangeInput): Promise<Account> {
  const row = await accountRow(db, userId)
  if (!(await verifyPassword(input.password, row.password_hash))) throw wrongPassword()
  if (input.email.toLowerCase() === row.email.toLowerCase()) throw new HttpError(400, 'same-email', 'This is the address your account uses already.')
  if (await findUserByEmail(db, input.email)) throw emailTaken(input.email)
  const { token, hash } = newLinkToken()
  await replaceEmailChange(db, { user_id: userId, new_email: input.email, token_hash: hash, expires_at: fromNow(EMAIL_CHANGE_LIFETIME_MS) })
  await sendMailOrExplain(emailConfirmationMail({ to: input.email, name: row.name, url: `${mail.publicUrl}/confirm-email/${token}` }), 'The new address is noted')
  return accountOf(db, userId)
}

const emailTaken = (email: string) => new HttpError(409, 'email-taken', `Another account uses ${email} already.`)

/** Follows a confirmation link: the account's address becomes the new one. */
export async function confirmEmailChange(db: Db, token: string): Promise<{ email: string }> {
  const change = await findEmailChangeByHash(db, hashLinkToken(token))
  if (!change) {
    throw new HttpError(404, 'email-link-unknown', 'This confirmation link is not known. It may have been used already or replaced by a newer one: ask for the change again on your account page.')
  }
  if (change.expires_at.getTime() <= Date.now()) {
    throw new HttpError(410, 'email-link-expired', 'This confirmation link has expired (links work for a day). Ask for the change again on your account page.')
  }
  if (await findUserByEmail(db, change.new_email)) throw emailTaken(change.new_email)
  await db.transaction(async (trx) => {
    await updateUser(trx, change.user_id, { email: change.new_email })
    await deleteEmailChange(trx, change.user_id)
  })
  return { email: change.new_email }
}

/**
 * A new password, the current one required. Every other session ends (the token version moves on);
 * this one goes on with the fresh token in the answer.
 */
export async function changePassword(db: Db, settings: TokenSettings, userId: number, input: PasswordChangeInput): Promise<SignInResponse> {
  const row = await accountRow(db, userId)
  if (!(await verifyPassword(input.currentPassword, row.password_hash))) throw wrongPassword()
  requireStrongPassword(input.newPassword, { email: row.email, name: row.name })
  const updated = await updateUser(db, userId, { password_hash: await hashPassword(input.newPassword) })
  const { token, expiresAt } = issueToken(updated.id, settings, updated.token_version)
  return { token, expiresAt: expiresAt.toISOString(), user: { id: updated.id, email: updated.email, name: updated.name } }
}
