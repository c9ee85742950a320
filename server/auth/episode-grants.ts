import { createSecretKey, type KeyObject } from 'node:crypto'
import jwt from 'jsonwebtoken'
import { z } from 'zod'
import { TOKEN_ALGORITHM } from './tokens'

// Its own issuer and audience, as for playback links (media-tokens.ts): a grant never signs anyone in and
// never plays a studio recording, and neither of those tokens opens a members-only episode.
const GRANT_ISSUER = 'gridcue/episode'
const GRANT_AUDIENCE = 'episode-media'

/** Long enough to watch an hour-long episode with pauses; the page asks for a new one when it reloads. */
const GRANT_TTL_SECONDS = 6 * 3600

/** What a grant lets its holder do: play one members-only episode's media, as long as its user could. */
export interface EpisodeGrant {
  userId: number
  /** the user's token version when it was made: signing out moves it on, and the grant dies */
  tokenVersion: number
  episodeId: number
}

const positive = z.int().min(1).max(2_147_483_647)
const claimsSchema = z.object({ uid: positive, ver: z.int().min(0), ep: positive })

/** Signs and reads the grants a members-only episode's media, captions and picture addresses carry. */
export function episodeGrants(jwtSecret: string) {
  const key: KeyObject = createSecretKey(Buffer.from(jwtSecret))

  function issue(grant: EpisodeGrant): string {
    const claims: z.input<typeof claimsSchema> = { uid: grant.userId, ver: grant.tokenVersion, ep: grant.episodeId }
    return jwt.sign(claims, key, { issuer: GRANT_ISSUER, audience: GRANT_AUDIENCE, algorithm: TOKEN_ALGORITHM, expiresIn: GRANT_TTL_SECONDS })
  }

  /** The grant a token holds; undefined for an expired, forged or foreign one alike (the caller says nothing more). */
  function read(token: string): EpisodeGrant | undefined {
    try {
      const claims = claimsSchema.safeParse(jwt.verify(token, key, { issuer: GRANT_ISSUER, audience: GRANT_AUDIENCE, algorithms: [TOKEN_ALGORITHM] }))
      return claims.success ? { userId: claims.data.uid, tokenVersion: claims.data.ver, episodeId: claims.data.ep } : undefined
    } catch {
      return undefined
    }
  }

  return { issue, read }
}

export type EpisodeGrants = ReturnType<typeof episodeGrants>
