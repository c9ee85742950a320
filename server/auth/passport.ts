import { createSecretKey } from 'node:crypto'
import passportModule from 'passport'
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt'
import type { Db } from '../db/knex'
import { findUserById } from '../db/users'
import { readClaims, TOKEN_ALGORITHM, TOKEN_ISSUER } from './tokens'

/** A passport instance of its own per app, so apps built with different secrets (tests) never share state. */
export type JwtPassport = passportModule.Authenticator

export function createPassport(db: Db, jwtSecret: string): JwtPassport {
  const passport = new passportModule.Passport()
  passport.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        // a KeyObject, not the string: given a string, jsonwebtoken first tries it as a PEM public key and
        // only uses it as a secret after that fails, which cost about 0.5 ms on every request (passport-jwt's
        // types list only string | Buffer; jsonwebtoken 9, which does the verifying, takes a KeyObject)
        secretOrKey: createSecretKey(Buffer.from(jwtSecret)) as unknown as string,
        issuer: TOKEN_ISSUER,
        algorithms: [TOKEN_ALGORITHM],
      },
      (payload: unknown, done: (error: unknown, user?: Express.User | false) => void) => {
        const claims = readClaims(payload)
        if (!claims) return done(null, false)
        findUserById(db, claims.userId).then(
          // a token from before the user's last sign-out carries an older version: it is dead
          (row) => done(null, row?.token_version === claims.tokenVersion ? { id: row.id, email: row.email, name: row.name } : false),
          (error) => done(error),
        )
      },
    ),
  )
  return passport
}
