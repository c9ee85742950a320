/**
 * The episode page's only requests. Not the studio's HTTP client: that one brings the session store
 * and its plugins, and this entry stays small. Every body is still checked against the shared contract.
 */
import { episodePageSchema } from '@shared/schemas/episode'
import type { EpisodePage } from '@shared/schemas/episode'

/**
 * Where the studio app keeps its session (SESSION_STORAGE_KEY in src/stores/session.ts; a test holds the two
 * equal). Read here without the store, so Pinia stays out of this entry.
 */
export const SAVED_SESSION_KEY = 'gridcue.session'

/** The address of an episode page, from its path `/episodes/<channel>/<episode>`; null for any other path. */
export function episodeAddress(pathname: string): { channelSlug: string; episodeSlug: string } | null {
  const m = /^\/episodes\/([a-z0-9-]+)\/([a-z0-9-]+)\/?$/.exec(pathname)
  return m ? { channelSlug: m[1]!, episodeSlug: m[2]! } : null
}

/** The studio's bearer token when someone signed in on this browser and it hasn't run out; null otherwise. */
export function savedToken(storage: Pick<Storage, 'getItem'> = localStorage): string | null {
  try {
    const saved: unknown = JSON.parse(storage.getItem(SAVED_SESSION_KEY) ?? 'null')
    if (typeof saved !== 'object' || saved === null) return null
    const { token, expiresAt } = saved as { token?: unknown; expiresAt?: unknown }
    if (typeof token !== 'string' || typeof expiresAt !== 'string') return null
    return Date.parse(expiresAt) > Date.now() ? token : null
  } catch {
    return null
  }
}

/** The data the server put in the page (`<script type="application/json" id="episode-data">`), when it did. */
export function inlinedPage(doc: Document = document): EpisodePage | null {
  const text = doc.getElementById('episode-data')?.textContent
  if (!text) return null
  return episodePageSchema.parse(JSON.parse(text))
}

/**
 * A members-only episode's page data from the public API, asked for with the saved sign-in; null when the API
 * answers that there is no such episode for this person (it never says whether one exists for others).
 */
export async function fetchPage(address: { channelSlug: string; episodeSlug: string }, token: string): Promise<EpisodePage | null> {
  const response = await fetch(`/api/episodes/${address.channelSlug}/${address.episodeSlug}`, {
    headers: { Accept: 'application/json', Authorization: `Bearer ${token}` },
  })
  if (response.ok) return episodePageSchema.parse(await response.json())
  if (response.status === 404 || response.status === 401 || response.status === 403) return null
  throw new Error(`The episode could not be loaded (the server answered ${response.status}). Try again in a moment.`)
}
