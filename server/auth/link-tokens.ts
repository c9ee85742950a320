import { createHash, randomBytes } from 'node:crypto'

/** A link's secret: 32 random bytes, URL-safe; only its hash is stored, so the database alone opens no link. */
export function newLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashLinkToken(token) }
}

/** The stored form of a link's token. SHA-256 without salt is enough: the token is random, not a guessable password. */
export const hashLinkToken = (token: string): string => createHash('sha256').update(token).digest('hex')

/** A moment `ms` from now. */
export const fromNow = (ms: number): Date => new Date(Date.now() + ms)

export const HOUR_MS = 3600_000
export const DAY_MS = 24 * HOUR_MS
