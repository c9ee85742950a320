/**
 * Wire contract of publishing a take as an episode, and of the public episode page that viewers read.
 * Routes under /api/channels/:channelId, each with the action it needs:
 *   GET    /episodes                                   episode.read     → EpisodeSummary[] (newest publish date first); viewers
 *                                                                       get live episodes only, the studio team every state
 *   GET    /outlines/:outlineId/episode                 outline.read     → Episode (the take's episode), 404 when never published
 *   PUT    /outlines/:outlineId/episode                 episode.publish  body EpisodePublish → Episode: publishes, or republishes
 *                                                                       with the take's current script (a new snapshot)
 *   DELETE /outlines/:outlineId/episode                 episode.publish  → Episode (unpublished: settings kept, page gone)
 * And public routes, outside any channel (a members-only episode answers only a signed-in member; anyone else,
 * like a draft, scheduled or unpublished one, gets 404 with no hint that it exists):
 *   GET    /api/episodes/:channelSlug/:episodeSlug                     → EpisodePage
 *   GET    /api/episodes/:channelSlug/:episodeSlug/media               the published recording (Range → 206)
 *   GET    /api/episodes/:channelSlug/:episodeSlug/captions.vtt        WebVTT captions at the published times
 *   GET    /api/episodes/:channelSlug/:episodeSlug/picture.png         the grid as a picture (PictureQuery)
 *   GET    /episodes/:channelSlug/:episodeSlug                         the episode page: HTML with the data and the step list inlined
 */
import { z } from 'zod'
import { cellSchema, stepSchema } from './step'
import { text, webAddress } from './text'

/** Lower-case words joined by single hyphens: safe in an address as it stands, readable aloud. @public */
export const episodeSlugSchema = z
  .string()
  .max(80, { message: 'the address name can be at most 80 characters', abort: true })
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'the address name may hold only lower-case letters, digits and single hyphens (e.g. "thermo-tuesday-12")')

/** @public */
export const episodeVisibilitySchema = z.enum(['public', 'members'])
export type EpisodeVisibility = z.infer<typeof episodeVisibilitySchema>

/** What plays on the page: the take's uploaded recording, a video address of the channel's own, or nothing yet. @public */
export const episodeVideoChoiceSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('recording'), recordingId: z.int().min(1) }),
  z.object({ kind: z.literal('external'), url: webAddress('video address').refine((u) => u !== '', 'give the video address') }),
  z.object({ kind: z.literal('none') }),
])
export type EpisodeVideoChoice = z.infer<typeof episodeVideoChoiceSchema>

/** @public */
export const EPISODE_DESCRIPTION_MAX = 5000

export const episodePublishSchema = z.object({
  slug: episodeSlugSchema,
  title: text({ label: 'episode title', max: 200, required: true, trim: true }),
  visibility: episodeVisibilitySchema,
  /** when the episode appears; a future time schedules it, absent means now */
  publishAt: z.iso.datetime({ offset: true }).optional(),
  description: text({ label: 'description', max: EPISODE_DESCRIPTION_MAX }),
  video: episodeVideoChoiceSchema,
})
export type EpisodePublish = z.infer<typeof episodePublishSchema>

/** live: anyone allowed sees it; scheduled: its date is still to come; unpublished: taken down by the team. @public */
export const episodeStateSchema = z.enum(['live', 'scheduled', 'unpublished'])
export type EpisodeState = z.infer<typeof episodeStateSchema>

export const episodeSummarySchema = z.object({
  id: z.int(),
  outlineId: z.int(),
  slug: z.string(),
  title: z.string(),
  visibility: episodeVisibilitySchema,
  state: episodeStateSchema,
  publishAt: z.iso.datetime({ offset: true }),
  /** the page's address below the app's origin: `/episodes/<channel slug>/<episode slug>` */
  pageUrl: z.string(),
  puzzleTitle: z.string(),
  setter: z.string().optional(),
})
export type EpisodeSummary = z.infer<typeof episodeSummarySchema>

export const episodeSchema = episodeSummarySchema.extend({
  description: z.string(),
  video: episodeVideoChoiceSchema,
  /** the last time the episode was (re)published: the page shows the take as it was then */
  publishedAt: z.iso.datetime({ offset: true }),
  publishedBy: z.string(),
  /** true when the take's script has changed since: republishing would show the changes */
  takeChangedSince: z.boolean(),
})
export type Episode = z.infer<typeof episodeSchema>

/**
 * One visible line of the published script, timed on the published video (from its cut-in). The page lists
 * the lines in this order as its step list: the n-th line (1-based, the intro included) is item `step-n`.
 * @public
 */
export const episodeLineSchema = z.object({
  id: z.int(),
  kind: z.enum(['intro', 'step', 'outro']),
  text: z.string(),
  /** indices into `steps` */
  steps: z.array(z.int().min(0)),
  startMs: z.int().min(0),
})
export type EpisodeLine = z.infer<typeof episodeLineSchema>

/** @public */
export const episodeChapterSchema = z.object({ title: z.string(), startMs: z.int().min(0), lineId: z.int() })
export type EpisodeChapter = z.infer<typeof episodeChapterSchema>

/** How the page plays the video: a media element on our file or the channel's media file, or only a link. @public */
export const episodePlayerSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('media'), url: z.string(), mime: z.string(), audioOnly: z.boolean() }),
  z.object({ kind: z.literal('link'), url: z.string() }),
  z.object({ kind: z.literal('none') }),
])
export type EpisodePlayer = z.infer<typeof episodePlayerSchema>

/** Everything the episode page shows; the server inlines it in the page's HTML and the API returns the same. */
export const episodePageSchema = z.object({
  channel: z.object({ name: z.string(), slug: z.string() }),
  episode: z.object({
    slug: z.string(),
    title: z.string(),
    description: z.string(),
    visibility: episodeVisibilitySchema,
    publishAt: z.iso.datetime({ offset: true }),
  }),
  puzzle: z.object({
    title: z.string(),
    setter: z.string().optional(),
    link: z.string().optional(),
    /** the rules in one paragraph */
    rules: z.string(),
    givens: z.string().regex(/^[1-9.]{81}$/),
    thermometers: z.array(z.array(cellSchema)),
  }),
  steps: z.array(stepSchema),
  lines: z.array(episodeLineSchema),
  chapters: z.array(episodeChapterSchema),
  /** aligned: the times come from the recording; estimated: from the script's pace (no aligned recording yet) */
  timing: z.enum(['aligned', 'estimated']),
  durationMs: z.int().min(0),
  player: episodePlayerSchema,
  /** WebVTT captions at these times, when there is a media player to attach them to */
  captionsUrl: z.string().optional(),
  /** the grid before the first step, as a 1280×720 PNG (the page's preview picture) */
  pictureUrl: z.string(),
})
export type EpisodePage = z.infer<typeof episodePageSchema>

/**
 * A playback grant for a members-only episode, in the query of its media, captions and picture addresses (a
 * `<video>` or `<track>` can't send the session's token): the page API puts it there for a signed-in member.
 */
export const episodeAccessQuerySchema = z.object({
  access: z.string().max(2048, { message: 'is too long to be a playback grant', abort: true }).optional(),
})

/** A grid picture: after which step, which shape, with or without the step's highlights. */
export const pictureQuerySchema = z.object({
  step: z.coerce.number().int().min(0).max(1000).default(0),
  shape: z.enum(['wide', 'square']).default('wide'),
  highlights: z.enum(['on', 'off']).default('on'),
})
export type PictureQuery = z.infer<typeof pictureQuerySchema>
