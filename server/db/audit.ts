import type { AuditKind } from '../../shared/schemas/pipeline'
import type { Db } from './knex'
import type { AuditEventRow } from './tables'

export type AuditEventFields = Pick<AuditEventRow, 'channel_id' | 'actor_id' | 'actor_name' | 'kind' | 'subject' | 'details'>

export async function insertAuditEvent(db: Db, fields: AuditEventFields): Promise<void> {
  await db('audit_events').insert({ ...fields, details: db.raw('?::jsonb', [JSON.stringify(fields.details)]) as unknown as Record<string, unknown> })
}

/** The channel's audit rows, newest first, with the actor's current name when the account is still there. */
export function listAuditEvents(db: Db, channelId: number, filter: { kind?: AuditKind; actorId?: number }, limit: number): Promise<(AuditEventRow & { current_name: string | null })[]> {
  const query = db('audit_events')
    .leftJoin('users', 'users.id', 'audit_events.actor_id')
    .where('audit_events.channel_id', channelId)
    .orderBy([{ column: 'audit_events.created_at', order: 'desc' }, { column: 'audit_events.id', order: 'desc' }])
    .limit(limit)
    .select('audit_events.*', 'users.name as current_name')
  if (filter.kind) query.where('audit_events.kind', filter.kind)
  if (filter.actorId) query.where('audit_events.actor_id', filter.actorId)
  return query
}
