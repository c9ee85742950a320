import jwt from 'jsonwebtoken'
import { z } from 'zod'
import { idParams } from '../middleware/validate'

export const TOKEN_ISSUER = 'gridcue'
export const TOKEN_ALGORITHM = 'HS256'

/** Every user's token version until they first sign out. */
const FIRST_TOKEN_VERSION = 0

export interface TokenSettings {
  jwtSecret: string
  tokenTtlSeconds: number
}

/** What a token vouches for once its signature checks out. */
export interface TokenClaims {
  userId: number
  /** the user's token version when it was issued; signing out moves the user's on, and older tokens die */
  tokenVersion: number
}

/** A signed session token for a user at their current token version. */
export function issueToken(userId: number, settings: TokenSettings, tokenVersion = FIRST_TOKEN_VERSION): { token: string; expiresAt: Date } {
  const token = jwt.sign({ ver: tokenVersion }, settings.jwtSecret, {
    subject: String(userId),
    issuer: TOKEN_ISSUER,
    algorithm: TOKEN_ALGORITHM,
    expiresIn: settings.tokenTtlSeconds,
  })
  const { exp } = jwt.decode(token) as { exp: number }
  return { token, expiresAt: new Date(exp * 1000) }
}

// The subject is an id written as issueToken writes it (plain digits, a PostgreSQL integer), so "1.0",
// "-1" or "1e3" name nobody rather than user 1 or a query that fails. jsonwebtoken checks `exp` only
// when a token has one: here a token without one is refused, or it would never run out.
const claimsSchema = idParams('sub').extend({
  exp: z.number(),
  ver: z.int().min(FIRST_TOKEN_VERSION),
})

/** The claims of a verified token's payload, or null when one is missing or malformed. */
export function readClaims(payload: unknown): TokenClaims | null {
  const parsed = claimsSchema.safeParse(payload)
  return parsed.success ? { userId: parsed.data.sub, tokenVersion: parsed.data.ver } : null
}
