import { Router } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { signInSchema, type SignInInput } from '../../shared/schemas/auth'
import { requireUser } from '../auth/require-user'
import type { Config } from '../config'
import type { Db } from '../db/knex'
import { HttpError } from '../errors'
import { validate } from '../middleware/validate'
import { describeMe, signIn } from '../services/auth'
import type { JwtPassport } from '../auth/passport'

export function authRoutes(db: Db, config: Config, passport: JwtPassport): Router {
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

  const router = Router()
  router.post('/sign-in', signInLimit, validate({ body: signInSchema }), async (_req, res) => {
    res.json(await signIn(db, config.auth, res.locals.body as SignInInput))
  })
  router.get('/me', requireUser(passport), async (req, res) => {
    res.json(await describeMe(db, req.user!))
  })
  return router
}
