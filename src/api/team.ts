import { z } from 'zod'
import { channelMemberSchema, channelSummarySchema } from '@shared/schemas/channel'
import type { ChannelMember, ChannelSummary } from '@shared/schemas/channel'
import type { Role, SignInResponse } from '@shared/schemas/auth'
import { signInResponseSchema } from '@shared/schemas/auth'
import { invitationAcceptedSchema, invitationViewSchema, pendingInvitationSchema } from '@shared/schemas/team'
import type { ChannelInput, InvitationAccepted, InvitationInput, InvitationSignUpInput, InvitationView, PendingInvitation } from '@shared/schemas/team'
import { http, noContent } from './http'

/** A channel's open invitations sit under the channel, so leaving it drops them with the rest of its cache. */
export const invitationKeys = {
  open: (channelId: number) => ['channels', channelId, 'invitations'] as const,
  link: (token: string) => ['invitation-link', token] as const,
}

const tokenPath = (token: string) => `/invitations/${encodeURIComponent(token)}`

/** The creator becomes the new channel's owner. */
export function createChannel(input: ChannelInput): Promise<ChannelSummary> {
  return http.post('/channels', input, channelSummarySchema)
}

/** Owners only; changing the last owner's role answers 409 with a sentence. */
export function changeMemberRole(channelId: number, userId: number, role: Role): Promise<ChannelMember> {
  return http.patch(`/channels/${channelId}/members/${userId}`, { role }, channelMemberSchema)
}

export function removeMember(channelId: number, userId: number): Promise<void> {
  return http.delete(`/channels/${channelId}/members/${userId}`, noContent)
}

/** Any member may leave; the last owner gets a 409 with a sentence. */
export function leaveChannel(channelId: number): Promise<void> {
  return http.delete(`/channels/${channelId}/membership`, noContent)
}

export function listInvitations(channelId: number, signal?: AbortSignal): Promise<PendingInvitation[]> {
  return http.get(`/channels/${channelId}/invitations`, z.array(pendingInvitationSchema), { signal })
}

/** Inviting an address again replaces its earlier link, so "send again" is this same call. */
export function invite(channelId: number, input: InvitationInput): Promise<PendingInvitation> {
  return http.post(`/channels/${channelId}/invitations`, input, pendingInvitationSchema)
}

export function withdrawInvitation(channelId: number, invitationId: number): Promise<void> {
  return http.delete(`/channels/${channelId}/invitations/${invitationId}`, noContent)
}

/** The link's own page; used, expired and unknown links answer 410/404 with a sentence. No token is sent: the link is the access. */
export function describeInvitation(token: string, signal?: AbortSignal): Promise<InvitationView> {
  return http.get(tokenPath(token), invitationViewSchema, { signal, auth: false })
}

export function signUpByInvitation(token: string, input: InvitationSignUpInput): Promise<SignInResponse> {
  return http.post(`${tokenPath(token)}/sign-up`, input, signInResponseSchema, { auth: false })
}

export function acceptInvitation(token: string): Promise<InvitationAccepted> {
  return http.post(`${tokenPath(token)}/accept`, undefined, invitationAcceptedSchema)
}
