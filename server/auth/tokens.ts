import jwt from 'jsonwebtoken'

export const TOKEN_ISSUER = 'gridcue'
export const TOKEN_ALGORITHM = 'HS256'

export interface TokenSettings {
  jwtSecret: string
  tokenTtlSeconds: number
}

/** A signed session token whose subject is the user id. */
export function issueToken(userId: number, settings: TokenSettings): { token: string; expiresAt: Date } {
  const token = jwt.sign({}, settings.jwtSecret, {
    subject: String(userId),
    issuer: TOKEN_ISSUER,
    algorithm: TOKEN_ALGORITHM,
    expiresIn: settings.tokenTtlSeconds,
  })
  const { exp } = jwt.decode(token) as { exp: number }
  return { token, expiresAt: new Date(exp * 1000) }
}
