import type { Db } from './knex'
import type { UserRow } from './tables'

export function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  return db('users').whereRaw('lower(email) = lower(?)', [email]).first()
}

export function findUserById(db: Db, id: number): Promise<UserRow | undefined> {
  return db('users').where({ id }).first()
}

/** Moves a user's token version on, so every token issued before names an old version. */
export async function bumpTokenVersion(db: Db, id: number): Promise<void> {
  await db('users').where({ id }).increment('token_version', 1)
}

export async function insertUser(db: Db, user: Pick<UserRow, 'email' | 'name' | 'password_hash'>): Promise<UserRow> {
  const [row] = await db('users').insert(user).returning('*')
  return row as UserRow
}

/** Changes a person's own details; a new password hash goes with a new token version (every older session ends). */
export async function updateUser(db: Db, id: number, changes: Partial<Pick<UserRow, 'name' | 'email' | 'password_hash'>>): Promise<UserRow> {
  const bump = changes.password_hash ? { token_version: db.raw('token_version + 1') } : {}
  const [row] = await db('users')
    .where({ id })
    .update({ ...changes, ...bump, updated_at: db.fn.now() })
    .returning('*')
  return row as UserRow
}
