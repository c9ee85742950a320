/**
 * Wire contract of the episode pipeline: the stage each take is at, its planned publish date and who is on it,
 * the channel's cadence, the audit log and notifications. Routes, each with the action it needs:
 *   GET  /api/channels/:channelId/board                          pipeline.read  → Board (every take, the cadence, who can be assigned)
 *   PUT  /api/channels/:channelId/outlines/:outlineId/stage      pipeline.move  body StageMove → BoardTake (the stage table below narrows the roles)
 *   PUT  /api/channels/:channelId/outlines/:outlineId/plan       pipeline.plan  body TakePlan → BoardTake
 *   PUT  /api/channels/:channelId/cadence                        channel.manage body CadenceUpdate → CadenceUpdate
 *   GET  /api/channels/:channelId/audit                          audit.read     query AuditQuery → AuditEvent[] (newest first)
 *   GET  /api/notifications                                      signed-in      → NotificationList
 *   POST /api/notifications/read                                 signed-in      body NotificationsRead → 204
 *   GET  /api/notification-choices                               signed-in      → NotificationChoice[] (one per kind)
 *   PUT  /api/notification-choices                               signed-in      body NotificationChoice[] → NotificationChoice[]
 */
import { z } from 'zod'
import type { Role } from './auth'

/**
 * Where a take is on its way to an episode, in order. A take starts `planned`; `recorded` and `published`
 * are also reached by themselves (an upload, publishing).
 */
export const takeStageSchema = z.enum(['planned', 'scripted', 'rehearsed', 'recorded', 'aligned', 'published'])
export type TakeStage = z.infer<typeof takeStageSchema>
export const TAKE_STAGES = takeStageSchema.options

/** Column headings and menu entries, in the product's own words. */
export const STAGE_LABELS: Record<TakeStage, string> = {
  planned: 'Planned',
  scripted: 'Scripted',
  rehearsed: 'Rehearsed',
  recorded: 'Recorded',
  aligned: 'Aligned',
  published: 'Published',
}

/**
 * Who may move a take into each stage (beside `pipeline.move`, which admits the studio team to moving at
 * all): presenters shape the words and the rehearsal, editors the recording's alignment, and publishing is
 * for whoever may publish an episode.
 */
const STAGE_MOVERS: Record<TakeStage, readonly Role[]> = {
  planned: ['owner', 'presenter'],
  scripted: ['owner', 'presenter', 'editor'],
  rehearsed: ['owner', 'presenter'],
  recorded: ['owner', 'presenter', 'editor'],
  aligned: ['owner', 'editor'],
  published: ['owner', 'editor'],
}

/** True when a member with `role` may move a take into `stage`. */
export const canMoveInto = (role: Role | null | undefined, stage: TakeStage): boolean => role != null && STAGE_MOVERS[stage].includes(role)

/** A calendar day, 'YYYY-MM-DD' (the channel's dates are days, read in UTC). */
const calendarDaySchema = z.iso.date({ message: 'give a date as YYYY-MM-DD' })

export const stageMoveSchema = z.object({ stage: takeStageSchema })

/** A change to a take's plan: a field left out stays as it is, null clears it. */
export const takePlanSchema = z
  .object({
    plannedOn: calendarDaySchema.nullable().optional(),
    assigneeId: z.int().min(1).nullable().optional(),
  })
  .refine((p) => p.plannedOn !== undefined || p.assigneeId !== undefined, 'give a planned date (plannedOn), a person (assigneeId), or both')
export type TakePlan = z.infer<typeof takePlanSchema>

/** One episode every N days (every 3, the default, is common practice for puzzle channels); a year is the longest pause that still is a cadence. */
export const cadenceUpdateSchema = z.object({
  cadenceDays: z.int({ message: 'the cadence is a whole number of days' }).min(1, 'the cadence is at least one day').max(365, 'the cadence can be at most 365 days'),
})
export type CadenceUpdate = z.infer<typeof cadenceUpdateSchema>

const personSchema = z.object({ userId: z.int(), name: z.string() })
export type PipelinePerson = z.infer<typeof personSchema>

export const boardTakeSchema = z.object({
  outlineId: z.int(),
  name: z.string(),
  puzzleId: z.int(),
  puzzleTitle: z.string(),
  stage: takeStageSchema,
  plannedOn: calendarDaySchema.nullable(),
  /** null when nobody is on it (or the person left the channel) */
  assignee: personSchema.nullable(),
  hasRecording: z.boolean(),
})
export type BoardTake = z.infer<typeof boardTakeSchema>

export const boardSchema = z.object({
  cadenceDays: z.int(),
  /** the studio team: who can be put on a take */
  people: z.array(personSchema),
  takes: z.array(boardTakeSchema),
})
export type Board = z.infer<typeof boardSchema>

// ---- the audit log -------------------------------------------------------------------------------

/** What an audit row records: the pipeline's own kinds, and the membership kinds the channel screens record. */
export const auditKindSchema = z.enum([
  'stage-moved',
  'take-planned',
  'episode-published',
  'episode-unpublished',
  'cadence-changed',
  'member-invited',
  'member-role-changed',
  'member-removed',
  'member-left',
  'channel-renamed',
])
export type AuditKind = z.infer<typeof auditKindSchema>

export const AUDIT_KIND_LABELS: Record<AuditKind, string> = {
  'stage-moved': 'Stage moved',
  'take-planned': 'Plan changed',
  'episode-published': 'Published',
  'episode-unpublished': 'Unpublished',
  'cadence-changed': 'Cadence changed',
  'member-invited': 'Member invited',
  'member-role-changed': 'Role changed',
  'member-removed': 'Member removed',
  'member-left': 'Member left',
  'channel-renamed': 'Channel renamed',
}

export const auditQuerySchema = z.object({
  kind: auditKindSchema.optional(),
  actorId: z.coerce.number().int().min(1).optional(),
})
export type AuditQuery = z.infer<typeof auditQuerySchema>

export const auditEventSchema = z.object({
  id: z.int(),
  kind: auditKindSchema,
  /** who did it; null for the system (an automatic move with nobody behind it) */
  actor: personSchema.nullable(),
  /** what it was done to, in words: a take's name, a person's e-mail */
  subject: z.string(),
  details: z.record(z.string(), z.unknown()),
  at: z.iso.datetime({ offset: true }),
})
export type AuditEvent = z.infer<typeof auditEventSchema>

// ---- notifications -------------------------------------------------------------------------------

export const notificationKindSchema = z.enum(['take-ready', 'recording-uploaded', 'episode-published', 'episode-scheduled'])
export type NotificationKind = z.infer<typeof notificationKindSchema>

export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  'take-ready': 'A take is ready for editing',
  'recording-uploaded': 'A recording was uploaded',
  'episode-published': 'An episode was published',
  'episode-scheduled': 'An episode was scheduled',
}

const notificationSchema = z.object({
  id: z.int(),
  kind: notificationKindSchema,
  channelId: z.int(),
  text: z.string(),
  /** where in the app it leads, e.g. '/channels/1/outlines/4' */
  link: z.string(),
  at: z.iso.datetime({ offset: true }),
  read: z.boolean(),
})

export const notificationListSchema = z.object({
  unread: z.int(),
  /** the newest ones */
  items: z.array(notificationSchema),
})
export type NotificationList = z.infer<typeof notificationListSchema>

export const notificationsReadSchema = z.union([
  z.object({ ids: z.array(z.int().min(1)).min(1).max(500) }),
  z.object({ all: z.literal(true) }),
])
export type NotificationsRead = z.infer<typeof notificationsReadSchema>

export const notificationChoiceSchema = z.object({
  kind: notificationKindSchema,
  inApp: z.boolean(),
  email: z.boolean(),
})
export type NotificationChoice = z.infer<typeof notificationChoiceSchema>

export const notificationChoicesSchema = z
  .array(notificationChoiceSchema)
  .max(notificationKindSchema.options.length)
  .refine((choices) => new Set(choices.map((c) => c.kind)).size === choices.length, 'give each kind of notification once')
