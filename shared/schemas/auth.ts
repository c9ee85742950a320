import { z } from 'zod'

export const roleSchema = z.enum(['owner', 'presenter', 'editor', 'viewer'])
export type Role = z.infer<typeof roleSchema>

export const signInSchema = z.object({
  email: z.email({ message: 'Enter a valid e-mail address' }).max(254),
  password: z.string().min(1, { message: 'Enter your password' }).max(200),
})
export type SignInInput = z.infer<typeof signInSchema>

const userSchema = z.object({
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
