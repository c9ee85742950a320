/** The wire contract of channels, their people, invitations, password resets and the account page. */
import { z } from 'zod'
import { roleSchema, signInSchema, userSchema } from './auth'
import { text } from './text'

const emailSchema = signInSchema.shape.email

/** A password someone chooses: the server also checks its strength against guessing (server/auth/password-strength.ts). */
const newPasswordSchema = text({ label: 'password', max: 200, required: 'Choose a password' }).min(10, { message: 'A password needs at least 10 characters' })

const personNameSchema = text({ label: 'name', max: 120, trim: true, required: 'Enter your name' })

export const channelInputSchema = z.object({
  name: text({ label: 'channel name', max: 120, trim: true, required: 'Give the channel a name' }),
  description: text({ label: 'description', max: 2000, trim: true }).default(''),
})
export type ChannelInput = z.output<typeof channelInputSchema>

export const memberRoleSchema = z.object({ role: roleSchema })

export const invitationInputSchema = z.object({ email: emailSchema, role: roleSchema })
export type InvitationInput = z.infer<typeof invitationInputSchema>

/** An invitation not yet accepted, as owners see it on the members page. */
export const pendingInvitationSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  role: roleSchema,
  invitedBy: z.string().nullable(),
  expiresAt: z.string(),
  expired: z.boolean(),
})
export type PendingInvitation = z.infer<typeof pendingInvitationSchema>

/** What the invitation link's page shows before anyone accepts it. */
export const invitationViewSchema = z.object({
  channelName: z.string(),
  role: roleSchema,
  email: z.string(),
  invitedBy: z.string().nullable(),
  /** an account with the invited address exists: its owner signs in and accepts instead of signing up */
  accountExists: z.boolean(),
})
export type InvitationView = z.infer<typeof invitationViewSchema>

export const invitationSignUpSchema = z.object({ name: personNameSchema, password: newPasswordSchema })
export type InvitationSignUpInput = z.infer<typeof invitationSignUpSchema>

export const invitationAcceptedSchema = z.object({
  channelId: z.number().int(),
  role: roleSchema,
  /** the account was in the channel already: its role stayed as it was */
  alreadyMember: z.boolean(),
})
export type InvitationAccepted = z.infer<typeof invitationAcceptedSchema>

export const resetRequestSchema = z.object({ email: emailSchema })
export type ResetRequestInput = z.infer<typeof resetRequestSchema>

export const resetPasswordSchema = z.object({ password: newPasswordSchema })
export type ResetPasswordInput = z.infer<typeof resetPasswordSchema>

export const accountSchema = userSchema.extend({
  /** a new address waiting for its confirmation mail to be followed */
  pendingEmail: z.string().nullable(),
})
export type Account = z.infer<typeof accountSchema>

export const accountNameSchema = z.object({ name: personNameSchema })
export type AccountNameInput = z.infer<typeof accountNameSchema>

export const emailChangeSchema = z.object({ email: emailSchema, password: signInSchema.shape.password })
export type EmailChangeInput = z.infer<typeof emailChangeSchema>

export const passwordChangeSchema = z.object({ currentPassword: signInSchema.shape.password, newPassword: newPasswordSchema })
export type PasswordChangeInput = z.infer<typeof passwordChangeSchema>

/** The one answer to a reset request, whether or not the address has an account. */
export const RESET_REQUESTED_MESSAGE = 'If an account uses this address, a mail with a link to choose a new password is on its way. The link works for an hour.'
