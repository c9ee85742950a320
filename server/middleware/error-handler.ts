import type { ErrorRequestHandler, RequestHandler } from 'express'
import { isConnectionFailure } from '../db/knex'
import { databaseUnavailable, HttpError, internalError } from '../errors'

/** What a 503 tells a client (and a load balancer) about when to come back, in seconds. */
const RETRY_AFTER_SECONDS = 5

export const unknownRoute: RequestHandler = (req, _res, next) =>
  next(new HttpError(404, 'not-found', `No API route for ${req.method} ${req.originalUrl.split('?')[0]}`))

/**
 * The one place errors become responses: known errors keep their message, a database that can't be
 * reached is a 503 saying nothing was stored, anything else is a 500 without internals.
 */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  let reply = toHttpError(error)
  if (!reply && isConnectionFailure(error)) {
    req.log?.warn({ err: error }, 'database unavailable')
    reply = databaseUnavailable({ method: req.method, path: req.originalUrl })
  }
  if (!reply) {
    req.log?.error({ err: error }, 'unhandled error')
    reply = internalError(req.method)
  }
  if (reply.status === 503) res.set('Retry-After', String(RETRY_AFTER_SECONDS))
  res.status(reply.status).json({ ...reply.fields, code: reply.code, message: reply.message, details: reply.details })
}

function toHttpError(error: unknown): HttpError | null {
  if (error instanceof HttpError) return error
  if (typeof error !== 'object' || error === null) return null
  const e = error as { type?: string; status?: number; code?: string; message?: string }
  // body-parser's errors carry a type and a 4xx status
  if (e.type === 'entity.parse.failed') return new HttpError(400, 'bad-json', 'The request body is not valid JSON')
  if (e.type === 'entity.too.large') return new HttpError(413, 'too-large', 'The request body is too large')
  if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    return new HttpError(e.status, e.code ?? 'bad-request', e.message ?? 'Bad request')
  }
  return null
}
