import type { Role } from '../../shared/schemas/auth'
import {
  NOTIFICATION_KIND_LABELS,
  notificationKindSchema,
  type NotificationChoice,
  type NotificationKind,
  type NotificationList,
  type NotificationsRead,
} from '../../shared/schemas/pipeline'
import type { Db } from '../db/knex'
import { countUnread, insertNotifications, listChoices, listNotifications, markRead, saveChoices } from '../db/notifications'
import { listPeopleWithRoles } from '../db/pipeline'
import { mailSettings } from '../config'
import { sendMail } from '../mail/mailer'
import { escapeHtml } from '../pages/html'

/** How many of the newest the bell lists. */
const LIST_LENGTH = 30

/** Something that happened in a channel that some of its members want to hear about. */
export interface ChannelNews {
  channelId: number
  kind: NotificationKind
  /** one sentence, read in the bell's list and as the mail's first line */
  text: string
  /** where in the app it leads: '/channels/1/…' */
  link: string
  /** the members to tell, by role */
  roles: readonly Role[]
  /** someone else to tell (the person on the take), when still on the studio team */
  also?: number | null
  /** who caused it: they know already */
  actorId?: number | null
}

/**
 * Tells the members concerned, each the ways they chose: a row for the bell now, and a mail sent after the
 * caller's answer (a slow or absent mail server never holds up a stage move or an upload).
 */
export async function notify(db: Db, news: ChannelNews): Promise<void> {
  const members = await listPeopleWithRoles(db, news.channelId, ['owner', 'presenter', 'editor', 'viewer'])
  // the person on the take hears of it too, unless they have become a viewer since (the news is of the studio's work)
  const recipients = members.filter((m) => (news.roles.includes(m.role) || (m.user_id === news.also && m.role !== 'viewer')) && m.user_id !== news.actorId)
  if (recipients.length === 0) return
  const choices = await choicesByUser(db, recipients.map((r) => r.user_id))
  const wants = (userId: number) => choices.get(userId)?.get(news.kind) ?? { inApp: true, email: true }
  await insertNotifications(
    db,
    recipients.filter((r) => wants(r.user_id).inApp).map((r) => ({ user_id: r.user_id, channel_id: news.channelId, kind: news.kind, text: news.text, link: news.link })),
  )
  const mailed = recipients.filter((r) => wants(r.user_id).email)
  if (mailed.length > 0) void mailEach(mailed.map((r) => r.email), news)
}

async function mailEach(addresses: string[], news: ChannelNews): Promise<void> {
  const address = `${mailSettings().publicUrl}${news.link}`
  const why = `You get this mail because "${NOTIFICATION_KIND_LABELS[news.kind]}" is on in your account's notification choices; turn it off there.`
  const text = `${news.text}\n\nOpen it in Gridcue: ${address}\n\n${why}`
  const html = [
    '<div style="font-family: sans-serif; line-height: 1.5; max-width: 36em">',
    `<p>${escapeHtml(news.text)}</p>`,
    `<p><a href="${escapeHtml(address)}">Open it in Gridcue</a></p>`,
    `<p style="font-size: 0.9em; color: #555">${escapeHtml(why)}</p>`,
    '</div>',
  ].join('\n')
  const subject = `Gridcue: ${NOTIFICATION_KIND_LABELS[news.kind].toLowerCase()}`
  const results = await Promise.allSettled(addresses.map((to) => sendMail({ to, subject, text, html })))
  // nobody waits on these any more: a refused mail is a warning for whoever runs the server, the bell still has it
  for (const result of results) {
    if (result.status === 'rejected') process.emitWarning(`A notification mail could not be sent: ${String(result.reason)}`, 'NotificationMailWarning')
  }
}

async function choicesByUser(db: Db, userIds: number[]): Promise<Map<number, Map<NotificationKind, { inApp: boolean; email: boolean }>>> {
  const byUser = new Map<number, Map<NotificationKind, { inApp: boolean; email: boolean }>>()
  for (const row of await listChoices(db, userIds)) {
    const kinds = byUser.get(row.user_id) ?? new Map()
    kinds.set(row.kind, { inApp: row.in_app, email: row.email })
    byUser.set(row.user_id, kinds)
  }
  return byUser
}

/** The bell: the newest notifications and how many are unread. */
export async function notificationsOf(db: Db, userId: number): Promise<NotificationList> {
  const [rows, unread] = await Promise.all([listNotifications(db, userId, LIST_LENGTH), countUnread(db, userId)])
  return {
    unread,
    items: rows.map((row) => ({ id: Number(row.id), kind: row.kind, channelId: row.channel_id, text: row.text, link: row.link, at: row.created_at.toISOString(), read: row.read_at !== null })),
  }
}

export async function markNotificationsRead(db: Db, userId: number, which: NotificationsRead): Promise<void> {
  await markRead(db, userId, 'all' in which ? 'all' : which.ids)
}

/** Every kind with the person's choice; a kind never chosen is on both ways. */
export async function notificationChoicesOf(db: Db, userId: number): Promise<NotificationChoice[]> {
  const chosen = (await choicesByUser(db, [userId])).get(userId)
  return notificationKindSchema.options.map((kind) => ({ kind, ...(chosen?.get(kind) ?? { inApp: true, email: true }) }))
}

export async function saveNotificationChoices(db: Db, userId: number, choices: NotificationChoice[]): Promise<NotificationChoice[]> {
  await saveChoices(db, userId, choices.map((c) => ({ kind: c.kind, in_app: c.inApp, email: c.email })))
  return notificationChoicesOf(db, userId)
}
