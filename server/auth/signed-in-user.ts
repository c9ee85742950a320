import type { Request, Response } from 'express'
import { HttpError } from '../errors'
import type { JwtPassport } from './passport'

/** The person the request's bearer token names; a missing, expired or forged token is a 401 saying which. */
export function signedInUser(passport: JwtPassport, req: Request, res: Response): Promise<Express.User> {
  return new Promise((resolve, reject) => {
    const authenticate = passport.authenticate('jwt', { session: false }, (error: unknown, user: Express.User | false, info?: Error) => {
      if (error) reject(error)
      else if (user) resolve(user)
      else reject(new HttpError(401, 'unauthenticated', describe(info)))
    })
    authenticate(req, res, reject)
  })
}

function describe(info: Error | undefined): string {
  if (info?.name === 'TokenExpiredError') return 'Your session has expired. Please sign in again.'
  if (info?.message === 'No auth token') return 'Please sign in first.'
  return 'Your sign-in token is not valid. Please sign in again.'
}
