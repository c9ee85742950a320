import { computed } from 'vue'
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import type { NotificationsRead } from '@shared/schemas/pipeline'
import { listNotifications, markNotificationsRead, pipelineKeys } from '@/api/pipeline'

// the bell asks again this often while the app is open: news of a colleague's upload can wait a minute
const REFRESH_MS = 60_000

/** The signed-in person's notifications, refreshed now and then, and marking them read. */
export function useNotifications() {
  const queryClient = useQueryClient()
  const query = useQuery({ queryKey: pipelineKeys.notifications, queryFn: ({ signal }) => listNotifications(signal), refetchInterval: REFRESH_MS })
  const mark = useMutation({
    mutationFn: (which: NotificationsRead) => markNotificationsRead(which),
    onSettled: () => queryClient.invalidateQueries({ queryKey: pipelineKeys.notifications }),
  })
  return {
    items: computed(() => query.data.value?.items ?? []),
    unread: computed(() => query.data.value?.unread ?? 0),
    markRead: (ids: number[]) => mark.mutate({ ids }),
    markAllRead: () => mark.mutate({ all: true }),
  }
}
