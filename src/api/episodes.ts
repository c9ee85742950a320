import { z } from 'zod'
import { episodeSchema, episodeSummarySchema } from '@shared/schemas/episode'
import type { Episode, EpisodePublish, EpisodeSummary } from '@shared/schemas/episode'
import { http } from './http'

const episodeListSchema = z.array(episodeSummarySchema)
const takeEpisode = (channelId: number, outlineId: number) => `/channels/${channelId}/outlines/${outlineId}/episode`

/** The channel's episodes, newest publish date first; a viewer gets the live ones only. */
export function listEpisodes(channelId: number, signal?: AbortSignal): Promise<EpisodeSummary[]> {
  return http.get(`/channels/${channelId}/episodes`, episodeListSchema, { signal })
}

/** The take's episode; rejects with a 404 ApiError when the take was never published. */
export function getTakeEpisode(channelId: number, outlineId: number, signal?: AbortSignal): Promise<Episode> {
  return http.get(takeEpisode(channelId, outlineId), episodeSchema, { signal })
}

/** Publishes the take, or republishes it with its current script; a slug another episode uses answers 409. */
export function publishEpisode(channelId: number, outlineId: number, body: EpisodePublish): Promise<Episode> {
  return http.put(takeEpisode(channelId, outlineId), body, episodeSchema)
}

/** Takes the page down; the settings stay for publishing again. */
export function unpublishEpisode(channelId: number, outlineId: number): Promise<Episode> {
  return http.delete(takeEpisode(channelId, outlineId), episodeSchema)
}
