import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import { toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { OutlineCreate, OutlineRecord } from '@shared/schemas/studio'
import { createOutline, duplicateOutline, getOutline, listOutlines, removeOutline } from '@/api/outlines'
import { outlineKeys, puzzleKeys } from '@/api/queryKeys'

/** The takes of one puzzle (nothing is fetched while the puzzle is unsaved). */
export function useOutlineList(channelId: MaybeRefOrGetter<number>, puzzleId: MaybeRefOrGetter<number | 'new'>) {
  return useQuery({
    queryKey: () => outlineKeys.byPuzzle(toValue(channelId), numeric(toValue(puzzleId))),
    queryFn: ({ signal }) => listOutlines(toValue(channelId), numeric(toValue(puzzleId)), signal),
    enabled: () => toValue(puzzleId) !== 'new',
  })
}

/** One outline, for the Studio: fetched afresh on every visit, never refetched behind the editor's back. */
export function useOutline(channelId: MaybeRefOrGetter<number>, outlineId: MaybeRefOrGetter<number>) {
  return useQuery({
    queryKey: () => outlineKeys.detail(toValue(channelId), toValue(outlineId)),
    queryFn: ({ signal }) => getOutline(toValue(channelId), toValue(outlineId), signal),
    // The editor owns the document once loaded; a background refetch must not swap it under the person typing.
    refetchOnWindowFocus: false,
    refetchOnMount: 'always',
  })
}

/** Finds the path for a saved puzzle and writes a new take. */
export function useCreateOutline(channelId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: ({ puzzleId, body }: { puzzleId: number; body?: OutlineCreate }) => createOutline(toValue(channelId), puzzleId, body),
    onSuccess: (record) => afterChange(client, toValue(channelId), record),
  })
}

export function useDuplicateOutline(channelId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: (outlineId: number) => duplicateOutline(toValue(channelId), outlineId),
    onSuccess: (record) => afterChange(client, toValue(channelId), record),
  })
}

export function useRemoveOutline(channelId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: ({ outlineId }: { outlineId: number; puzzleId: number }) => removeOutline(toValue(channelId), outlineId),
    onSuccess: (_void, { outlineId, puzzleId }) => {
      const channel = toValue(channelId)
      client.removeQueries({ queryKey: outlineKeys.detail(channel, outlineId) })
      void client.invalidateQueries({ queryKey: outlineKeys.byPuzzle(channel, puzzleId) })
      void client.invalidateQueries({ queryKey: puzzleKeys.all(channel), exact: true })
    },
  })
}

function afterChange(client: ReturnType<typeof useQueryClient>, channelId: number, record: OutlineRecord): void {
  client.setQueryData(outlineKeys.detail(channelId, record.id), record)
  void client.invalidateQueries({ queryKey: outlineKeys.byPuzzle(channelId, record.puzzleId) })
  // The Library shows each puzzle's outline count.
  void client.invalidateQueries({ queryKey: puzzleKeys.all(channelId), exact: true })
}

function numeric(id: number | 'new'): number {
  return id === 'new' ? 0 : id
}
