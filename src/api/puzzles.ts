import { z } from 'zod'
import { puzzleRecordSchema, puzzleSummarySchema } from '@shared/schemas/studio'
import type { PuzzleDraft, PuzzleRecord, PuzzleSummary, PuzzleUpdate } from '@shared/schemas/studio'
import { http, noContent } from './http'
import { withStaleCheck } from './stale'

const puzzleListSchema = z.array(puzzleSummarySchema)
const base = (channelId: number) => `/channels/${channelId}/puzzles`

export function listPuzzles(channelId: number, signal?: AbortSignal): Promise<PuzzleSummary[]> {
  return http.get(base(channelId), puzzleListSchema, { signal })
}

export function getPuzzle(channelId: number, puzzleId: number, signal?: AbortSignal): Promise<PuzzleRecord> {
  return http.get(`${base(channelId)}/${puzzleId}`, puzzleRecordSchema, { signal })
}

export function createPuzzle(channelId: number, draft: PuzzleDraft): Promise<PuzzleRecord> {
  return http.post(base(channelId), draft, puzzleRecordSchema)
}

/** Saves over `update.version`; if someone saved since, rejects with a StaleError holding their copy. */
export function updatePuzzle(channelId: number, puzzleId: number, update: PuzzleUpdate): Promise<PuzzleRecord> {
  return withStaleCheck(
    () => http.put(`${base(channelId)}/${puzzleId}`, update, puzzleRecordSchema),
    puzzleRecordSchema,
    () => getPuzzle(channelId, puzzleId),
  )
}

export function deletePuzzle(channelId: number, puzzleId: number): Promise<void> {
  return http.delete(`${base(channelId)}/${puzzleId}`, noContent)
}
