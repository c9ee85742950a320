import { createSecretKey, type KeyObject } from 'node:crypto'
import jwt from 'jsonwebtoken'
import { z } from 'zod'
import { TOKEN_ALGORITHM } from './tokens'

// Its own issuer and audience: the sign-in check insists on the issuer 'gridcue', so a playback link's
// token never signs anyone in, and this check insists on both, so a sign-in token never plays a recording.
const MEDIA_ISSUER = 'gridcue/media'
const MEDIA_AUDIENCE = 'recording-media'

/** Long enough to watch and align an hour-long recording in one sitting; the client asks for a new one before then. */
export const MEDIA_LINK_TTL_SECONDS = 6 * 3600

/** What a playback link lets its holder do: play one recording, as long as its user could. */
export interface MediaGrant {
  userId: number
  /** the user's token version when the link was made: signing out moves it on, and the link dies */
  tokenVersion: number
  channelId: number
  outlineId: number
  recordingId: number
}

const positive = z.int().min(1).max(2_147_483_647)
// no `sub` claim: even a token with the sign-in issuer forged onto it would name nobody there
const claimsSchema = z.object({
  uid: positive,
  ver: z.int().min(0),
  ch: positive,
  ol: positive,
  rec: positive,
})

export type MediaTokenReading = { grant: MediaGrant } | { problem: 'expired' | 'invalid' }

/** Signs and reads playback links' tokens with the app's JWT secret. */
export function mediaTokens(jwtSecret: string) {
  // a KeyObject, as in passport.ts: given a string, jsonwebtoken first tries it as a PEM key on every check
  const key: KeyObject = createSecretKey(Buffer.from(jwtSecret))

  function issue(grant: MediaGrant): { token: string; expiresAt: Date } {
    const claims: z.input<typeof claimsSchema> = { uid: grant.userId, ver: grant.tokenVersion, ch: grant.channelId, ol: grant.outlineId, rec: grant.recordingId }
    const token = jwt.sign(claims, key, { issuer: MEDIA_ISSUER, audience: MEDIA_AUDIENCE, algorithm: TOKEN_ALGORITHM, expiresIn: MEDIA_LINK_TTL_SECONDS })
    const { exp } = jwt.decode(token) as { exp: number }
    return { token, expiresAt: new Date(exp * 1000) }
  }

  function read(token: string): MediaTokenReading {
    let payload: unknown
    try {
      payload = jwt.verify(token, key, { issuer: MEDIA_ISSUER, audience: MEDIA_AUDIENCE, algorithms: [TOKEN_ALGORITHM] })
    } catch (error) {
      return { problem: error instanceof jwt.TokenExpiredError ? 'expired' : 'invalid' }
    }
    const claims = claimsSchema.safeParse(payload)
    if (!claims.success) return { problem: 'invalid' }
    const { uid, ver, ch, ol, rec } = claims.data
    return { grant: { userId: uid, tokenVersion: ver, channelId: ch, outlineId: ol, recordingId: rec } }
  }

  return { issue, read }
}

export type MediaTokens = ReturnType<typeof mediaTokens>
