import { z } from 'zod'
import { text } from './text'

export const roleSchema = z.enum(['owner', 'presenter', 'editor', 'viewer'])
export type Role = z.infer<typeof roleSchema>

/** The longest e-mail address there is (RFC 5321's path limit, less its angle brackets). */
const EMAIL_MAX = 254

export const signInSchema = z.object({
  // the length first, so a megabyte of text is refused before the address pattern reads it
  email: z
    .string({ message: 'Enter a valid e-mail address' })
    .max(EMAIL_MAX, { message: `An e-mail address has at most ${EMAIL_MAX} characters`, abort: true })
    .pipe(z.email({ message: 'Enter a valid e-mail address' })),
  password: text({ label: 'password', max: 200, required: 'Enter your password' }),
})
export type SignInInput = z.infer<typeof signInSchema>

export const userSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
})
export type User = z.infer<typeof userSchema>

const membershipSchema = z.object({
  channelId: z.number().int(),
  channelName: z.string(),
  channelSlug: z.string(),
  role: roleSchema,
})
export type Membership = z.infer<typeof membershipSchema>

export const signInResponseSchema = z.object({
  token: z.string(),
  expiresAt: z.string(),
  user: userSchema,
})
export type SignInResponse = z.infer<typeof signInResponseSchema>

export const meResponseSchema = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
})
export type MeResponse = z.infer<typeof meResponseSchema>

/** Error body of every failed API call. */
export const apiErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  details: z.unknown().optional(),
})
