import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import { toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { PuzzleDraft, PuzzleRecord } from '@shared/schemas/studio'
import { createPuzzle, deletePuzzle, getPuzzle, listPuzzles, updatePuzzle } from '@/api/puzzles'
import { puzzleKeys } from '@/api/queryKeys'

/** A channel's puzzles, for the Library. */
export function usePuzzleList(channelId: MaybeRefOrGetter<number>, enabled: MaybeRefOrGetter<boolean> = true) {
  return useQuery({
    queryKey: () => puzzleKeys.all(toValue(channelId)),
    queryFn: ({ signal }) => listPuzzles(toValue(channelId), signal),
    enabled: () => toValue(enabled),
  })
}

/** One puzzle; disabled while the id is 'new'. */
export function usePuzzle(channelId: MaybeRefOrGetter<number>, puzzleId: MaybeRefOrGetter<number | 'new'>) {
  return useQuery({
    queryKey: () => puzzleKeys.detail(toValue(channelId), idOrZero(toValue(puzzleId))),
    queryFn: ({ signal }) => getPuzzle(toValue(channelId), idOrZero(toValue(puzzleId)), signal),
    enabled: () => toValue(puzzleId) !== 'new',
    // The form keeps its own copy once loaded; a background refetch must not look like someone else's save.
    refetchOnWindowFocus: false,
  })
}

export type PuzzleSaveInput = { draft: PuzzleDraft; puzzleId: number | 'new'; version?: number }

/** Creates or updates a puzzle; a stale version rejects with a StaleError (see api/stale.ts). */
export function useSavePuzzle(channelId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: ({ draft, puzzleId, version }: PuzzleSaveInput): Promise<PuzzleRecord> => {
      const channel = toValue(channelId)
      if (puzzleId === 'new') return createPuzzle(channel, draft)
      if (version === undefined) throw new Error('useSavePuzzle: an existing puzzle needs the version it was read at')
      return updatePuzzle(channel, puzzleId, { ...draft, version })
    },
    onSuccess: (record) => {
      client.setQueryData(puzzleKeys.detail(record.channelId, record.id), record)
      void client.invalidateQueries({ queryKey: puzzleKeys.all(record.channelId), exact: true })
    },
  })
}

/** Deletes a puzzle with its outlines; the Library list refreshes. */
export function useRemovePuzzle(channelId: MaybeRefOrGetter<number>) {
  const client = useQueryClient()
  return useMutation({
    mutationFn: (puzzleId: number) => deletePuzzle(toValue(channelId), puzzleId),
    onSuccess: (_void, puzzleId) => {
      const channel = toValue(channelId)
      client.removeQueries({ queryKey: puzzleKeys.detail(channel, puzzleId) })
      void client.invalidateQueries({ queryKey: puzzleKeys.all(channel), exact: true })
    },
  })
}

function idOrZero(id: number | 'new'): number {
  return id === 'new' ? 0 : id
}
