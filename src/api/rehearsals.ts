import { rehearsalListSchema, rehearsalRunSchema } from '@shared/schemas/rehearsal'
import type { ReadAloudRequest, RehearsalCreate, RehearsalList, RehearsalRun } from '@shared/schemas/rehearsal'
import { config } from '@/config'
import { ApiError, http, httpAuth, noContent, toApiError } from './http'

const takeBase = (channelId: number, outlineId: number) => `/channels/${channelId}/outlines/${outlineId}`

/** The take's runs (newest first) and its presenter's calibrated timing. */
export function listRehearsals(channelId: number, outlineId: number, signal?: AbortSignal): Promise<RehearsalList> {
  return http.get(`${takeBase(channelId, outlineId)}/rehearsals`, rehearsalListSchema, { signal })
}

export function saveRehearsal(channelId: number, outlineId: number, body: RehearsalCreate): Promise<RehearsalRun> {
  return http.post(`${takeBase(channelId, outlineId)}/rehearsals`, body, rehearsalRunSchema)
}

export function removeRehearsal(channelId: number, outlineId: number, rehearsalId: number): Promise<void> {
  return http.delete(`${takeBase(channelId, outlineId)}/rehearsals/${rehearsalId}`, noContent)
}

/**
 * A stretch of the script read aloud by the server (a WAV): a POST that answers a file, which the JSON client
 * doesn't do. Token and error bodies are treated as the HTTP client treats them.
 */
export async function fetchReadAloud(channelId: number, outlineId: number, body: ReadAloudRequest): Promise<Blob> {
  const auth = httpAuth()
  const token = auth.getToken()
  let response: Response
  try {
    response = await fetch(`${config.apiBase}${takeBase(channelId, outlineId)}/read-aloud`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Accept: 'audio/wav, application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) },
      body: JSON.stringify(body),
    })
  } catch {
    throw new ApiError(0, 'network-error', "Can't reach Gridcue. Check your connection and try again.")
  }
  if (!response.ok) {
    if (response.status === 401 && token) auth.onUnauthorized()
    throw toApiError(response.status, await response.json().catch(() => undefined))
  }
  return response.blob()
}
