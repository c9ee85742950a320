import type { ErrorRequestHandler, RequestHandler } from 'express'
import { HttpError } from '../errors'

export const unknownRoute: RequestHandler = (req, _res, next) =>
  next(new HttpError(404, 'not-found', `No API route for ${req.method} ${req.originalUrl.split('?')[0]}`))

/** The one place errors become responses: known errors keep their message, anything else is a 500 without internals. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const known = toHttpError(error)
  if (known) {
    res.status(known.status).json({ code: known.code, message: known.message, details: known.details })
    return
  }
  req.log?.error({ err: error }, 'unhandled error')
  res.status(500).json({ code: 'internal', message: 'Something went wrong on our side. Your saved work is safe; please try again.' })
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
