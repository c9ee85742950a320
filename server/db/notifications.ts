import type { NotificationKind } from '../../shared/schemas/pipeline'
import type { Db } from './knex'
import type { NotificationRow } from './tables'

export type NotificationFields = Pick<NotificationRow, 'user_id' | 'channel_id' | 'kind' | 'text' | 'link'>

export async function insertNotifications(db: Db, rows: NotificationFields[]): Promise<void> {
  if (rows.length > 0) await db('notifications').insert(rows)
}

/** A person's newest notifications, from the channels they are still a member of. */
export function listNotifications(db: Db, userId: number, limit: number): Promise<NotificationRow[]> {
  return stillMember(db, userId).orderBy([{ column: 'notifications.created_at', order: 'desc' }, { column: 'notifications.id', order: 'desc' }]).limit(limit).select('notifications.*')
}

export async function countUnread(db: Db, userId: number): Promise<number> {
  const [row] = await stillMember(db, userId).whereNull('notifications.read_at').count({ n: '*' })
  return Number(row?.n ?? 0)
}

const stillMember = (db: Db, userId: number) =>
  db('notifications')
    .join('memberships', (j) => j.on('memberships.channel_id', 'notifications.channel_id').andOn('memberships.user_id', 'notifications.user_id'))
    .where('notifications.user_id', userId)

/** Marks the person's own notifications read: the ones named, or all; anyone else's ids are passed over. */
export async function markRead(db: Db, userId: number, ids: number[] | 'all'): Promise<void> {
  const query = db('notifications').where({ user_id: userId }).whereNull('read_at')
  if (ids !== 'all') query.whereIn('id', ids)
  await query.update({ read_at: db.fn.now() as unknown as Date })
}

export interface ChoiceRow {
  kind: NotificationKind
  in_app: boolean
  email: boolean
}

export function listChoices(db: Db, userIds: number[]): Promise<(ChoiceRow & { user_id: number })[]> {
  return db('notification_choices').whereIn('user_id', userIds).select('user_id', 'kind', 'in_app', 'email')
}

export async function saveChoices(db: Db, userId: number, choices: ChoiceRow[]): Promise<void> {
  if (choices.length === 0) return
  await db('notification_choices')
    .insert(choices.map((c) => ({ user_id: userId, ...c })))
    .onConflict(['user_id', 'kind'])
    .merge(['in_app', 'email'])
}
