import type { Episode, EpisodePage, EpisodePlayer, EpisodePublish, EpisodeState, EpisodeSummary, EpisodeVideoChoice, PictureQuery } from '../../shared/schemas/episode'
import { roleCan } from '../../shared/permissions'
import type { Outline } from '../../shared/schemas/outline'
import { toWebVttCaptions } from '../../shared/script/index'
import type { EpisodeGrants } from '../auth/episode-grants'
import { findEpisodeAt, findSlugHolder, findTakeEpisode, listEpisodes, saveEpisode, SLUG_INDEX, unpublishEpisode, type EpisodeListRow, type EpisodePageRow } from '../db/episodes'
import type { Db } from '../db/knex'
import { findRole } from '../db/memberships'
import { findOutline, findOutlineStamp, outlineOf } from '../db/outlines'
import { findPuzzle } from '../db/puzzles'
import { findRecording } from '../db/recordings'
import { findUserById } from '../db/users'
import { HttpError, notFound } from '../errors'
import { checkPictureStep } from '../pictures/grid-picture'
import type { Exports } from '../workers/export-pool'
import { recordingFileOf, type RecordingDeps } from './recordings'
import { episodePageData } from './episode-page-data'
import { takePublished, takeUnpublished } from './pipeline'

export interface EpisodeDeps extends RecordingDeps {
  grants: EpisodeGrants
  /** where pictures are drawn, off the request thread */
  exports: Exports
}

// ---- the studio's side: publish, unpublish, list -------------------------------------------------

/** A channel's episodes, newest publish date first: the studio team sees every state, anyone else what is live. */
export async function episodesOf(db: Db, channelId: number, user: Express.User): Promise<EpisodeSummary[]> {
  const team = roleCan(await findRole(db, user.id, channelId), 'outline.read')
  const now = new Date()
  return (await listEpisodes(db, channelId, team ? undefined : now)).map((row) => toSummary(row, now))
}

/** The take's episode, with whether the take has changed since it was published. */
export async function takeEpisodeOf(db: Db, channelId: number, outlineId: number): Promise<Episode> {
  if (!(await findOutlineStamp(db, channelId, outlineId))) throw notFound('Outline')
  const row = await findTakeEpisode(db, channelId, outlineId)
  if (!row) throw new HttpError(404, 'not-found', 'This take has not been published yet.')
  return toEpisode(row, new Date())
}

/**
 * Publishes the take as it is now, or publishes it again: the page shows this snapshot of the script and the
 * puzzle's credits until the next time. A publish date in the past, or none, means now.
 */
export async function publishEpisode(db: Db, channelId: number, outlineId: number, input: EpisodePublish, user: Express.User, { announce = true }: { announce?: boolean } = {}): Promise<Episode> {
  const take = await findOutline(db, channelId, outlineId)
  if (!take) throw notFound('Outline')
  const puzzle = (await findPuzzle(db, channelId, take.puzzle_id))!
  const recordingId = await chosenRecording(db, channelId, outlineId, input.video)
  const holder = await findSlugHolder(db, channelId, input.slug)
  if (holder !== undefined && holder !== outlineId) throw slugTaken(input.slug)
  const now = new Date()
  const asked = input.publishAt === undefined ? now : new Date(input.publishAt)
  const snapshot: Outline = { ...outlineOf(take), title: puzzle.title, author: puzzle.author || undefined, link: puzzle.link || undefined }
  try {
    await saveEpisode(db, {
      channel_id: channelId,
      outline_id: outlineId,
      slug: input.slug,
      title: input.title,
      visibility: input.visibility,
      publish_at: asked > now ? asked : now,
      description: input.description,
      video: input.video,
      recording_id: recordingId,
      snapshot,
      snapshot_updated_at: take.updated_at,
      published_by: user.id,
    })
  } catch (error) {
    // another episode took the name between the check above and the write
    if ((error as { constraint?: string }).constraint === SLUG_INDEX) throw slugTaken(input.slug)
    throw error
  }
  await takePublished(db, channelId, outlineId, user, { slug: input.slug, publishAt: asked > now ? asked : now, announce })
  return takeEpisodeOf(db, channelId, outlineId)
}

/** Takes the take's episode down: its page answers 404, its settings stay for publishing again. */
export async function unpublishTake(db: Db, channelId: number, outlineId: number, user?: Express.User): Promise<Episode> {
  const episode = await takeEpisodeOf(db, channelId, outlineId)
  await unpublishEpisode(db, episode.id)
  await takeUnpublished(db, channelId, outlineId, user)
  return takeEpisodeOf(db, channelId, outlineId)
}

async function chosenRecording(db: Db, channelId: number, outlineId: number, video: EpisodeVideoChoice): Promise<number | null> {
  if (video.kind !== 'recording') return null
  if (!(await findRecording(db, channelId, outlineId, video.recordingId))) {
    throw new HttpError(400, 'invalid-input', "body.video.recordingId: the chosen recording is not one of this take's recordings", [
      { path: 'body.video.recordingId', message: "the chosen recording is not one of this take's recordings" },
    ])
  }
  return video.recordingId
}

const slugTaken = (slug: string) =>
  new HttpError(409, 'slug-taken', `Another episode of this channel already uses the address name "${slug}". Pick another one.`, [
    { path: 'body.slug', message: `another episode of this channel already uses the address name "${slug}"` },
  ])

const stateOf = (row: Pick<EpisodeListRow, 'unpublished_at' | 'publish_at'>, now: Date): EpisodeState =>
  row.unpublished_at ? 'unpublished' : row.publish_at > now ? 'scheduled' : 'live'

/** The page's address below the app's origin. */
export const pageUrlOf = (channelSlug: string, episodeSlug: string): string => `/episodes/${encodeURIComponent(channelSlug)}/${encodeURIComponent(episodeSlug)}`

const toSummary = (row: EpisodeListRow, now: Date): EpisodeSummary => ({
  id: row.id,
  outlineId: row.outline_id,
  slug: row.slug,
  title: row.title,
  visibility: row.visibility,
  state: stateOf(row, now),
  publishAt: row.publish_at.toISOString(),
  pageUrl: pageUrlOf(row.channel_slug, row.slug),
  puzzleTitle: row.puzzle_title,
  ...(row.setter ? { setter: row.setter } : {}),
})

const toEpisode = (row: EpisodeListRow, now: Date): Episode => ({
  ...toSummary(row, now),
  description: row.description,
  video: row.video,
  publishedAt: row.published_at.toISOString(),
  publishedBy: row.publisher_name ?? 'a former member',
  takeChangedSince: row.take_updated_at.getTime() > row.snapshot_updated_at.getTime(),
})

// ---- the public side: the page's data and files ------------------------------------------------

/** Who asks for a public episode: a signed-in person, and/or the grant a members-only episode's file addresses carry. */
export interface Visitor {
  user?: Express.User
  access?: string
}

/** The one answer for every episode a visitor may not see, so none of them gives away that it exists. */
const noEpisode = () => new HttpError(404, 'not-found', 'There is no episode at this address.')

/** The page's data for a visitor allowed to see it. */
export async function episodePageOf(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor): Promise<EpisodePage> {
  return pageData(deps, await visibleEpisode(deps, channelSlug, episodeSlug, visitor), visitor)
}

/**
 * The page's data, or 'members' for a live members-only episode asked for without a sign-in (a page opened
 * in the browser carries no token: it asks the visitor to sign in, then fetches the data with theirs).
 */
export async function pageOrSignIn(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor): Promise<EpisodePage | 'members'> {
  const row = await findEpisodeAt(deps.db, channelSlug, episodeSlug)
  if (row && isLive(row) && row.visibility === 'members' && !visitor.user) return 'members'
  return pageData(deps, await allowed(deps, row, visitor), visitor)
}

async function pageData(deps: EpisodeDeps, row: EpisodePageRow, visitor: Visitor): Promise<EpisodePage> {
  const grant = row.visibility === 'members' && visitor.user ? await grantFor(deps, row, visitor.user) : undefined
  const base = `/api${pageUrlOf(row.channel_slug, row.slug)}`
  const withGrant = (url: string) => (grant ? `${url}?access=${encodeURIComponent(grant)}` : url)
  const addresses = { media: withGrant(`${base}/media`), captions: withGrant(`${base}/captions.vtt`), picture: withGrant(`${base}/picture.png`) }
  return episodePageData(row, await playerOf(deps.db, row, addresses.media), addresses)
}

/** The episode's recording, in ranges. */
export async function episodeMediaOf(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor) {
  const row = await visibleEpisode(deps, channelSlug, episodeSlug, visitor)
  if (row.video.kind !== 'recording' || row.recording_id === null) throw new HttpError(404, 'not-found', 'This episode has no recording to play.')
  return recordingFileOf(deps, row.channel_id, row.outline_id, row.recording_id)
}

/** WebVTT captions of the published script at the published times. */
export async function episodeCaptionsOf(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor): Promise<string> {
  return toWebVttCaptions((await visibleEpisode(deps, channelSlug, episodeSlug, visitor)).snapshot)
}

/** The grid of the published take as a PNG picture. */
export async function episodePictureOf(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor, query: PictureQuery): Promise<Buffer> {
  const row = await visibleEpisode(deps, channelSlug, episodeSlug, visitor)
  checkPictureStep(row.snapshot.steps.length, query.step)
  return deps.exports.gridPicture({ outline: row.snapshot, step: query.step, shape: query.shape, highlights: query.highlights === 'on', title: row.title })
}

const isLive = (row: EpisodePageRow) => stateOf(row, new Date()) === 'live'

/** A live episode the visitor may see: a public one, or a members-only one for a member (signed in, or holding a grant). */
async function visibleEpisode(deps: EpisodeDeps, channelSlug: string, episodeSlug: string, visitor: Visitor): Promise<EpisodePageRow> {
  return allowed(deps, await findEpisodeAt(deps.db, channelSlug, episodeSlug), visitor)
}

async function allowed(deps: EpisodeDeps, row: EpisodePageRow | undefined, visitor: Visitor): Promise<EpisodePageRow> {
  if (!row || !isLive(row)) throw noEpisode()
  if (row.visibility === 'public') return row
  const userId = visitor.user?.id ?? (await grantHolder(deps, row, visitor.access))
  if (userId === undefined || !roleCan(await findRole(deps.db, userId, row.channel_id), 'episode.read')) throw noEpisode()
  return row
}

/** The person a grant names, while it is for this episode and they haven't signed out since. */
async function grantHolder({ db, grants }: EpisodeDeps, row: EpisodePageRow, access: string | undefined): Promise<number | undefined> {
  const grant = access === undefined ? undefined : grants.read(access)
  if (!grant || grant.episodeId !== row.id) return undefined
  return (await findUserById(db, grant.userId))?.token_version === grant.tokenVersion ? grant.userId : undefined
}

async function grantFor({ db, grants }: EpisodeDeps, row: EpisodePageRow, user: Express.User): Promise<string> {
  const tokenVersion = (await findUserById(db, user.id))?.token_version ?? 0
  return grants.issue({ userId: user.id, tokenVersion, episodeId: row.id })
}

// what a file's name says it holds, for an external video address: a media element plays these itself
const MEDIA_TYPES: Record<string, string> = {
  mp4: 'video/mp4',
  m4v: 'video/mp4',
  mov: 'video/quicktime',
  webm: 'video/webm',
  mp3: 'audio/mpeg',
  m4a: 'audio/mp4',
  ogg: 'audio/ogg',
  oga: 'audio/ogg',
  wav: 'audio/wav',
}

/** How the page plays the chosen video: our recording, the channel's media file, a link to its page, or nothing. */
async function playerOf(db: Db, row: EpisodePageRow, mediaUrl: string): Promise<EpisodePlayer> {
  const video = row.video
  if (video.kind === 'none') return { kind: 'none' }
  if (video.kind === 'external') {
    const ext = /\.([a-z0-9]+)$/.exec(new URL(video.url).pathname.toLowerCase())?.[1]
    const mime = ext === undefined ? undefined : MEDIA_TYPES[ext]
    return mime ? { kind: 'media', url: video.url, mime, audioOnly: mime.startsWith('audio/') } : { kind: 'link', url: video.url }
  }
  // the recording was deleted since: the page says there is no video
  const recording = row.recording_id === null ? undefined : await findRecording(db, row.channel_id, row.outline_id, row.recording_id)
  if (!recording) return { kind: 'none' }
  return { kind: 'media', url: mediaUrl, mime: recording.mime, audioOnly: recording.kind === 'audio' }
}
