/** What the page starts from: the data the server inlined, or (for a members-only episode) the API with the saved sign-in. */
import type { EpisodePage } from '@shared/schemas/episode'
import { episodeAddress, fetchPage, inlinedPage, savedToken } from './api'

export type EpisodeStart =
  | { kind: 'page'; page: EpisodePage; fetched: boolean }
  | { kind: 'members-only'; signInHref: string }
  | { kind: 'missing' }
  | { kind: 'failed'; message: string }

/**
 * The server marks a shell it sent without data: `data-episode-state="members-only"` (an episode for the
 * channel's members, asked for by someone not signed in) or `"missing"`.
 */
const shellState = (doc: Document) => doc.querySelector('[data-episode-state]')?.getAttribute('data-episode-state') ?? null

/**
 * How the page starts, or null to leave the server's HTML as it is (a shell for an address with no episode,
 * which says so itself). Never throws: a failure becomes a message the page shows.
 */
export async function loadEpisode(doc: Document = document, storage: Pick<Storage, 'getItem'> = localStorage): Promise<EpisodeStart | null> {
  try {
    const inlined = inlinedPage(doc)
    if (inlined) return { kind: 'page', page: inlined, fetched: false }
    const address = episodeAddress(doc.location.pathname)
    if (!address) return null
    const token = savedToken(storage)
    if (token) {
      const page = await fetchPage(address, token)
      return page ? { kind: 'page', page, fetched: true } : { kind: 'missing' }
    }
    if (shellState(doc) !== 'members-only') return null
    const back = doc.location.pathname + doc.location.search + doc.location.hash
    return { kind: 'members-only', signInHref: `/sign-in?redirect=${encodeURIComponent(back)}` }
  } catch (error) {
    return { kind: 'failed', message: error instanceof Error ? error.message : 'The episode could not be loaded.' }
  }
}
