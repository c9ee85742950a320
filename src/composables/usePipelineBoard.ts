import { computed, ref, toValue, type MaybeRefOrGetter } from 'vue'
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import type { Board, BoardTake, TakePlan, TakeStage } from '@shared/schemas/pipeline'
import { getBoard, moveTake, pipelineKeys, planTake, setCadence } from '@/api/pipeline'

/**
 * The channel's board and what can be done to it: moving a take, planning it, changing the cadence. Each change
 * puts the answer into the cached board at once, so the board and the schedule show it without a reload; a
 * refusal leaves the board as it was and keeps the server's sentence in `problem`.
 */
export function usePipelineBoard(channelId: MaybeRefOrGetter<number>) {
  const queryClient = useQueryClient()
  const key = () => pipelineKeys.board(toValue(channelId))
  const boardQuery = useQuery({ queryKey: key, queryFn: ({ signal }) => getBoard(toValue(channelId), signal) })
  const problem = ref<string | null>(null)

  const replaceTake = (take: BoardTake) =>
    queryClient.setQueryData<Board>(key(), (board) => board && { ...board, takes: board.takes.map((t) => (t.outlineId === take.outlineId ? take : t)) })

  const move = useMutation({
    mutationFn: ({ outlineId, stage }: { outlineId: number; stage: TakeStage }) => moveTake(toValue(channelId), outlineId, stage),
    onMutate: () => (problem.value = null),
    onSuccess: replaceTake,
    onError: (error) => (problem.value = error.message),
  })
  const plan = useMutation({
    mutationFn: ({ outlineId, plan }: { outlineId: number; plan: TakePlan }) => planTake(toValue(channelId), outlineId, plan),
    onMutate: () => (problem.value = null),
    onSuccess: replaceTake,
    onError: (error) => (problem.value = error.message),
  })
  const cadence = useMutation({
    mutationFn: (cadenceDays: number) => setCadence(toValue(channelId), cadenceDays),
    onMutate: () => (problem.value = null),
    onSuccess: (cadenceDays) => queryClient.setQueryData<Board>(key(), (board) => board && { ...board, cadenceDays }),
    onError: (error) => (problem.value = error.message),
  })

  return {
    board: computed(() => boardQuery.data.value),
    loading: computed(() => boardQuery.isPending.value),
    loadError: computed(() => boardQuery.error.value?.message ?? null),
    problem,
    busy: computed(() => move.isPending.value || plan.isPending.value || cadence.isPending.value),
    moveTake: (outlineId: number, stage: TakeStage) => move.mutateAsync({ outlineId, stage }).catch(() => undefined),
    planTake: (outlineId: number, takePlan: TakePlan) => plan.mutateAsync({ outlineId, plan: takePlan }).catch(() => undefined),
    setCadence: (cadenceDays: number) => cadence.mutateAsync(cadenceDays).catch(() => undefined),
  }
}
