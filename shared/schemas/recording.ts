/**
 * Wire contract of a take's recordings and of aligning the take's lines to them.
 * Routes (under /api/channels/:channelId/outlines/:outlineId), each with the action it needs:
 *   GET    /recordings                                     recording.read  → Recording[] (newest first)
 *   POST   /recordings                                     recording.edit  multipart, one field `file` → Recording (201);
 *                                                                          not audio/video by its content → 415, over the limit → 413
 *   PATCH  /recordings/:recordingId                        recording.edit  body RecordingUpdate → Recording
 *   DELETE /recordings/:recordingId                        recording.edit  → 204 (the file goes too)
 *   GET    /recordings/:recordingId/media                  recording.read  the file; Range → 206, bad range → 416;
 *                                                                          its stored file gone → 404; still being
 *                                                                          made playable → 409
 *   GET    /recordings/:recordingId/media-link             recording.read  → MediaLink: a playback address a media element
 *                                                                          can use without the session's token
 *   GET    /recordings/:recordingId/peaks                  recording.read  → Peaks
 *   POST   /recordings/:recordingId/alignments             recording.edit  JSON { method: 'audio' } or multipart
 *                                                                          { method: 'captions', file } → AlignmentRun (202)
 *   GET    /recordings/:recordingId/alignments             recording.read  → AlignmentRun[] (newest first)
 *   GET    /recordings/:recordingId/alignments/:runId      recording.read  → AlignmentRun
 *   DELETE /recordings/:recordingId/alignments/:runId      recording.edit  → AlignmentRun (cancelled, when it was still running)
 * And one public route, outside any channel:
 *   GET    /api/media/:token                               the link's token   the file, as …/media answers it; a link
 *                                                                          expired or ended by signing out → 401, a
 *                                                                          malformed one → 404
 * Accepting a proposal is an ordinary outline edit (`alignLine`), saved like any other line edit.
 */
import { z } from 'zod'
import { text } from './text'

const recordingKindSchema = z.enum(['audio', 'video'])
export type RecordingKind = z.infer<typeof recordingKindSchema>

/** ready: browsers play the stored file; preparing: a browser-playable copy is being made; failed: it couldn't be. */
const recordingPlaybackSchema = z.enum(['ready', 'preparing', 'failed'])
export type RecordingPlayback = z.infer<typeof recordingPlaybackSchema>

export const recordingSchema = z.object({
  id: z.int(),
  outlineId: z.int(),
  /** the uploaded file's own name, for people; the stored name is ours */
  name: z.string(),
  /** from the file's content, never from its name */
  mime: z.string(),
  kind: recordingKindSchema,
  sizeBytes: z.number(),
  /** null when the file carries no duration and none could be worked out */
  durationMs: z.int().nullable(),
  /** the recording the take's alignment and exports refer to; one per take */
  current: z.boolean(),
  /** true once the waveform peaks are ready */
  hasPeaks: z.boolean(),
  playback: recordingPlaybackSchema,
  /** why a browser-playable copy couldn't be made, when it couldn't */
  playbackNote: z.string().optional(),
  uploadedBy: z.string(),
  uploadedAt: z.iso.datetime({ offset: true }),
})
export type Recording = z.infer<typeof recordingSchema>

export const recordingUpdateSchema = z.object({
  current: z.literal(true).optional(),
  name: text({ label: 'recording name', max: 200, required: true, trim: true }).optional(),
})
export type RecordingUpdate = z.infer<typeof recordingUpdateSchema>

/** A short-lived address that plays one recording (the player asks the server in ranges, so nothing is fetched whole). */
export const mediaLinkSchema = z.object({
  /** below the app's origin: `/api/media/<token>` */
  url: z.string(),
  /** the link stops working then (and when its user signs out); ask for a new one before */
  expiresAt: z.iso.datetime({ offset: true }),
})
export type MediaLink = z.infer<typeof mediaLinkSchema>

/** Waveform peaks computed once on the server: the largest absolute sample in each slice, 0..1. */
export const peaksSchema = z.object({
  durationMs: z.int(),
  perSecond: z.int(),
  peaks: z.array(z.number()),
})
export type Peaks = z.infer<typeof peaksSchema>

const alignmentMethodSchema = z.enum(['captions', 'audio'])
export type AlignmentMethod = z.infer<typeof alignmentMethodSchema>

/** Where one visible line starts in the recording, as the matcher sees it. */
const lineProposalSchema = z.object({
  lineId: z.int(),
  startMs: z.int().min(0),
  /** 0..1: share of the line's words found in order, weighed by how closely they matched */
  confidence: z.number().min(0).max(1),
})
export type LineProposal = z.infer<typeof lineProposalSchema>

const alignmentStateSchema = z.enum(['queued', 'running', 'done', 'failed', 'cancelled'])
export type AlignmentState = z.infer<typeof alignmentStateSchema>

export const alignmentRunSchema = z.object({
  id: z.int(),
  recordingId: z.int(),
  method: alignmentMethodSchema,
  state: alignmentStateSchema,
  /** 0..1 while running */
  progress: z.number().min(0).max(1),
  /** when done: one proposal per visible line the matcher could place, in line order */
  proposals: z.array(lineProposalSchema),
  /** when done: the visible lines it could not place, in line order */
  unplaced: z.array(z.int()),
  /** a sentence for people when the run failed */
  error: z.string().nullable(),
  createdAt: z.iso.datetime({ offset: true }),
})
export type AlignmentRun = z.infer<typeof alignmentRunSchema>

export const alignmentStartSchema = z.object({ method: alignmentMethodSchema })
