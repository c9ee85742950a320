import { computed, type MaybeRefOrGetter, toValue } from 'vue'
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import type { Role } from '@shared/schemas/auth'
import type { InvitationInput } from '@shared/schemas/team'
import { channelKeys, listChannelMembers } from '@/api/channels'
import { changeMemberRole, invitationKeys, invite, leaveChannel, listInvitations, removeMember, withdrawInvitation } from '@/api/team'
import { useSessionStore } from '@/stores/session'

/**
 * A channel's people for its members page: the member list, the open invitations (owners), and every change
 * owners and members make there. Each change refreshes the lists it touched.
 */
export function useChannelTeam(channelIdSource: MaybeRefOrGetter<number>) {
  const session = useSessionStore()
  const queryClient = useQueryClient()
  const channelId = computed(() => toValue(channelIdSource))

  // the role table decides whether to ask at all; the server would only answer 404 or 403
  const canSeeMembers = computed(() => session.can(channelId.value, 'members.read'))
  const canManage = computed(() => session.can(channelId.value, 'members.manage'))

  const members = useQuery({
    queryKey: () => channelKeys.members(channelId.value),
    queryFn: ({ signal }) => listChannelMembers(channelId.value, signal),
    enabled: canSeeMembers,
  })
  const invitations = useQuery({
    queryKey: () => invitationKeys.open(channelId.value),
    queryFn: ({ signal }) => listInvitations(channelId.value, signal),
    enabled: canManage,
  })

  const refreshMembers = () => Promise.all([
    queryClient.invalidateQueries({ queryKey: channelKeys.members(channelId.value) }),
    queryClient.invalidateQueries({ queryKey: channelKeys.detail(channelId.value) }),
  ])
  const refreshInvitations = () => queryClient.invalidateQueries({ queryKey: invitationKeys.open(channelId.value) })

  const sendInvitation = useMutation({
    mutationFn: (input: InvitationInput) => invite(channelId.value, input),
    onSuccess: refreshInvitations,
  })
  const withdraw = useMutation({
    mutationFn: (invitationId: number) => withdrawInvitation(channelId.value, invitationId),
    onSuccess: refreshInvitations,
  })
  const changeRole = useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: Role }) => changeMemberRole(channelId.value, userId, role),
    onSuccess: async (_member, { userId }) => {
      // one's own role decides what the app shows, so it is read again too
      if (userId === session.user?.id) await session.reloadMemberships()
      await refreshMembers()
    },
  })
  const remove = useMutation({
    mutationFn: (userId: number) => removeMember(channelId.value, userId),
    onSuccess: refreshMembers,
  })
  const leave = useMutation({
    mutationFn: () => leaveChannel(channelId.value),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: channelKeys.detail(channelId.value) })
      await Promise.all([session.reloadMemberships(), queryClient.invalidateQueries({ queryKey: channelKeys.all, exact: true })])
    },
  })

  return { canSeeMembers, canManage, members, invitations, sendInvitation, withdraw, changeRole, remove, leave }
}
