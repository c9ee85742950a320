import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { signInSchema, type SignInInput } from '../../shared/schemas/auth'
import { HttpError } from '../errors'
import { parsePart } from '../middleware/validate'
import { BoundedMemoryStore } from './bounded-store'

export interface SignInLimitSettings {
  /** tries of one e-mail from one address */
  signInAttemptsPer15Min: number
  /** failed tries from one address, whatever the e-mail (password spraying) */
  signInAttemptsPerAddressPer15Min: number
}

const WINDOW_MS = 15 * 60 * 1000

// Keys are bounded (an address, or an address and an e-mail of at most 254 characters), and the
// per-address limit runs first, so one address adds at most its limit of address-and-e-mail keys per
// window. The cap makes the memory bound hard even against many addresses: 20,000 keys of the longest
// kind measured 14 MB; crowding a live counter out takes hundreds of addresses failing within one window,
// and whoever has those can guess from each of them anyway.
const MAX_KEYS = 20_000

/**
 * The middleware that runs before the sign-in handler, in order: the body checked (a 400 leaves no trace
 * in the limits), then the limit per address, then the limit per address and e-mail.
 */
export function signInGuards(settings: SignInLimitSettings): RequestHandler[] {
  const perAddress = limiter({
    limit: settings.signInAttemptsPerAddressPer15Min,
    // only wrong passwords count: an office behind one address signs in many people, a sprayer mostly
    // fails; a database outage (503) or another limit's 429 must not lock that office out afterwards
    counts: (status) => status === 401,
    key: (req) => addressOf(req),
  })
  // per address and e-mail, so one guessed account can't lock out a whole office behind one address
  const perAccount = limiter({
    limit: settings.signInAttemptsPer15Min,
    // every try counts, except those the server failed to answer (the database away)
    counts: (status) => status < 500,
    key: (req) => `${addressOf(req)}|${(req.body as SignInInput).email.toLowerCase()}`,
  })
  return [checkedBody, perAddress, perAccount]
}

const checkedBody: RequestHandler = (req, _res, next) => {
  req.body = parsePart('body', signInSchema, req.body)
  next()
}

const addressOf = (req: Request) => ipKeyGenerator(req.ip ?? '')

interface LimiterSpec {
  limit: number
  key: (req: Request) => string
  /** whether an answered try with this status counts against the limit */
  counts: (status: number) => boolean
}

function limiter({ limit, key, counts }: LimiterSpec): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit,
    // the limiter counts every try up front and takes back those it is told were "successful": here, the
    // tries that don't count
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => !counts(res.statusCode),
    keyGenerator: key,
    store: new BoundedMemoryStore(MAX_KEYS),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'too-many-attempts', 'Too many sign-in attempts. Please wait 15 minutes and try again.')),
  })
}
