import type { RequestHandler } from 'express'
import { HttpError } from '../errors'
import type { JwtPassport } from './passport'

/** Rejects requests without a valid, unexpired token; sets `req.user`. */
export function requireUser(passport: JwtPassport): RequestHandler {
  return (req, res, next) =>
    passport.authenticate('jwt', { session: false }, (error: unknown, user: Express.User | false, info?: Error) => {
      if (error) return next(error)
      if (!user) return next(new HttpError(401, 'unauthenticated', describe(info)))
      req.user = user
      next()
    })(req, res, next)
}

function describe(info: Error | undefined): string {
  if (info?.name === 'TokenExpiredError') return 'Your session has expired. Please sign in again.'
  if (info?.message === 'No auth token') return 'Please sign in first.'
  return 'Your sign-in token is not valid. Please sign in again.'
}
