import type { Db } from './knex'
import type { EpisodeRow } from './tables'

/** An episode without its snapshot (it can be large), with what a summary shows beside it. */
export type EpisodeListRow = Omit<EpisodeRow, 'snapshot'> & {
  channel_slug: string
  puzzle_title: string
  setter: string | null
  /** null once the person who published it has left */
  publisher_name: string | null
  /** the take's updated_at now, against snapshot_updated_at */
  take_updated_at: Date
}

/** An episode with its snapshot and its channel, as the public page reads it. */
export type EpisodePageRow = EpisodeRow & { channel_name: string; channel_slug: string }

/** What publishing writes; the rest of the row is the database's. */
export type EpisodeFields = Omit<EpisodeRow, 'id' | 'published_at' | 'unpublished_at'>

const LIST_COLUMNS = [
  'episodes.id',
  'episodes.channel_id',
  'episodes.outline_id',
  'episodes.slug',
  'episodes.title',
  'episodes.visibility',
  'episodes.publish_at',
  'episodes.description',
  'episodes.video',
  'episodes.recording_id',
  'episodes.snapshot_updated_at',
  'episodes.published_at',
  'episodes.published_by',
  'episodes.unpublished_at',
  'channels.slug as channel_slug',
  'users.name as publisher_name',
  'outlines.updated_at as take_updated_at',
] as const

const listed = (db: Db) =>
  db('episodes')
    .join('channels', 'channels.id', 'episodes.channel_id')
    .join('outlines', 'outlines.id', 'episodes.outline_id')
    .leftJoin('users', 'users.id', 'episodes.published_by')
    // the titles only, read inside PostgreSQL: a summary never carries the snapshot's steps
    .select<EpisodeListRow[]>(...LIST_COLUMNS, db.raw("episodes.snapshot ->> 'title' as puzzle_title"), db.raw("episodes.snapshot ->> 'author' as setter"))

/** A channel's episodes, newest publish date first; with `liveAt`, only those live at that moment. */
export function listEpisodes(db: Db, channelId: number, liveAt?: Date): Promise<EpisodeListRow[]> {
  const query = listed(db).where('episodes.channel_id', channelId)
  if (liveAt) query.whereNull('episodes.unpublished_at').andWhere('episodes.publish_at', '<=', liveAt)
  return query.orderBy('episodes.publish_at', 'desc').orderBy('episodes.id', 'desc')
}

/** A take's episode, only when the take belongs to the channel. */
export function findTakeEpisode(db: Db, channelId: number, outlineId: number): Promise<EpisodeListRow | undefined> {
  return listed(db).where('episodes.outline_id', outlineId).andWhere('episodes.channel_id', channelId).first()
}

/** The outline id of the channel's episode that uses an address name, if any. */
export async function findSlugHolder(db: Db, channelId: number, slug: string): Promise<number | undefined> {
  return (await db('episodes').where({ channel_id: channelId, slug }).first('outline_id'))?.outline_id
}

/** The episode at a public address, whatever its state: the caller decides who may see it. */
export function findEpisodeAt(db: Db, channelSlug: string, episodeSlug: string): Promise<EpisodePageRow | undefined> {
  return db('episodes')
    .join('channels', 'channels.id', 'episodes.channel_id')
    .where('channels.slug', channelSlug)
    .andWhere('episodes.slug', episodeSlug)
    .first<EpisodePageRow | undefined>('episodes.*', 'channels.name as channel_name', 'channels.slug as channel_slug')
}

/**
 * Publishes a take, or publishes it again over its episode: every setting and the snapshot are replaced, the
 * publish stamp moves to now and an unpublished episode is back. Throws PostgreSQL's unique violation when
 * another episode of the channel took the address name meanwhile.
 */
export async function saveEpisode(db: Db, fields: EpisodeFields): Promise<void> {
  const values = {
    ...fields,
    video: db.raw('?::jsonb', [JSON.stringify(fields.video)]),
    snapshot: db.raw('?::jsonb', [JSON.stringify(fields.snapshot)]),
    published_at: db.fn.now(),
    unpublished_at: null,
  }
  await db('episodes').insert(values).onConflict('outline_id').merge()
}

/** Takes an episode down (its settings stay, to publish it again); an episode already down keeps the time it went. */
export async function unpublishEpisode(db: Db, episodeId: number): Promise<void> {
  await db('episodes')
    .where({ id: episodeId })
    .update({ unpublished_at: db.raw('coalesce(unpublished_at, now())') })
}

/** The name of the unique index on a channel's address names, as a violation of it reports. */
export const SLUG_INDEX = 'episodes_channel_slug_unique'
