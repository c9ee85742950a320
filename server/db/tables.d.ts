import 'knex/types/tables'
import type { Role } from '../../shared/schemas/auth'
import type { EpisodeVideoChoice, EpisodeVisibility } from '../../shared/schemas/episode'
import type { Outline, OutlineBase, OutlineScript } from '../../shared/schemas/outline'
import type { AlignmentMethod, AlignmentState, LineProposal, Peaks, RecordingKind, RecordingPlayback } from '../../shared/schemas/recording'
import type { PuzzleCheck, PuzzleRecord } from '../../shared/schemas/studio'
import type { AuditKind, NotificationKind, TakeStage } from '../../shared/schemas/pipeline'
import type { RehearsedLine } from '../../shared/schemas/rehearsal'

export interface UserRow {
  id: number
  email: string
  name: string
  password_hash: string
  /** carried in every token issued to the user; bumped to end all their sessions (sign-out) */
  token_version: number
  created_at: Date
  updated_at: Date
}

export interface ChannelRow {
  id: number
  name: string
  slug: string
  description: string
  /** one episode every this many days (the schedule's cadence) */
  cadence_days: number
  created_at: Date
  updated_at: Date
}

interface MembershipRow {
  user_id: number
  channel_id: number
  role: Role
  created_at: Date
}

export interface PuzzleRow {
  id: number
  channel_id: number
  title: string
  author: string
  link: string
  /** 'YYYY-MM-DD' or '' */
  published_on: string
  notes: string
  givens: string
  /** cell-name paths, bulb first */
  thermometers: string[][]
  check: PuzzleCheck
  problems: PuzzleRecord['problems']
  solution: string | null
  version: number
  created_by: number | null
  created_at: Date
  updated_at: Date
}

export interface OutlineRow {
  id: number
  puzzle_id: number
  name: string
  status: Outline['status']
  step_count: number
  total_ms: number
  /** the outline without its script: what the engine and the puzzle gave */
  document: OutlineBase
  /** what people edit (pace, names, target, lines, chapters), in a column of its own so a save writes only this */
  script: OutlineScript
  version: number
  /** the puzzle's version this take was solved on; behind the puzzle's own version once its grid changed */
  puzzle_version: number
  created_by: number | null
  /** who saved the take last (its maker until someone saves) */
  saved_by: number | null
  created_at: Date
  updated_at: Date
  /** where the take is in the pipeline (shared/schemas/pipeline.ts) */
  stage: TakeStage
  /** the planned publish day; a date column (server/db/pipeline.ts reads it as 'YYYY-MM-DD' text) */
  planned_on: string | null
  assignee_id: number | null
}

export interface RecordingRow {
  id: number
  outline_id: number
  /** where the file is in storage (server/storage); ours, never the uploaded name */
  storage_key: string
  original_name: string
  /** from the content */
  mime: string
  kind: RecordingKind
  /** a bigint: pg hands it over as a string */
  size_bytes: string
  duration_ms: number | null
  /** container and stream facts from the probe */
  facts: Record<string, unknown>
  /** null until worked out after the upload */
  peaks: Peaks | null
  /** whether browsers can play the stored file yet (server/services/playback.ts) */
  playback: RecordingPlayback
  /** why a conversion failed, for people */
  playback_note: string | null
  is_current: boolean
  uploaded_by: number | null
  created_at: Date
}

export interface AlignmentRunRow {
  id: number
  recording_id: number
  method: AlignmentMethod
  state: AlignmentState
  /** 0..1 */
  progress: number
  proposals: LineProposal[]
  /** line ids */
  unplaced: number[]
  /** a sentence for people when the run failed */
  error: string | null
  /** the pg-boss job now carrying the run */
  job_id: string
  /** the uploaded caption file's text, for the caption method only */
  caption_text: string | null
  created_by: number | null
  created_at: Date
  updated_at: Date
}

export interface EpisodeRow {
  id: number
  channel_id: number
  outline_id: number
  slug: string
  title: string
  visibility: EpisodeVisibility
  /** when the episode appears; a future time schedules it */
  publish_at: Date
  description: string
  video: EpisodeVideoChoice
  /** the played recording; null for another kind of video, or once that recording was deleted */
  recording_id: number | null
  /** the take as published: the outline with the puzzle's title, setter and link of that moment */
  snapshot: Outline
  /** the take's updated_at when the snapshot was taken */
  snapshot_updated_at: Date
  published_at: Date
  published_by: number | null
  unpublished_at: Date | null
}

export interface RehearsalRow {
  id: number
  outline_id: number
  /** null once the person has left */
  presenter_id: number | null
  name: string
  lines: RehearsedLine[]
  /** the run without its breaks */
  speech_ms: number
  created_at: Date
}

export interface AuditEventRow {
  /** a bigint: pg hands it over as a string */
  id: string
  channel_id: number
  actor_id: number | null
  actor_name: string | null
  kind: AuditKind
  subject: string
  details: Record<string, unknown>
  created_at: Date
}

export interface NotificationRow {
  /** a bigint: pg hands it over as a string */
  id: string
  user_id: number
  channel_id: number
  kind: NotificationKind
  text: string
  link: string
  created_at: Date
  read_at: Date | null
}

interface NotificationChoiceRow {
  user_id: number
  kind: NotificationKind
  in_app: boolean
  email: boolean
}

export interface InvitationRow {
  id: number
  channel_id: number
  email: string
  role: Role
  /** SHA-256 of the link's token, hex (server/auth/link-tokens.ts) */
  token_hash: string
  invited_by: number | null
  expires_at: Date
  accepted_at: Date | null
  accepted_by: number | null
  created_at: Date
}

export interface PasswordResetRow {
  id: number
  user_id: number
  token_hash: string
  expires_at: Date
  used_at: Date | null
  created_at: Date
}

export interface EmailChangeRow {
  user_id: number
  new_email: string
  token_hash: string
  expires_at: Date
  created_at: Date
}

declare module 'knex/types/tables' {
  interface Tables {
    users: UserRow
    channels: ChannelRow
    memberships: MembershipRow
    puzzles: PuzzleRow
    outlines: OutlineRow
    recordings: RecordingRow
    alignment_runs: AlignmentRunRow
    episodes: EpisodeRow
    invitations: InvitationRow
    password_resets: PasswordResetRow
    email_changes: EmailChangeRow
    audit_events: AuditEventRow
    notifications: NotificationRow
    notification_choices: NotificationChoiceRow
    rehearsals: RehearsalRow
  }
}
