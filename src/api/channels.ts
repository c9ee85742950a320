import { z } from 'zod'
import { channelMemberSchema, channelSummarySchema } from '@shared/schemas/channel'
import type { ChannelMember, ChannelSummary } from '@shared/schemas/channel'
import { http } from './http'

/** Query keys for @tanstack/vue-query, kept next to the calls they cache. */
export const channelKeys = {
  all: ['channels'] as const,
  detail: (channelId: number) => ['channels', channelId] as const,
  members: (channelId: number) => ['channels', channelId, 'members'] as const,
}

const channelListSchema = z.array(channelSummarySchema)
const memberListSchema = z.array(channelMemberSchema)

export function listChannels(signal?: AbortSignal): Promise<ChannelSummary[]> {
  return http.get('/channels', channelListSchema, { signal })
}

export function getChannel(channelId: number, signal?: AbortSignal): Promise<ChannelSummary> {
  return http.get(`/channels/${channelId}`, channelSummarySchema, { signal })
}

/** Owners, presenters and editors only; a viewer gets a 404. */
export function listChannelMembers(channelId: number, signal?: AbortSignal): Promise<ChannelMember[]> {
  return http.get(`/channels/${channelId}/members`, memberListSchema, { signal })
}
