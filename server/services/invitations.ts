import type { SignInResponse } from '../../shared/schemas/auth'
import type { InvitationAccepted, InvitationInput, InvitationSignUpInput, InvitationView, PendingInvitation } from '../../shared/schemas/team'
import { hashPassword } from '../auth/passwords'
import { requireStrongPassword } from '../auth/password-strength'
import { DAY_MS, fromNow, hashLinkToken, newLinkToken } from '../auth/link-tokens'
import { issueToken, type TokenSettings } from '../auth/tokens'
import type { MailSettings } from '../config'
import { deleteOpenInvitation, findInvitationByHash, listOpenInvitations, markInvitationAccepted, upsertOpenInvitation, type InvitationWithNames } from '../db/invitations'
import type { Db } from '../db/knex'
import { addMember, findRole } from '../db/memberships'
import { findUserByEmail, insertUser } from '../db/users'
import { HttpError, notFound } from '../errors'
import { sendMailOrExplain } from '../mail/mailer'
import { invitationMail } from '../mail/messages'

const INVITATION_LIFETIME_MS = 7 * DAY_MS

const toPending = (row: InvitationWithNames): PendingInvitation => ({
  id: row.id,
  email: row.email,
  role: row.role,
  invitedBy: row.inviter_name,
  expiresAt: row.expires_at.toISOString(),
  expired: row.expires_at.getTime() <= Date.now(),
})

export async function openInvitationsOf(db: Db, channelId: number): Promise<PendingInvitation[]> {
  return (await listOpenInvitations(db, channelId)).map(toPending)
}

/**
 * Invites an address into the channel with a role and mails the link. Inviting the same address again
 * replaces the earlier link (and role), so only the newest mail works.
 */
export async function invite(db: Db, mail: MailSettings, inviter: Express.User, channelId: number, input: InvitationInput): Promise<PendingInvitation> {
  const existing = await findUserByEmail(db, input.email)
  if (existing && (await findRole(db, existing.id, channelId))) {
    throw new HttpError(409, 'already-member', `${input.email} is in this channel already: change their role in the list instead.`)
  }
  const { token, hash } = newLinkToken()
  const row = await upsertOpenInvitation(db, { channel_id: channelId, email: input.email, role: input.role, token_hash: hash, invited_by: inviter.id, expires_at: fromNow(INVITATION_LIFETIME_MS) })
  const invitation = await findInvitationByHash(db, row.token_hash)
  if (!invitation) throw notFound('Invitation')
  const message = invitationMail({ to: input.email, channelName: invitation.channel_name, inviterName: inviter.name, role: input.role, url: `${mail.publicUrl}/invitations/${token}` })
  await sendMailOrExplain(message, 'The invitation is saved')
  return toPending(invitation)
}

export async function withdrawInvitation(db: Db, channelId: number, invitationId: number): Promise<void> {
  if (!(await deleteOpenInvitation(db, channelId, invitationId))) throw notFound('Invitation')
}

/** The invitation a link names, while it can still be accepted; otherwise a sentence saying why not. */
async function usableInvitation(db: Db, token: string): Promise<InvitationWithNames> {
  const row = await findInvitationByHash(db, hashLinkToken(token))
  if (!row) {
    throw new HttpError(404, 'invitation-unknown', 'This invitation link is not known. It may have been mistyped, withdrawn, or replaced by a newer invitation: ask the channel owner to send it again.')
  }
  if (row.accepted_at) throw invitationUsed()
  if (row.expires_at.getTime() <= Date.now()) {
    throw new HttpError(410, 'invitation-expired', 'This invitation has expired (links work for seven days). Ask the channel owner to send a new one.')
  }
  return row
}

const invitationUsed = () =>
  new HttpError(410, 'invitation-used', 'This invitation has been used already. Sign in to reach the channel, or ask its owner for a new invitation.')

export async function describeInvitation(db: Db, token: string): Promise<InvitationView> {
  const row = await usableInvitation(db, token)
  return {
    channelName: row.channel_name,
    role: row.role,
    email: row.email,
    invitedBy: row.inviter_name,
    accountExists: (await findUserByEmail(db, row.email)) !== undefined,
  }
}

/** A new account for the invited address, in the channel with the invited role, signed in. */
export async function signUpByInvitation(db: Db, settings: TokenSettings, token: string, input: InvitationSignUpInput): Promise<SignInResponse> {
  const row = await usableInvitation(db, token)
  if (await findUserByEmail(db, row.email)) {
    throw new HttpError(409, 'account-exists', `An account with ${row.email} exists already: sign in with it, then open this link again to join.`)
  }
  requireStrongPassword(input.password, { email: row.email, name: input.name })
  const passwordHash = await hashPassword(input.password)
  const user = await db.transaction(async (trx) => {
    const created = await insertUser(trx, { email: row.email, name: input.name, password_hash: passwordHash })
    if (!(await markInvitationAccepted(trx, row.id, created.id))) throw invitationUsed()
    await addMember(trx, created.id, row.channel_id, row.role)
    return created
  })
  const { token: session, expiresAt } = issueToken(user.id, settings, user.token_version)
  return { token: session, expiresAt: expiresAt.toISOString(), user: { id: user.id, email: user.email, name: user.name } }
}

/**
 * The signed-in person joins the channel with the invited role. Someone in it already keeps their role:
 * the link then only leads them there.
 */
export async function acceptInvitation(db: Db, user: Express.User, token: string): Promise<InvitationAccepted> {
  const row = await usableInvitation(db, token)
  return db.transaction(async (trx) => {
    if (!(await markInvitationAccepted(trx, row.id, user.id))) throw invitationUsed()
    const role = await findRole(trx, user.id, row.channel_id)
    if (role) return { channelId: row.channel_id, role, alreadyMember: true }
    await addMember(trx, user.id, row.channel_id, row.role)
    return { channelId: row.channel_id, role: row.role, alreadyMember: false }
  })
}
