import type { Db } from './knex'
import type { EmailChangeRow } from './tables'

/** The address a person asked to move to, replacing an earlier request (and its link). */
export async function replaceEmailChange(db: Db, change: Pick<EmailChangeRow, 'user_id' | 'new_email' | 'token_hash' | 'expires_at'>): Promise<void> {
  await db('email_changes')
    .insert({ ...change, created_at: db.fn.now() })
    .onConflict('user_id')
    .merge()
}

export function findEmailChangeByHash(db: Db, tokenHash: string): Promise<EmailChangeRow | undefined> {
  return db('email_changes').where({ token_hash: tokenHash }).first()
}

export function findEmailChangeOf(db: Db, userId: number): Promise<EmailChangeRow | undefined> {
  return db('email_changes').where({ user_id: userId }).first()
}

export async function deleteEmailChange(db: Db, userId: number): Promise<void> {
  await db('email_changes').where({ user_id: userId }).delete()
}
