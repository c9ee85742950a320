import { z } from 'zod'
import {
  auditEventSchema,
  boardSchema,
  boardTakeSchema,
  cadenceUpdateSchema,
  notificationChoiceSchema,
  notificationListSchema,
} from '@shared/schemas/pipeline'
import type { AuditEvent, AuditQuery, Board, BoardTake, NotificationChoice, NotificationList, NotificationsRead, TakePlan, TakeStage } from '@shared/schemas/pipeline'
import { http, noContent } from './http'

/** Query keys: the board (and the schedule, which reads it) and the audit log under the channel; notifications are the person's own. */
export const pipelineKeys = {
  board: (channelId: number) => ['channels', channelId, 'board'] as const,
  audit: (channelId: number, query: AuditQuery) => ['channels', channelId, 'audit', query] as const,
  notifications: ['notifications'] as const,
  choices: ['notification-choices'] as const,
}

const takePath = (channelId: number, outlineId: number) => `/channels/${channelId}/outlines/${outlineId}`

/** Every take of the channel with its stage and plan, the cadence, and who can be put on a take. */
export function getBoard(channelId: number, signal?: AbortSignal): Promise<Board> {
  return http.get(`/channels/${channelId}/board`, boardSchema, { signal })
}

/** Moves a take; a move the role may not make answers 403, one that makes no sense for the take 409 (each with a sentence). */
export function moveTake(channelId: number, outlineId: number, stage: TakeStage): Promise<BoardTake> {
  return http.put(`${takePath(channelId, outlineId)}/stage`, { stage }, boardTakeSchema)
}

export function planTake(channelId: number, outlineId: number, plan: TakePlan): Promise<BoardTake> {
  return http.put(`${takePath(channelId, outlineId)}/plan`, plan, boardTakeSchema)
}

export function setCadence(channelId: number, cadenceDays: number): Promise<number> {
  return http.put(`/channels/${channelId}/cadence`, { cadenceDays }, cadenceUpdateSchema).then((r) => r.cadenceDays)
}

/** Owners only. */
export function listAudit(channelId: number, query: AuditQuery, signal?: AbortSignal): Promise<AuditEvent[]> {
  const search = new URLSearchParams()
  if (query.kind) search.set('kind', query.kind)
  if (query.actorId) search.set('actorId', String(query.actorId))
  const suffix = search.size > 0 ? `?${search}` : ''
  return http.get(`/channels/${channelId}/audit${suffix}`, z.array(auditEventSchema), { signal })
}

export function listNotifications(signal?: AbortSignal): Promise<NotificationList> {
  return http.get('/notifications', notificationListSchema, { signal })
}

export function markNotificationsRead(which: NotificationsRead): Promise<void> {
  return http.post('/notifications/read', which, noContent)
}

export function getNotificationChoices(signal?: AbortSignal): Promise<NotificationChoice[]> {
  return http.get('/notification-choices', z.array(notificationChoiceSchema), { signal })
}

export function saveNotificationChoices(choices: NotificationChoice[]): Promise<NotificationChoice[]> {
  return http.put('/notification-choices', choices, z.array(notificationChoiceSchema))
}
