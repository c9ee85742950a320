import { z } from 'zod'
import { outlineRecordSchema, outlineRefreshedSchema, outlineSummarySchema } from '@shared/schemas/studio'
import type { OutlineCreate, OutlineRecord, OutlineRefreshed, OutlineSave, OutlineSummary } from '@shared/schemas/studio'
import type { PictureQuery } from '@shared/schemas/episode'
import { http, noContent } from './http'
import { withStaleCheck } from './stale'

const outlineListSchema = z.array(outlineSummarySchema)
const channelBase = (channelId: number) => `/channels/${channelId}`

/** The takes of one puzzle. */
export function listOutlines(channelId: number, puzzleId: number, signal?: AbortSignal): Promise<OutlineSummary[]> {
  return http.get(`${channelBase(channelId)}/puzzles/${puzzleId}/outlines`, outlineListSchema, { signal })
}

export function getOutline(channelId: number, outlineId: number, signal?: AbortSignal): Promise<OutlineRecord> {
  return http.get(`${channelBase(channelId)}/outlines/${outlineId}`, outlineRecordSchema, { signal })
}

/** The take only when it changed since the answer tagged `etag` (null when unchanged), for noticing someone else's save. */
export function getOutlineIfChanged(channelId: number, outlineId: number, etag: string | null): Promise<{ etag: string | null; data: OutlineRecord } | null> {
  return http.getIfChanged(`${channelBase(channelId)}/outlines/${outlineId}`, outlineRecordSchema, etag)
}

/** Runs the engine on the saved puzzle and writes a first script; can take a few seconds on hard puzzles. */
export function createOutline(channelId: number, puzzleId: number, body: OutlineCreate = {}): Promise<OutlineRecord> {
  return http.post(`${channelBase(channelId)}/puzzles/${puzzleId}/outlines`, body, outlineRecordSchema)
}

/**
 * Saves a script over `body.version` and resolves to the new summary (version, time, total); if someone saved
 * since, rejects with a StaleError holding their whole record.
 */
export function saveOutline(channelId: number, outlineId: number, body: OutlineSave): Promise<OutlineSummary> {
  return withStaleCheck(
    () => http.patch(`${channelBase(channelId)}/outlines/${outlineId}`, body, outlineSummarySchema),
    outlineRecordSchema,
    () => getOutline(channelId, outlineId),
  )
}

/**
 * Finds the path again on the puzzle as it is now, keeping the take's edited lines where their steps still
 * happen; rejects with a StaleError when someone saved since `version`.
 */
export function refreshOutline(channelId: number, outlineId: number, version: number): Promise<OutlineRefreshed> {
  return withStaleCheck(
    () => http.post(`${channelBase(channelId)}/outlines/${outlineId}/refresh`, { version }, outlineRefreshedSchema),
    outlineRecordSchema,
    () => getOutline(channelId, outlineId),
  )
}

export function duplicateOutline(channelId: number, outlineId: number): Promise<OutlineRecord> {
  return http.post(`${channelBase(channelId)}/outlines/${outlineId}/duplicate`, undefined, outlineRecordSchema)
}

export function removeOutline(channelId: number, outlineId: number): Promise<void> {
  return http.delete(`${channelBase(channelId)}/outlines/${outlineId}`, noContent)
}

/** The printable cue sheet (PDF), optionally with a grid thumbnail beside each line. */
export function getCueSheet(channelId: number, outlineId: number, thumbnails: boolean): Promise<Blob> {
  return http.getBlob(`${channelBase(channelId)}/outlines/${outlineId}/cue-sheet.pdf?thumbnails=${thumbnails ? 1 : 0}`)
}

/** The grid after a step as a PNG (wide 1280×720 or square 1080×1080), with or without the step's highlights. */
export function getGridPicture(channelId: number, outlineId: number, { step, shape, highlights }: PictureQuery): Promise<Blob> {
  const query = new URLSearchParams({ step: String(step), shape, highlights })
  return http.getBlob(`${channelBase(channelId)}/outlines/${outlineId}/picture.png?${query}`)
}
