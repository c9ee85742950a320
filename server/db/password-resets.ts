import type { Db } from './knex'
import type { PasswordResetRow } from './tables'

/** A new reset link for the user; any earlier one not yet used stops working, so only the newest mail counts. */
export async function replacePasswordReset(db: Db, reset: Pick<PasswordResetRow, 'user_id' | 'token_hash' | 'expires_at'>): Promise<void> {
  await db.transaction(async (trx) => {
    await trx('password_resets').where({ user_id: reset.user_id }).whereNull('used_at').delete()
    await trx('password_resets').insert(reset)
  })
}

export function findPasswordResetByHash(db: Db, tokenHash: string): Promise<PasswordResetRow | undefined> {
  return db('password_resets').where({ token_hash: tokenHash }).first()
}

/** Marks an unused, unexpired reset used; false when it was used or ran out meanwhile. */
export async function markPasswordResetUsed(db: Db, id: number): Promise<boolean> {
  const count = await db('password_resets').where({ id }).whereNull('used_at').where('expires_at', '>', db.fn.now()).update({ used_at: db.fn.now() })
  return count === 1
}
