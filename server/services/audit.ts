import type { AuditEvent, AuditKind, AuditQuery } from '../../shared/schemas/pipeline'
import { insertAuditEvent, listAuditEvents } from '../db/audit'
import type { Db } from '../db/knex'

/** The newest rows an owner sees at once; a filter narrows to older ones. */
const AUDIT_PAGE = 500

export interface AuditEntry {
  channelId: number
  /** who did it: the signed-in person, or null for the system */
  actor: Pick<Express.User, 'id' | 'name'> | null
  kind: AuditKind
  /** what it was done to, in words: a take's name, a person's e-mail address */
  subject: string
  details?: Record<string, unknown>
}

/**
 * Writes one row of the channel's audit log. For every service that changes who is in a channel or what is
 * published: call it inside the same transaction as the change (pass the transaction as `db`) when there is one.
 */
export async function recordAudit(db: Db, entry: AuditEntry): Promise<void> {
  await insertAuditEvent(db, {
    channel_id: entry.channelId,
    actor_id: entry.actor?.id ?? null,
    actor_name: entry.actor?.name ?? null,
    kind: entry.kind,
    subject: entry.subject.slice(0, 300),
    details: entry.details ?? {},
  })
}

/** The channel's audit log, newest first, filtered by kind and person. */
export async function auditOf(db: Db, channelId: number, query: AuditQuery): Promise<AuditEvent[]> {
  const rows = await listAuditEvents(db, channelId, query, AUDIT_PAGE)
  return rows.map((row) => ({
    id: Number(row.id),
    kind: row.kind,
    actor: row.actor_id !== null || row.actor_name !== null ? { userId: row.actor_id ?? 0, name: row.current_name ?? row.actor_name ?? 'a former member' } : null,
    subject: row.subject,
    details: row.details,
    at: row.created_at.toISOString(),
  }))
}
