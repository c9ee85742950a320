import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { signInSchema } from '../../shared/schemas/auth'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import { HttpError } from '../errors'
import { describeMe, signIn } from '../services/auth'
import type { EndpointTable } from './endpoint'

export function authEndpoints(api: EndpointTable, db: Db, config: Config): void {
  // per address and e-mail, so one guessed account can't lock out a whole office behind one address
  const signInLimit = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: config.auth.signInAttemptsPer15Min,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // runs before validation, so the e-mail may be any JSON value
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${typeof req.body?.email === 'string' ? req.body.email.toLowerCase() : ''}`,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'too-many-attempts', 'Too many sign-in attempts. Please wait 15 minutes and try again.')),
  })

  api.addPublic({ method: 'post', path: '/auth/sign-in', body: signInSchema, before: [signInLimit] }, ({ body }) => signIn(db, config.auth, body))
  api.add({ method: 'get', path: '/auth/me', access: 'signed-in' }, ({ user }) => describeMe(db, user))
}
