import type { RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { HttpError } from '../errors'

interface Schemas {
  body?: ZodType
  query?: ZodType
  params?: ZodType
}

/** Parses body, query and params with zod; the parsed values replace the raw ones (typed via `res.locals`). */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (!result.success) {
        const details = result.error.issues.map((i) => ({ path: [part, ...i.path].join('.'), message: i.message }))
        const first = details[0]
        return next(new HttpError(400, 'invalid-input', `${first?.path}: ${first?.message}`, details))
      }
      res.locals[part] = result.data
    }
    next()
  }
}
