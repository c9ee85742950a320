import { z } from 'zod'
import { roleSchema } from './auth'

export const channelSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  slug: z.string(),
  description: z.string(),
  role: roleSchema,
  memberCount: z.number().int(),
})
export type ChannelSummary = z.infer<typeof channelSummarySchema>

export const channelMemberSchema = z.object({
  userId: z.number().int(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
})
export type ChannelMember = z.infer<typeof channelMemberSchema>
