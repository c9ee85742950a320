import { findEpisodeAt } from './db/episodes'
import type { Db } from './db/knex'
import { pageUrlOf } from './services/episodes'

/** The demo channel's published episode (seeds/03_demo_episode.ts), which `npm start` points a newcomer to. */
export const DEMO_EPISODE_ADDRESS = { channelSlug: 'marigold-logic', episodeSlug: 'four-fevers' } as const

/** The demo episode's page below the app's origin while anyone can open it; null on a server without the demo data. */
export async function demoEpisodePath(db: Db): Promise<string | null> {
  const { channelSlug, episodeSlug } = DEMO_EPISODE_ADDRESS
  const row = await findEpisodeAt(db, channelSlug, episodeSlug)
  const open = row && row.visibility === 'public' && row.unpublished_at === null && row.publish_at <= new Date()
  return open ? pageUrlOf(channelSlug, episodeSlug) : null
}
