import passportModule from 'passport'
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt'
import type { Db } from '../db/knex'
import { findUserById } from '../db/users'
import { TOKEN_ALGORITHM, TOKEN_ISSUER } from './tokens'

/** A passport instance of its own per app, so apps built with different secrets (tests) never share state. */
export type JwtPassport = passportModule.Authenticator

export function createPassport(db: Db, jwtSecret: string): JwtPassport {
  const passport = new passportModule.Passport()
  passport.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        secretOrKey: jwtSecret,
        issuer: TOKEN_ISSUER,
        algorithms: [TOKEN_ALGORITHM],
      },
      (payload: { sub?: string }, done: (error: unknown, user?: Express.User | false) => void) => {
        const id = Number(payload.sub)
        if (!Number.isInteger(id)) return done(null, false)
        findUserById(db, id).then(
          (row) => done(null, row ? { id: row.id, email: row.email, name: row.name } : false),
          (error) => done(error),
        )
      },
    ),
  )
  return passport
}
